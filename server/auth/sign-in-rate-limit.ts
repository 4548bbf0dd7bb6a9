import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config/env';

/** Window of the sign-in rate limit: 5 minutes (common practice, no source). */
const WINDOW_MS = 5 * 60_000;

/**
 * Limits sign-in starts and answers per network address. Over the limit, the browser is sent to
 * the sign-in page with a plain explanation. Counts live in this process (enough to slow down
 * guessing and floods; a shared store would be needed to limit across instances exactly).
 */
export function signInRateLimit(config: Config): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit: config.auth.signInRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(303).location('/sign-in?error=rate_limited').end();
    },
  });
}

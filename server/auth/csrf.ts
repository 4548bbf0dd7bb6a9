import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request } from 'express';

/** Methods that change nothing and so need no token. */
export const SAFE_METHODS: ReadonlySet<string> = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The header the client sends the token in (`client/src/lib/api-client.ts`). */
export const CSRF_HEADER = 'x-csrf-token';

/** A fresh synchronizer token, stored in the session at sign-in and handed out by `GET /api/me`. */
export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

/**
 * Whether a state-changing request carries its session's token: in the `X-CSRF-Token` header, or
 * in a `_csrf` form field for plain HTML forms (sign-out). Compared in constant time.
 */
export function csrfTokenMatches(req: Request): boolean {
  const expected = req.session?.csrfToken;
  const header = req.headers[CSRF_HEADER];
  const body = (req.body as { _csrf?: unknown } | undefined)?._csrf;
  const given = typeof header === 'string' ? header : typeof body === 'string' ? body : undefined;
  if (!expected || !given) return false;
  const a = Buffer.from(expected);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}

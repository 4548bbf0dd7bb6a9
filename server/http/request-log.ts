import type { RequestHandler } from 'express';
import type { Logger } from '../lib/logger';

/**
 * One log line per request when its answer ends: method, path without the query string, status
 * and milliseconds; never headers, bodies, query strings or addresses, which may carry personal
 * data. 5xx log as errors, 4xx and answers cut short (the connection closed first) as warnings,
 * the rest as info. Written here rather than with pino-http, which builds a child logger for every
 * request whether or not anything is logged: about a tenth of a cached dashboard answer's CPU, for
 * a per-request logger nothing in Cutline uses.
 */
export function requestLog(logger: Logger): RequestHandler {
  if (!logger.isLevelEnabled('error')) return (_req, _res, next) => next();
  return (req, res, next) => {
    const started = performance.now();
    // 'close' follows 'finish' on every answer, and comes alone when the connection went first.
    res.once('close', () => {
      const status = res.statusCode;
      const level = status >= 500 ? 'error' : status >= 400 || !res.writableFinished ? 'warn' : 'info';
      if (!logger.isLevelEnabled(level)) return;
      logger[level](
        { req: { method: req.method, path: req.originalUrl.split('?')[0] }, res: { status }, responseTime: Math.round(performance.now() - started) },
        res.writableFinished ? 'request completed' : 'request aborted',
      );
    });
    next();
  };
}

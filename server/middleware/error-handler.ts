import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { EntityNotFoundError } from 'typeorm';
import type { ApiErrorBody } from '@shared/errors';
import { AppError } from '../lib/errors';
import type { Logger } from '../lib/logger';

/** 404 for unknown API paths, in the common error shape. */
export const apiNotFound: RequestHandler = (req, res) => {
  const body: ApiErrorBody = { error: { code: 'not_found', message: `There is no API endpoint ${req.method} ${req.originalUrl.split('?')[0]}.` } };
  res.status(404).json(body);
};

/** The one place errors become responses. Unknown errors are logged with their cause and answered as 500. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, _next) => {
    const body = toErrorBody(err);
    if (body.status >= 500) logger.error({ err, method: req.method, path: req.path }, 'request failed');
    if (res.headersSent) return;
    res.status(body.status).json({ error: body.error } satisfies ApiErrorBody);
  };
}

function toErrorBody(err: unknown): { status: number; error: ApiErrorBody['error'] } {
  if (err instanceof AppError) {
    return { status: err.status, error: withDetails({ code: err.code, message: err.message }, err.details) };
  }
  if (err instanceof ZodError) {
    const first = err.issues[0];
    const where = first && first.path.length > 0 ? `${first.path.join('.')}: ` : '';
    return {
      status: 400,
      error: {
        code: 'validation_failed',
        message: `${where}${first?.message ?? 'The request is not valid.'}`,
        details: err.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
      },
    };
  }
  if (err instanceof EntityNotFoundError) {
    return { status: 404, error: { code: 'not_found', message: 'The requested record was not found.' } };
  }
  const status = typeof err === 'object' && err !== null && 'status' in err ? Number((err as { status: unknown }).status) : 500;
  if (status === 413) return { status, error: { code: 'payload_too_large', message: 'The request is too large.' } };
  if (status === 400 && err instanceof SyntaxError) {
    return { status, error: { code: 'bad_request', message: 'The request body is not valid JSON.' } };
  }
  return { status: 500, error: { code: 'internal', message: 'Something went wrong on our side. The error has been logged; please try again.' } };
}

function withDetails(error: ApiErrorBody['error'], details: unknown): ApiErrorBody['error'] {
  return details === undefined ? error : { ...error, details };
}

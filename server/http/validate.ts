import type { z } from 'zod';
import { badRequest } from '../lib/errors';

/** Parses request input with a shared zod schema; a ZodError becomes a 400 in the error middleware. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  return schema.parse(value);
}

/** Parses a positive integer route parameter such as `:programId`. */
export function idParam(value: string | string[] | undefined, what: string): number {
  const n = Number(value);
  if (typeof value !== 'string' || !Number.isSafeInteger(n) || n <= 0) {
    throw badRequest(`${what} must be a positive whole number.`);
  }
  return n;
}

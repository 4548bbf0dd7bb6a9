import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import helmet, { type HelmetOptions } from 'helmet';

/**
 * helmet's response headers, worked out once at start-up and set on every answer. With Cutline's
 * options they depend on nothing in the request (no nonces, no per-request directives), and running
 * helmet's dozen middleware on every request cost about 6% of a cached dashboard answer's CPU.
 * Fails at start-up, rather than sending wrong headers, if helmet ever reads the request, touches
 * the answer other than setting or removing headers, or does not finish at once.
 */
export function securityHeaders(options: Readonly<HelmetOptions>): RequestHandler {
  const set: Array<[string, string | number | readonly string[]]> = [];
  const removed: string[] = [];
  const refuse = (what: string) => {
    throw new Error(`securityHeaders: helmet used ${what}; its headers can no longer be worked out once.`);
  };
  const request = new Proxy({}, { get: (_t, property) => refuse(`the request (${String(property)})`) });
  const answer = new Proxy(
    {
      setHeader: (name: string, value: string | number | readonly string[]) => void set.push([name, value]),
      removeHeader: (name: string) => void removed.push(name),
    },
    { get: (target, property) => (property in target ? target[property as keyof typeof target] : refuse(`the answer (${String(property)})`)) },
  );
  let finished = false;
  helmet(options)(request as IncomingMessage, answer as unknown as ServerResponse, (err?: unknown) => {
    if (err) throw err;
    finished = true;
  });
  if (!finished) refuse('an asynchronous step');
  return (_req, res, next) => {
    for (const name of removed) res.removeHeader(name);
    for (const [name, value] of set) res.setHeader(name, value);
    next();
  };
}

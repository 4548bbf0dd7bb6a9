import express from 'express';
import helmet, { type HelmetOptions } from 'helmet';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { securityHeaders } from './security-headers';

const OPTIONS: HelmetOptions = {
  contentSecurityPolicy: { directives: { 'img-src': ["'self'", 'data:', 'blob:'], 'form-action': ["'self'", 'http://127.0.0.1:4602'] } },
};

async function headersOf(middleware: express.RequestHandler): Promise<Record<string, unknown>> {
  const app = express();
  app.use(middleware);
  app.get('/', (_req, res) => void res.json({ ok: true }));
  const { headers } = await request(app).get('/');
  // Only the headers helmet decides; date, length and the like differ or are Express's.
  const { date: _d, etag: _e, 'content-length': _l, 'content-type': _t, connection: _c, 'keep-alive': _k, ...rest } = headers;
  return rest;
}

describe('securityHeaders', () => {
  it('sends exactly the headers helmet itself sends with the same options', async () => {
    const ours = await headersOf(securityHeaders(OPTIONS));
    expect(ours).toEqual(await headersOf(helmet(OPTIONS)));
    expect(ours['content-security-policy']).toContain("form-action 'self' http://127.0.0.1:4602");
    expect(ours['x-powered-by']).toBeUndefined();
  });

  it('refuses, at start-up, options whose headers would depend on the request', () => {
    const perRequest: HelmetOptions = { contentSecurityPolicy: { directives: { 'script-src': ["'self'", (req) => `'nonce-${String(req.headers.host)}'`] } } };
    expect(() => securityHeaders(perRequest)).toThrow(/helmet used the request/);
  });
});

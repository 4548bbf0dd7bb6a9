import { Writable } from 'node:stream';
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createLogger } from '../lib/logger';
import { requestLog } from './request-log';

function appLogging(level: string) {
  const lines: Array<Record<string, unknown>> = [];
  const sink = new Writable({ write: (chunk: Buffer, _enc, done) => void (lines.push(JSON.parse(chunk.toString()) as Record<string, unknown>), done()) });
  const app = express();
  app.use(requestLog(createLogger(level, sink)));
  app.get('/ok', (_req, res) => void res.json({ ok: true }));
  app.get('/missing', (_req, res) => void res.status(404).end());
  app.get('/broken', (_req, res) => void res.status(500).end());
  return { app, lines };
}

describe('requestLog', () => {
  it('logs method, path without query, status and time, at a level by status', async () => {
    const { app, lines } = appLogging('info');
    await request(app).get('/ok?email=someone%40example.org').set('Cookie', 'cutline.sid=secret');
    await request(app).get('/missing');
    await request(app).get('/broken');
    await new Promise((resolve) => setImmediate(resolve));
    expect(lines.map((l) => [l.level, l.msg, l.req, l.res])).toEqual([
      [30, 'request completed', { method: 'GET', path: '/ok' }, { status: 200 }],
      [40, 'request completed', { method: 'GET', path: '/missing' }, { status: 404 }],
      [50, 'request completed', { method: 'GET', path: '/broken' }, { status: 500 }],
    ]);
    expect(typeof lines[0]!.responseTime).toBe('number');
    expect(JSON.stringify(lines)).not.toMatch(/someone|secret|example\.org/);
  });

  it('logs only what the level lets through, and nothing when silent', async () => {
    const warn = appLogging('warn');
    await request(warn.app).get('/ok');
    await request(warn.app).get('/missing');
    const silent = appLogging('silent');
    await request(silent.app).get('/broken');
    await new Promise((resolve) => setImmediate(resolve));
    expect(warn.lines.map((l) => l.res)).toEqual([{ status: 404 }]);
    expect(silent.lines).toEqual([]);
  });
});

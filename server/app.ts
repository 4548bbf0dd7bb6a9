import fs from 'node:fs';
import path from 'node:path';
import express, { type Express, type RequestHandler } from 'express';
import { enforceAccess } from './auth/access-enforcer';
import { SAFE_METHODS } from './auth/csrf';
import { createSignIn } from './auth/sign-in';
import { REPO_ROOT } from './config/env';
import { setAccessEnforcer } from './http/access';
import { requestLog } from './http/request-log';
import { forgetReadsAfterChanges } from './http/reused-reads';
import { securityHeaders } from './http/security-headers';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { apiRouter } from './routes';
import { authRoutes } from './routes/auth.routes';
import type { AppContext } from './app-context';

/** Folder of the built client (`npm run build`). */
export const CLIENT_DIST = path.join(REPO_ROOT, 'dist', 'client');

/**
 * The Express app without `listen`, so tests can mount it with supertest. Serves the API under
 * /api and the built client (with history fallback) everywhere else.
 */
export function createApp(ctx: AppContext): Express {
  // Before any route is built: every `allow(rule)` takes its check from here.
  setAccessEnforcer(enforceAccess);
  const signIn = createSignIn(ctx);
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    securityHeaders({
      contentSecurityPolicy: {
        // Forms post to Cutline only; sign-in redirects continue to the identity provider.
        directives: { 'img-src': ["'self'", 'data:', 'blob:'], 'form-action': ["'self'", new URL(ctx.identityProvider.ssoUrl).origin] },
      },
    }),
  );
  app.use(requestLog(ctx.logger));
  // Handlers mounted on the app directly and routes in one router per area (/auth, /api): each
  // nested router costs a request another pass of Express's router, the largest single cost of a
  // cached dashboard answer.
  const requestSession = [forgetReadsAfterChanges, ...signIn.handlers];
  app.use('/auth', ...requestSession, authRoutes(ctx, signIn));
  app.use('/api', ...requestSession, jsonBodies(), apiRouter(ctx), apiNotFound);
  serveClient(app);
  app.use(errorHandler(ctx.logger));
  return app;
}

/** JSON bodies of state-changing requests. Reads carry none; the parser's own check cost them about 3%. */
function jsonBodies(): RequestHandler {
  const json = express.json({ limit: '1mb' });
  return (req, res, next) => (SAFE_METHODS.has(req.method) ? next() : json(req, res, next));
}

function serveClient(app: Express): void {
  const index = path.join(CLIENT_DIST, 'index.html');
  app.use(express.static(CLIENT_DIST, { index: false, maxAge: '1h' }));
  app.get(/^(?!\/api\/).*/, (_req, res) => {
    if (fs.existsSync(index)) res.sendFile(index);
    else res.status(503).type('text/plain').send('The web client is not built yet. Run `npm start` (it builds it) or `npm run build`.');
  });
}

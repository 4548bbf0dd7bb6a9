import { Router } from 'express';
import type { AppContext } from '../app-context';
import { healthRoutes } from './health.routes';
import { programRoutes } from './programs.routes';

/** Every API router, mounted under /api. A route without an `allow(...)` rule fails the access test. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(healthRoutes(ctx));
  router.use(programRoutes(ctx));
  return router;
}

import { Router } from 'express';
import type { AppContext } from '../app-context';
import { adminAuditRoutes } from './admin-audit.routes';
import { adminScheduleRoutes } from './admin-schedules.routes';
import { adminUserRoutes } from './admin-users.routes';
import { annexRoutes } from './annex.routes';
import { dataSourceRoutes } from './data-sources.routes';
import { designRoutes } from './designs.routes';
import { exportRoutes } from './exports.routes';
import { extractRoutes } from './extracts.routes';
import { healthRoutes } from './health.routes';
import { mailRoutes } from './mail.routes';
import { meRoutes } from './me.routes';
import { programAdminRoutes } from './program-admin.routes';
import { programRoutes } from './programs.routes';
import { resultRoutes } from './results.routes';
import { runRoutes } from './runs.routes';
import { sampleExtractRoutes } from './sample-extract.routes';

/**
 * Every API router, mounted under /api. One a line, sorted, after the dashboards' read routes: they
 * take most requests, and a request tries the routes in order. Each route's first handler is
 * `allow(...)`; `tests/api/access-matrix.test.ts` walks this router and fails on a route without one.
 */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(resultRoutes(ctx));
  router.use(adminAuditRoutes(ctx));
  router.use(adminScheduleRoutes(ctx));
  router.use(adminUserRoutes(ctx));
  router.use(annexRoutes(ctx));
  router.use(dataSourceRoutes(ctx));
  router.use(designRoutes(ctx));
  router.use(exportRoutes(ctx));
  router.use(extractRoutes(ctx));
  router.use(healthRoutes(ctx));
  router.use(mailRoutes(ctx));
  router.use(meRoutes(ctx));
  router.use(programAdminRoutes(ctx));
  router.use(programRoutes(ctx));
  router.use(runRoutes(ctx));
  router.use(sampleExtractRoutes(ctx));
  return router;
}

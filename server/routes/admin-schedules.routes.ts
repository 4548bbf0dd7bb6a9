import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { listSchedules, setSummaryPaused } from '../services/schedules.service';

const PausedSchema = z.object({ paused: z.boolean() });

/** Administrators see every summary e-mail schedule and may pause or resume one. */
export function adminScheduleRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/admin/schedules', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (_req, res) => {
    res.json(await listSchedules(ctx.dataSource, new Date()));
  });
  router.patch('/admin/schedules/:subscriptionId', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (req, res) => {
    const { paused } = parse(PausedSchema, req.body);
    res.json(await setSummaryPaused(ctx.dataSource, idParam(req.params.subscriptionId, 'Schedule id'), actorOf(req), paused, new Date()));
  });
  return router;
}

import { Router } from 'express';
import { PageQuerySchema } from '@shared/schemas/paging';
import type { AppContext } from '../app-context';
import { actorOf } from '../http/current-user';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { requestRecompute } from '../services/recompute/run-queue';
import { wakeRecompute } from '../services/recompute/wake';
import { getRun, listRuns, toRunDto } from '../services/results.service';

/** The job-run log and the on-demand recompute (analysts and admins). */
export function runRoutes(ctx: AppContext, router: Router = Router()): Router {
  const who = { kind: 'roles', roles: ['admin', 'analyst'], scope: 'program' } as const;
  router.get('/programs/:programId/runs', allow(who), async (req, res) => {
    res.json(await listRuns(ctx.dataSource, idParam(req.params.programId, 'Program id'), parse(PageQuerySchema, req.query)));
  });
  router.get('/programs/:programId/runs/:runId', allow(who), async (req, res) => {
    res.json(await getRun(ctx.dataSource, idParam(req.params.programId, 'Program id'), idParam(req.params.runId, 'Run id')));
  });
  router.post('/programs/:programId/runs', allow({ kind: 'roles', roles: ['analyst'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const { run, joined } = await ctx.dataSource.transaction((tx) => requestRecompute(tx, { programId, trigger: 'on-demand', actor: actorOf(req) }));
    wakeRecompute(ctx.dataSource);
    res.status(joined ? 200 : 202).json({ run: toRunDto(run), joined });
  });
  return router;
}

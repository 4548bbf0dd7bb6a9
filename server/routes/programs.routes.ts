import { Router } from 'express';
import { PageQuerySchema } from '@shared/schemas/paging';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { getProgram, listPrograms } from '../services/programs.service';
import type { AppContext } from '../app-context';

export function programRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/programs', allow({ kind: 'signed-in' }), async (req, res) => {
    const page = parse(PageQuerySchema, req.query);
    res.json(await listPrograms(ctx.dataSource, ctx.visiblePrograms(req), page));
  });
  router.get(
    '/programs/:programId',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator', 'director'], scope: 'program' }),
    async (req, res) => {
      res.json(await getProgram(ctx.dataSource, idParam(req.params.programId, 'Program id')));
    },
  );
  return router;
}

import { Router } from 'express';
import { z } from 'zod';
import { PeriodSchema, VariableKeySchema } from '@shared/schemas/program';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { CaveatAcknowledgeSchema } from '@shared/schemas/caveat-acknowledgement';
import { actorOf } from '../http/current-user';
import { acknowledgeCaveat } from '../services/caveat-acknowledgements.service';
import { getCohortDetail, getCohortTrend, getResultsOverview } from '../services/results.service';

const TrendQuerySchema = z.object({ outcome: VariableKeySchema });

/** The results read API (DTOs in `shared/api/results.ts`): overview, trend, one cohort. */
export function resultRoutes(ctx: AppContext): Router {
  const router = Router();
  router.get(
    '/programs/:programId/results',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator', 'director'], scope: 'program' }),
    async (req, res) => {
      res.json(await getResultsOverview(ctx.dataSource, idParam(req.params.programId, 'Program id')));
    },
  );
  router.get(
    '/programs/:programId/results/trend',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator', 'director'], scope: 'program' }),
    async (req, res) => {
      const q = parse(TrendQuerySchema, req.query);
      res.json(await getCohortTrend(ctx.dataSource, idParam(req.params.programId, 'Program id'), q.outcome));
    },
  );
  router.get(
    '/programs/:programId/results/cohorts/:period',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator'], scope: 'program' }),
    async (req, res) => {
      const period = parse(PeriodSchema, req.params.period);
      res.json(await getCohortDetail(ctx.dataSource, idParam(req.params.programId, 'Program id'), period));
    },
  );
  router.post('/programs/:programId/results/:resultId/acknowledgements', allow({ kind: 'roles', roles: ['manager'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const ack = await acknowledgeCaveat(ctx.dataSource, programId, idParam(req.params.resultId, 'Result id'), actorOf(req), parse(CaveatAcknowledgeSchema, req.body));
    res.status(201).json(ack);
  });
  return router;
}



import { Router } from 'express';
import { z } from 'zod';
import { PeriodSchema, VariableKeySchema } from '@shared/schemas/program';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { CaveatAcknowledgeSchema } from '@shared/schemas/caveat-acknowledgement';
import { actorOf } from '../http/current-user';
import { acknowledgeCaveat } from '../services/caveat-acknowledgements.service';
import { cachedResultsJson, sendCachedJson } from '../services/results-cache';
import { getCohortDetail, getCohortTrend, getResultsOverview } from '../services/results.service';

const TrendQuerySchema = z.object({ outcome: VariableKeySchema });

/** The results read API (DTOs in `shared/api/results.ts`): overview, trend, one cohort. */
export function resultRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get(
    '/programs/:programId/results',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator', 'director'], scope: 'program' }),
    async (req, res) => {
      const programId = idParam(req.params.programId, 'Program id');
      sendCachedJson(req, res, await cachedResultsJson(ctx.dataSource, programId, 'overview', () => getResultsOverview(ctx.dataSource, programId)));
    },
  );
  router.get(
    '/programs/:programId/results/trend',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator', 'director'], scope: 'program' }),
    async (req, res) => {
      const q = parse(TrendQuerySchema, req.query);
      const programId = idParam(req.params.programId, 'Program id');
      sendCachedJson(req, res, await cachedResultsJson(ctx.dataSource, programId, `trend:${q.outcome}`, () => getCohortTrend(ctx.dataSource, programId, q.outcome)));
    },
  );
  router.get(
    '/programs/:programId/results/cohorts/:period',
    allow({ kind: 'roles', roles: ['admin', 'analyst', 'manager', 'evaluator'], scope: 'program' }),
    async (req, res) => {
      const period = parse(PeriodSchema, req.params.period);
      const programId = idParam(req.params.programId, 'Program id');
      sendCachedJson(req, res, await cachedResultsJson(ctx.dataSource, programId, `cohort:${period}`, () => getCohortDetail(ctx.dataSource, programId, period)));
    },
  );
  router.post('/programs/:programId/results/:resultId/acknowledgements', allow({ kind: 'roles', roles: ['manager'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const ack = await acknowledgeCaveat(ctx.dataSource, programId, idParam(req.params.resultId, 'Result id'), actorOf(req), parse(CaveatAcknowledgeSchema, req.body));
    res.status(201).json(ack);
  });
  return router;
}



import { Router } from 'express';
import { ProgramInputSchema } from '@shared/schemas/program';
import { CovariateDefinitionsInputSchema, CutoffScheduleInputSchema, OutcomeDefinitionsInputSchema, ProgramCreateInputSchema } from '@shared/schemas/program-admin';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { createProgram, replaceCovariates, replaceCutoffSchedule, replaceOutcomes, updateProgram } from '../services/program-admin.service';

/** Administrators create programs (agency-wide) and change a program's details, cutoff schedule and definitions. */
export function programAdminRoutes(ctx: AppContext, router: Router = Router()): Router {
  const id = (v: string | string[] | undefined) => idParam(v, 'Program id');
  router.post('/admin/programs', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (req, res) => {
    res.status(201).json(await createProgram(ctx.dataSource, actorOf(req), parse(ProgramCreateInputSchema, req.body)));
  });
  router.put('/programs/:programId', allow({ kind: 'roles', roles: ['admin'], scope: 'program' }), async (req, res) => {
    res.json(await updateProgram(ctx.dataSource, id(req.params.programId), actorOf(req), parse(ProgramInputSchema, req.body)));
  });
  router.put('/programs/:programId/cutoff-schedule', allow({ kind: 'roles', roles: ['admin'], scope: 'program' }), async (req, res) => {
    res.json(await replaceCutoffSchedule(ctx.dataSource, id(req.params.programId), actorOf(req), parse(CutoffScheduleInputSchema, req.body)));
  });
  router.put('/programs/:programId/outcomes', allow({ kind: 'roles', roles: ['admin'], scope: 'program' }), async (req, res) => {
    res.json(await replaceOutcomes(ctx.dataSource, id(req.params.programId), actorOf(req), parse(OutcomeDefinitionsInputSchema, req.body)));
  });
  router.put('/programs/:programId/covariates', allow({ kind: 'roles', roles: ['admin'], scope: 'program' }), async (req, res) => {
    res.json(await replaceCovariates(ctx.dataSource, id(req.params.programId), actorOf(req), parse(CovariateDefinitionsInputSchema, req.body)));
  });
  return router;
}

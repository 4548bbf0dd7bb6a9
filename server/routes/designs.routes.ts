import { Router } from 'express';
import { DesignCreateSchema, DesignLockSchema, DesignUpdateSchema, DesignVersionCreateSchema } from '@shared/schemas/design';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { actorOf } from '../http/current-user';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { compareDesignVersions, createDesign, createDesignVersion, getDesign, listDesigns, lockDesign, updateDesign } from '../services/designs.service';
import { wakeRecompute } from '../services/recompute/wake';

const READERS = ['admin', 'analyst', 'manager', 'evaluator'] as const;
const WRITERS = ['analyst'] as const;
const CompareQuerySchema = z.object({ from: z.coerce.number().int().min(1), to: z.coerce.number().int().min(1) });

/** Evaluation designs: list, read, create, edit (a new version), lock, compare versions. */
export function designRoutes(ctx: AppContext, router: Router = Router()): Router {
  const ids = (params: Record<string, string | string[] | undefined>) => ({
    programId: idParam(params.programId, 'Program id'),
    designId: idParam(params.designId, 'Design id'),
  });
  router.get('/programs/:programId/designs', allow({ kind: 'roles', roles: READERS, scope: 'program' }), async (req, res) => {
    res.json({ items: await listDesigns(ctx.dataSource, idParam(req.params.programId, 'Program id')) });
  });
  router.post('/programs/:programId/designs', allow({ kind: 'roles', roles: WRITERS, scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const design = await createDesign(ctx.dataSource, programId, actorOf(req), parse(DesignCreateSchema, req.body));
    wakeRecompute(ctx.dataSource);
    res.status(201).json(design);
  });
  router.get('/programs/:programId/designs/:designId', allow({ kind: 'roles', roles: READERS, scope: 'program' }), async (req, res) => {
    const { programId, designId } = ids(req.params);
    res.json(await getDesign(ctx.dataSource, programId, designId));
  });
  router.patch('/programs/:programId/designs/:designId', allow({ kind: 'roles', roles: WRITERS, scope: 'program' }), async (req, res) => {
    const { programId, designId } = ids(req.params);
    const design = await updateDesign(ctx.dataSource, programId, designId, actorOf(req), parse(DesignUpdateSchema, req.body));
    wakeRecompute(ctx.dataSource);
    res.json(design);
  });
  router.post('/programs/:programId/designs/:designId/versions', allow({ kind: 'roles', roles: WRITERS, scope: 'program' }), async (req, res) => {
    const { programId, designId } = ids(req.params);
    const design = await createDesignVersion(ctx.dataSource, programId, designId, actorOf(req), parse(DesignVersionCreateSchema, req.body));
    wakeRecompute(ctx.dataSource);
    res.status(201).json(design);
  });
  router.post('/programs/:programId/designs/:designId/lock', allow({ kind: 'roles', roles: WRITERS, scope: 'program' }), async (req, res) => {
    const { programId, designId } = ids(req.params);
    res.json(await lockDesign(ctx.dataSource, programId, designId, actorOf(req), parse(DesignLockSchema, req.body ?? {})));
  });
  router.get('/programs/:programId/designs/:designId/compare', allow({ kind: 'roles', roles: READERS, scope: 'program' }), async (req, res) => {
    const { programId, designId } = ids(req.params);
    const q = parse(CompareQuerySchema, req.query);
    res.json(await compareDesignVersions(ctx.dataSource, programId, designId, q.from, q.to));
  });
  return router;
}

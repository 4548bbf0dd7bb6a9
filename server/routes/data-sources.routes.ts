import { Router } from 'express';
import { DataSourceInputSchema, IngestSettingsSchema } from '@shared/schemas/extract';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { createDataSource, listDataSources } from '../services/data-sources.service';
import { getIngestSettings, updateIngestSettings } from '../services/ingest-settings.service';
import type { AppContext } from '../app-context';

/** Data sources with their saved column mappings, and the program's ingest settings. */
export function dataSourceRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/programs/:programId/data-sources', allow({ kind: 'roles', roles: ['analyst', 'admin'], scope: 'program' }), async (req, res) => {
    res.json(await listDataSources(ctx.dataSource, idParam(req.params.programId, 'Program id')));
  });
  router.post('/programs/:programId/data-sources', allow({ kind: 'roles', roles: ['analyst'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const input = parse(DataSourceInputSchema, req.body);
    const source = await createDataSource(ctx.dataSource.manager, programId, input.name);
    res.status(201).json({ id: source.id, name: source.name, createdAt: source.createdAt.toISOString(), mappings: [] });
  });
  router.get(
    '/programs/:programId/ingest-settings',
    allow({ kind: 'roles', roles: ['analyst', 'admin', 'evaluator'], scope: 'program' }),
    async (req, res) => {
      res.json(await getIngestSettings(ctx.dataSource, idParam(req.params.programId, 'Program id')));
    },
  );
  router.put('/programs/:programId/ingest-settings', allow({ kind: 'roles', roles: ['admin'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    res.json(await updateIngestSettings(ctx.dataSource, programId, actorOf(req), parse(IngestSettingsSchema, req.body)));
  });
  return router;
}

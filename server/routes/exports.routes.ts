import { Router } from 'express';
import { DEIDENTIFIED_EXPORT_ROLES } from '@shared/api/annex';
import { DeidentifiedExportQuerySchema } from '@shared/schemas/annex';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { recordAudit } from '../services/audit.service';
import { prepareDeidentifiedExport } from '../services/deidentified-export/deidentified-export.service';
import { attachmentHeaders, streamFailed, writeChunk } from './download-response';

/** The row-level de-identified export (CSV), for evaluators only; every download is audited. */
export function exportRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/programs/:programId/exports/deidentified', allow({ kind: 'roles', roles: DEIDENTIFIED_EXPORT_ROLES, scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const query = parse(DeidentifiedExportQuerySchema, req.query);
    const range = query.from && query.to ? { from: query.from, to: query.to } : null;
    const data = await prepareDeidentifiedExport(ctx.dataSource, programId, range);
    // Recorded before the first row leaves: an interrupted download still counts as handed out.
    await recordAudit(ctx.dataSource.manager, {
      actor: actorOf(req),
      action: 'export.download',
      programId,
      subjectType: 'deidentified-export',
      subjectId: `${data.periods[0]}..${data.periods[data.periods.length - 1]}`,
      details: { from: range?.from ?? null, to: range?.to ?? null, cohorts: data.periods.length, rows: data.rows, columns: data.columns.map((c) => c.name) },
    });
    attachmentHeaders(res, 'text/csv; charset=utf-8', data.fileName);
    try {
      await data.write((chunk) => writeChunk(res, chunk));
      res.end();
    } catch (err) {
      streamFailed(ctx, res, err, { programId, what: 'de-identified export' });
    }
  });
  return router;
}

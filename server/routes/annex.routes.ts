import { Router } from 'express';
import { ANNEX_ROLES } from '@shared/api/annex';
import { AnnexQuerySchema } from '@shared/schemas/annex';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { actorOf, requireUser } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { gatherAnnexContent } from '../services/annex/annex-content';
import { ANNEX_CONTENT_TYPE, annexFileName, writeAnnex } from '../services/annex/build-annex';
import { recordAudit } from '../services/audit.service';
import { attachmentHeaders, streamFailed } from './download-response';

/** The technical annex (`server/services/annex/`): the workbook of a program, or of one cohort. */
export function annexRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/programs/:programId/annex', allow({ kind: 'roles', roles: ANNEX_ROLES, scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const query = parse(AnnexQuerySchema, req.query);
    const user = requireUser(req);
    const content = await gatherAnnexContent(ctx.dataSource, programId, {
      scope: query.period ? { kind: 'cohort', period: query.period } : { kind: 'program' },
      generatedBy: user.displayName,
      generatedAt: new Date(),
    });
    // Recorded when the workbook is handed out, before the first byte: an aborted download still counts.
    await recordAudit(ctx.dataSource.manager, {
      actor: actorOf(req),
      action: 'annex.download',
      programId,
      subjectType: 'annex',
      subjectId: query.period ?? 'all',
      details: {
        period: query.period ?? null,
        results: content.results.length,
        designId: content.design.id,
        designVersions: content.designVersions.map((v) => v.version),
        firstPeriod: content.periodCovered.first,
        lastPeriod: content.periodCovered.last,
      },
    });
    attachmentHeaders(res, ANNEX_CONTENT_TYPE, annexFileName(content));
    try {
      await writeAnnex(content, res);
    } catch (err) {
      streamFailed(ctx, res, err, { programId, what: 'annex' });
    }
  });
  return router;
}

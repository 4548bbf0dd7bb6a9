import { Router } from 'express';
import { AuditListQuerySchema } from '@shared/schemas/audit-query';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { parse } from '../http/validate';
import { listAuditEvents } from '../services/audit.service';

/** The audit trail; agency-wide administrators only. */
export function adminAuditRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/admin/audit', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (req, res) => {
    res.json(await listAuditEvents(ctx.dataSource, parse(AuditListQuerySchema, req.query)));
  });
  return router;
}

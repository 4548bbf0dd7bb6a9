import { z } from 'zod';
import { AuditActionSchema } from './audit';
import { PageQuerySchema } from './paging';

const dateOnly = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date is written YYYY-MM-DD, e.g. 2026-03-01.');

/** `GET /api/admin/audit`: newest first; `from`/`to` are inclusive calendar days in UTC. */
export const AuditListQuerySchema = PageQuerySchema.extend({
  action: AuditActionSchema.optional(),
  actorUserId: z.coerce.number().int().positive().optional(),
  programId: z.coerce.number().int().positive().optional(),
  from: dateOnly.optional(),
  to: dateOnly.optional(),
}).refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The first day must not be after the last day.', path: ['to'] });
export type AuditListQuery = z.infer<typeof AuditListQuerySchema>;

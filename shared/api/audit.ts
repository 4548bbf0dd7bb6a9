import type { AuditAction } from '../schemas/audit';

/** One row of the audit trail (admins only). `details` never holds personal data of applicants. */
export interface AuditEventDto {
  id: number;
  occurredAt: string;
  actorUserId: number | null;
  /** Display name of the actor at the time, or "system" for scheduled work. */
  actorLabel: string;
  action: AuditAction;
  programId: number | null;
  subjectType: string | null;
  subjectId: string | null;
  details: Record<string, unknown>;
}

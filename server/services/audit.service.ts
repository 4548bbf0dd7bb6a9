import type { EntityManager } from 'typeorm';
import type { AuditAction } from '@shared/schemas/audit';
import { AuditEvent } from '../entities/audit-event.entity';

export interface AuditActor {
  userId: number | null;
  label: string;
}

/** The actor for scheduled jobs. */
export const SYSTEM_ACTOR: AuditActor = { userId: null, label: 'system' };

export interface AuditEntry {
  actor: AuditActor;
  action: AuditAction;
  programId?: number | null;
  subjectType?: string;
  subjectId?: string | number;
  /** Ids, counts, checksums, reasons: never applicants' personal data. */
  details?: Record<string, unknown>;
}

/**
 * Records one audit event. Pass the transaction's manager when the event belongs to a change, so
 * the record and the change commit together.
 */
export async function recordAudit(manager: EntityManager, entry: AuditEntry): Promise<void> {
  const repo = manager.getRepository(AuditEvent);
  await repo.save(
    repo.create({
      actorUserId: entry.actor.userId,
      actorLabel: entry.actor.label,
      action: entry.action,
      programId: entry.programId ?? null,
      subjectType: entry.subjectType ?? null,
      subjectId: entry.subjectId === undefined ? null : String(entry.subjectId),
      details: entry.details ?? {},
    }),
  );
}

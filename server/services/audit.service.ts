import type { DataSource, EntityManager } from 'typeorm';
import type { AuditEventDto } from '@shared/api/audit';
import type { ListDto } from '@shared/api/programs';
import type { AuditAction } from '@shared/schemas/audit';
import type { AuditListQuery } from '@shared/schemas/audit-query';
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

/** The audit trail, newest first, one page at a time, optionally narrowed by action, actor, program and days (UTC). */
export async function listAuditEvents(ds: DataSource, query: AuditListQuery): Promise<ListDto<AuditEventDto>> {
  const qb = ds.getRepository(AuditEvent).createQueryBuilder('e').orderBy('e.occurredAt', 'DESC').addOrderBy('e.id', 'DESC');
  if (query.action) qb.andWhere('e.action = :action', { action: query.action });
  if (query.actorUserId) qb.andWhere('e.actorUserId = :actor', { actor: query.actorUserId });
  if (query.programId) qb.andWhere('e.programId = :programId', { programId: query.programId });
  if (query.from) qb.andWhere('e.occurredAt >= :from', { from: new Date(`${query.from}T00:00:00.000Z`) });
  if (query.to) qb.andWhere('e.occurredAt < :to', { to: new Date(Date.parse(`${query.to}T00:00:00.000Z`) + 86_400_000) });
  const [rows, total] = await qb
    .skip((query.page - 1) * query.pageSize)
    .take(query.pageSize)
    .getManyAndCount();
  return {
    items: rows.map((e) => ({
      id: Number(e.id),
      occurredAt: e.occurredAt.toISOString(),
      actorUserId: e.actorUserId,
      actorLabel: e.actorLabel,
      action: e.action,
      programId: e.programId,
      subjectType: e.subjectType,
      subjectId: e.subjectId,
      details: e.details,
    })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

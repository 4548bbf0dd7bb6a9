import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { SchedulesDto } from '@shared/api/schedules';
import { latestSlot, nextSlot, scheduleText } from '@shared/domain/summary-schedule';
import { Program } from '../entities/program.entity';
import { SummarySubscription } from '../entities/summary-subscription.entity';
import { User } from '../entities/user.entity';
import { notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { ensureDirectorSubscriptions } from './subscriptions.service';

/** Every director's summary schedule with its next send, by name. */
export async function listSchedules(ds: DataSource, now: Date): Promise<SchedulesDto> {
  await ensureDirectorSubscriptions(ds, now);
  const subs = await ds.getRepository(SummarySubscription).find({ order: { id: 'ASC' } });
  const users = subs.length ? await ds.getRepository(User).findBy({ id: In(subs.map((s) => s.userId)) }) : [];
  const programIds = [...new Set(subs.flatMap((s) => s.programIds))];
  const programs = programIds.length ? await ds.getRepository(Program).findBy({ id: In(programIds) }) : [];
  const summaries = subs.map((s) => {
    const user = users.find((u) => u.id === s.userId);
    const active = user?.active ?? false;
    return {
      subscriptionId: s.id,
      userId: s.userId,
      person: user?.displayName ?? `person ${s.userId}`,
      active,
      paused: s.paused,
      scheduleText: scheduleText(s.schedule),
      nextDueAt: s.paused || !active ? null : nextSlot(s.schedule, now).toISOString(),
      lastSentAt: s.lastSentAt?.toISOString() ?? null,
      programs: s.programIds.map((id) => programs.find((p) => p.id === id)?.name ?? `program ${id}`),
      attachAnnex: s.attachAnnex,
    };
  });
  summaries.sort((a, b) => a.person.localeCompare(b.person));
  return { summaries };
}

/**
 * An administrator pauses or resumes a director's summary (the director changes the rest in their
 * own settings). Resuming starts from the next slot, as when the director resumes it.
 * @throws not_found
 */
export async function setSummaryPaused(ds: DataSource, subscriptionId: number, actor: AuditActor, paused: boolean, now: Date): Promise<SchedulesDto> {
  await ds.transaction(async (tx) => {
    const sub = await tx.getRepository(SummarySubscription).findOneBy({ id: subscriptionId });
    if (!sub) throw notFound('Summary schedule');
    if (sub.paused === paused) return;
    await tx.getRepository(SummarySubscription).update({ id: sub.id }, { paused, ...(paused ? {} : { lastDueAt: latestSlot(sub.schedule, now) }) });
    await recordAudit(tx, { actor, action: 'subscription.update', subjectType: 'subscription', subjectId: sub.id, details: { paused, by: 'administrator' } });
  });
  return listSchedules(ds, now);
}

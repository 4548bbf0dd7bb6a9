import { In, type DataSource, type EntityManager } from 'typeorm';
import type { SubscriptionDto } from '@shared/api/mail';
import { latestSlot, nextSlot, scheduleText } from '@shared/domain/summary-schedule';
import { defaultSummarySchedule, type SubscriptionUpdateInput } from '@shared/schemas/subscription';
import { Program } from '../entities/program.entity';
import { RoleGrant } from '../entities/role-grant.entity';
import { SummarySubscription } from '../entities/summary-subscription.entity';
import { User } from '../entities/user.entity';
import { AppError, badRequest } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';

/** Time zone when no program says otherwise. */
const FALLBACK_TIME_ZONE = 'UTC';

/** Programs a person may receive summaries of: where they are director, or all with an agency-wide director grant. */
export async function directorPrograms(manager: EntityManager, userId: number): Promise<Program[]> {
  const grants = await manager.getRepository(RoleGrant).findBy({ userId, role: 'director' });
  if (grants.length === 0) return [];
  const repo = manager.getRepository(Program);
  if (grants.some((g) => g.programId === null)) return repo.find({ order: { name: 'ASC' } });
  return repo.find({ where: { id: In(grants.map((g) => g.programId!)) }, order: { name: 'ASC' } });
}

/**
 * The person's subscription, created with the default schedule (07:00 on the first working day of
 * the month, in the time zone of their first program) the first time it is needed. Directors are
 * subscribed until they pause. The first summary goes out at the next slot after creation.
 * @returns null when the person is not a director of any program
 */
export async function ensureSubscription(manager: EntityManager, userId: number, now: Date): Promise<SummarySubscription | null> {
  const repo = manager.getRepository(SummarySubscription);
  const existing = await repo.findOneBy({ userId });
  if (existing) return existing;
  const programs = await directorPrograms(manager, userId);
  if (programs.length === 0) return null;
  const schedule = defaultSummarySchedule(programs[0]!.timeZone || FALLBACK_TIME_ZONE);
  await repo.createQueryBuilder().insert().into(SummarySubscription).values({ userId, paused: false, schedule, programIds: [], attachAnnex: false, lastDueAt: latestSlot(schedule, now), lastSentAt: null }).orIgnore().execute();
  return repo.findOneByOrFail({ userId });
}

/** Subscriptions for every active director who has none yet (so the default schedule applies to all). */
export async function ensureDirectorSubscriptions(ds: DataSource, now: Date): Promise<void> {
  const rows: Array<{ user_id: number }> = await ds.query(
    `SELECT DISTINCT g.user_id FROM role_grant g JOIN app_user u ON u.id = g.user_id
      LEFT JOIN summary_subscription s ON s.user_id = g.user_id
      WHERE g.role = 'director' AND u.active = 1 AND s.id IS NULL`,
  );
  for (const r of rows) await ensureSubscription(ds.manager, Number(r.user_id), now);
}

/** @throws not_found when the person is not a director anywhere (they have no summary settings) */
export async function getSubscription(ds: DataSource, userId: number, now: Date): Promise<SubscriptionDto> {
  const sub = await ensureSubscription(ds.manager, userId, now);
  if (!sub) throw notDirector();
  return toDto(sub, await directorPrograms(ds.manager, userId), now);
}

/**
 * Changes the schedule, programs, annex choice, or pauses/resumes. A changed schedule starts at
 * its next slot (no summary is sent at once for a slot that has already passed).
 * @throws not_found | bad_request (a program the person is not director of)
 */
export async function updateSubscription(ds: DataSource, actor: AuditActor & { userId: number }, input: SubscriptionUpdateInput, now: Date): Promise<SubscriptionDto> {
  await ds.transaction(async (tx) => {
    const sub = await ensureSubscription(tx, actor.userId, now);
    if (!sub) throw notDirector();
    const allowed = new Set((await directorPrograms(tx, actor.userId)).map((p) => p.id));
    const outside = input.programIds.filter((id) => !allowed.has(id));
    if (outside.length > 0) throw badRequest('You can only choose programs you are a director of.', { programIds: outside });
    const resumed = sub.paused && !input.paused;
    const scheduleChanged = JSON.stringify(sub.schedule) !== JSON.stringify(input.schedule);
    await tx.getRepository(SummarySubscription).update(
      { id: sub.id },
      {
        paused: input.paused,
        schedule: input.schedule,
        programIds: [...new Set(input.programIds)].sort((a, b) => a - b),
        attachAnnex: input.attachAnnex,
        // Resuming or rescheduling starts from the next slot: slots missed while paused are not sent.
        ...(resumed || scheduleChanged ? { lastDueAt: latestSlot(input.schedule, now) } : {}),
      },
    );
    await recordAudit(tx, {
      actor,
      action: 'subscription.update',
      subjectType: 'subscription',
      subjectId: sub.id,
      details: { paused: input.paused, cadence: input.schedule.cadence, programs: input.programIds.length, attachAnnex: input.attachAnnex },
    });
  });
  return getSubscription(ds, actor.userId, now);
}

/** Subscriptions with a slot due at `now` that has not been sent: not paused, person active. */
export async function dueSubscriptions(ds: DataSource, now: Date): Promise<Array<{ sub: SummarySubscription; slot: Date }>> {
  const subs = await ds.getRepository(SummarySubscription).find({ where: { paused: false }, order: { id: 'ASC' } });
  const users = await ds.getRepository(User).findBy({ id: In(subs.map((s) => s.userId).concat([0])), active: true });
  const active = new Set(users.map((u) => u.id));
  const due: Array<{ sub: SummarySubscription; slot: Date }> = [];
  for (const sub of subs) {
    if (!active.has(sub.userId)) continue;
    const slot = latestSlot(sub.schedule, now);
    if (!sub.lastDueAt || slot.getTime() > sub.lastDueAt.getTime()) due.push({ sub, slot });
  }
  return due;
}

function toDto(sub: SummarySubscription, programs: Program[], now: Date): SubscriptionDto {
  return {
    id: sub.id,
    paused: sub.paused,
    schedule: sub.schedule,
    programIds: sub.programIds,
    attachAnnex: sub.attachAnnex,
    nextDueAt: sub.paused ? null : nextSlot(sub.schedule, now).toISOString(),
    lastSentAt: sub.lastSentAt?.toISOString() ?? null,
    scheduleText: scheduleText(sub.schedule),
    availablePrograms: programs.map((p) => ({ id: p.id, name: p.name })),
  };
}

function notDirector(): AppError {
  return new AppError('not_found', 'Only directors receive the summary e-mail, so there are no summary settings for you.');
}

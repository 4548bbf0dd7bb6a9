import type { DataSource, EntityManager } from 'typeorm';
import { LessThanOrEqual } from 'typeorm';
import type { RunTrigger } from '@shared/api/runs';
import { RecomputeRun } from '../../entities/recompute-run.entity';
import { recordAudit, type AuditActor } from '../audit.service';
import { isLockFree, recomputeLockName } from './named-lock';

/** Attempts of one run before it is marked failed. */
export const MAX_RUN_ATTEMPTS = 3;

export interface RecomputeRequest {
  programId: number;
  trigger: RunTrigger;
  actor: AuditActor;
  /** Defaults to the database clock. */
  now?: Date;
}

/**
 * Asks for a recompute of a program. While one is queued, further requests join it (a unique
 * index on `queued_program_id`), so concurrent triggers from any instance run once. Call inside the
 * transaction of the change that makes results stale, so the request commits with it.
 * @returns the queued run and whether the request joined an existing one
 */
export async function requestRecompute(manager: EntityManager, req: RecomputeRequest): Promise<{ run: RecomputeRun; joined: boolean }> {
  const repo = manager.getRepository(RecomputeRun);
  const now = req.now ?? new Date();
  const inserted = await repo
    .createQueryBuilder()
    .insert()
    .into(RecomputeRun)
    .values({
      programId: req.programId,
      queuedProgramId: req.programId,
      designId: null,
      trigger: req.trigger,
      requestedByUserId: req.actor.userId,
      requestedByLabel: req.actor.label,
      status: 'queued',
      attempts: 0,
      maxAttempts: MAX_RUN_ATTEMPTS,
      nextAttemptAt: now,
      requestedAt: now,
    })
    .orIgnore()
    .execute();
  // MariaDB answers INSERT … RETURNING through TypeORM: an ignored row returns no identifier.
  const joined = !inserted.identifiers[0];
  const run = await repo.findOneByOrFail({ queuedProgramId: req.programId });
  if (!joined && req.actor.userId !== null) {
    await recordAudit(manager, { actor: req.actor, action: 'run.trigger', programId: req.programId, subjectType: 'run', subjectId: run.id, details: { trigger: req.trigger } });
  }
  return { run, joined };
}

/** Queued runs whose back-off has passed, oldest first (at most `limit`). */
export async function dueRuns(ds: DataSource, now: Date, limit = 20): Promise<RecomputeRun[]> {
  return ds.getRepository(RecomputeRun).find({ where: { status: 'queued', nextAttemptAt: LessThanOrEqual(now) }, order: { nextAttemptAt: 'ASC', id: 'ASC' }, take: limit });
}

/** Earliest back-off end among queued runs, for the in-process worker's timer. */
export async function nextQueuedAt(ds: DataSource): Promise<Date | null> {
  const run = await ds.getRepository(RecomputeRun).findOne({ where: { status: 'queued' }, order: { nextAttemptAt: 'ASC' } });
  return run?.nextAttemptAt ?? null;
}

/**
 * Runs left `running` by a process that died: their program lock is free (a live run holds it).
 * Each counts as a failed attempt and is queued again, or failed when out of attempts.
 * @returns how many were recovered
 */
export async function recoverInterruptedRuns(ds: DataSource, now: Date, backoff: (attempt: number) => number): Promise<number> {
  const running = await ds.getRepository(RecomputeRun).findBy({ status: 'running' });
  let recovered = 0;
  for (const run of running) {
    if (!(await isLockFree(ds, recomputeLockName(ds, run.programId)))) continue;
    await failAttempt(ds, run, { code: 'run_interrupted', message: 'The recompute stopped before it finished (the server restarted or the process was ended). The previous results were kept and marked stale.' }, now, backoff);
    recovered++;
  }
  return recovered;
}

/**
 * Records a failed attempt: queued again after the back-off while attempts remain, else failed.
 * If another run of the program was queued meanwhile, this one is closed as failed and that one
 * carries the retry (it recomputes everything stale anyway).
 */
export async function failAttempt(
  ds: DataSource,
  run: RecomputeRun,
  error: { code: string; message: string },
  now: Date,
  backoff: (attempt: number) => number,
): Promise<void> {
  await ds.transaction(async (tx) => {
    const repo = tx.getRepository(RecomputeRun);
    const fresh = await repo.createQueryBuilder('r').setLock('pessimistic_write').where('r.id = :id', { id: run.id }).getOneOrFail();
    if (fresh.status !== 'running' && fresh.status !== 'queued') return;
    const durationMs = fresh.startedAt ? Math.max(0, now.getTime() - fresh.startedAt.getTime()) : null;
    const base = { errorCode: error.code, errorMessage: error.message, finishedAt: now, durationMs, progressCurrent: null };
    const otherQueued = await repo.createQueryBuilder('r').where('r.queuedProgramId = :p AND r.id <> :id', { p: fresh.programId, id: fresh.id }).getCount();
    if (fresh.attempts < fresh.maxAttempts && otherQueued === 0) {
      await repo.update({ id: fresh.id }, { ...base, status: 'queued', queuedProgramId: fresh.programId, nextAttemptAt: new Date(now.getTime() + backoff(fresh.attempts)) });
    } else {
      await repo.update({ id: fresh.id }, { ...base, status: 'failed', queuedProgramId: null });
    }
  });
}

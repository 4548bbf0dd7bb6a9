import fs from 'node:fs';
import path from 'node:path';
import { In, IsNull, LessThan, type DataSource } from 'typeorm';
import { addMonths } from '@shared/domain/period';
import type { Config } from '../config/env';
import { Extract } from '../entities/extract.entity';
import { ExtractRejectedRow } from '../entities/extract-rejected-row.entity';
import { Program } from '../entities/program.entity';
import type { Logger } from '../lib/logger';
import { recordAudit, SYSTEM_ACTOR } from './audit.service';
import { ingestFiles } from './ingest/work-dir';
import { tryNamedLock } from './recompute/named-lock';

export interface RetentionDeps {
  dataSource: DataSource;
  config: Config;
  logger: Logger;
}

export interface PurgeLimits {
  /** Rows deleted per statement (short transactions, no long lock on the table). */
  batchRows: number;
  /** Rows deleted per run at most; the rest waits for the next run. */
  maxRowsPerRun: number;
  /** Uploads left without a decision this long are set aside (their files hold raw identifiers). */
  abandonedAfterDays: number;
}

export const DEFAULT_PURGE_LIMITS: PurgeLimits = { batchRows: 50_000, maxRowsPerRun: 5_000_000, abandonedAfterDays: 14 };

export interface PurgeReport {
  skipped: boolean;
  extracts: number;
  rows: number;
  capped: boolean;
  abandoned: number;
}

/** `YYYY-MM` of an instant in a time zone. */
export function periodIn(now: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit' }).formatToParts(now);
  return `${parts.find((p) => p.type === 'year')!.value}-${parts.find((p) => p.type === 'month')!.value}`;
}

/**
 * Retention: deletes the row-level observations (and rejected-row details) of cohorts older than
 * each program's `retentionMonths` — a cohort is purged once its month lies more than that many
 * months before the current month in the program's time zone. The extract records, their counts and
 * checksums, and every computed result stay. Each program's purge is one `observations.purge` audit
 * event. Also sets aside uploads nobody decided on for two weeks and deletes their files.
 * Idempotent, batched, capped, and guarded by a named lock against overlapping runs.
 */
export async function purgeExpiredObservations(deps: RetentionDeps, now: Date, limits: PurgeLimits = DEFAULT_PURGE_LIMITS): Promise<PurgeReport> {
  const ds = deps.dataSource;
  const report: PurgeReport = { skipped: false, extracts: 0, rows: 0, capped: false, abandoned: 0 };
  const lock = await tryNamedLock(ds, `cutline:${String(ds.options.database)}:purge-observations`.slice(0, 64));
  if (!lock) return { ...report, skipped: true };
  try {
    for (const program of await ds.getRepository(Program).find({ order: { id: 'ASC' } })) {
      if (report.capped) break;
      const keepFrom = addMonths(periodIn(now, program.timeZone), -program.retentionMonths);
      const expired = await ds.getRepository(Extract).find({
        where: { programId: program.id, period: LessThan(keepFrom), observationsPurgedAt: IsNull(), status: In(['accepted', 'superseded']) },
        order: { period: 'ASC', id: 'ASC' },
      });
      const purged: Array<{ id: number; period: string; rows: number }> = [];
      for (const extract of expired) {
        const deleted = await deleteRows(ds, extract.id, limits, limits.maxRowsPerRun - report.rows);
        report.rows += deleted.rows;
        if (!deleted.complete) {
          report.capped = true;
          break;
        }
        await ds.getRepository(ExtractRejectedRow).delete({ extractId: extract.id });
        await ds.getRepository(Extract).update({ id: extract.id }, { observationsPurgedAt: now });
        purged.push({ id: extract.id, period: extract.period, rows: deleted.rows });
      }
      report.extracts += purged.length;
      if (purged.length > 0) {
        await recordAudit(ds.manager, {
          actor: SYSTEM_ACTOR,
          action: 'observations.purge',
          programId: program.id,
          subjectType: 'program',
          subjectId: program.id,
          details: {
            retentionMonths: program.retentionMonths,
            purgedBefore: keepFrom,
            extracts: purged.map((p) => p.id),
            periods: [...new Set(purged.map((p) => p.period))],
            rows: purged.reduce((sum, p) => sum + p.rows, 0),
          },
        });
      }
    }
    report.abandoned = await setAsideAbandonedUploads(deps, now, limits.abandonedAfterDays);
  } finally {
    await lock.release();
    deps.logger.info({ ...report }, 'observations purge finished');
  }
  return report;
}

/** Deletes an extract's observations in batches. @returns rows deleted and whether none are left */
async function deleteRows(ds: DataSource, extractId: number, limits: PurgeLimits, budget: number): Promise<{ rows: number; complete: boolean }> {
  let rows = 0;
  while (rows < budget) {
    const batch = Math.min(limits.batchRows, budget - rows);
    const result: { affectedRows: number } = await ds.query('DELETE FROM observation WHERE extract_id = ? ORDER BY row_no LIMIT ?', [extractId, batch]);
    rows += result.affectedRows;
    if (result.affectedRows < batch) return { rows, complete: true };
  }
  const [left] = await ds.query('SELECT EXISTS (SELECT 1 FROM observation WHERE extract_id = ?) AS any_left', [extractId]);
  return { rows, complete: Number(left.any_left) === 0 };
}

/**
 * Uploads left without a decision for `days` days are rejected by the system and their files
 * deleted (they hold raw identifiers); interrupted uploads in `incoming/` older than a day go too.
 */
async function setAsideAbandonedUploads(deps: RetentionDeps, now: Date, days: number): Promise<number> {
  const ds = deps.dataSource;
  const before = new Date(now.getTime() - days * 24 * 3600 * 1000);
  const stale = await ds.getRepository(Extract).find({
    where: { status: In(['uploaded', 'awaiting-decision', 'failed']), updatedAt: LessThan(before), decidedAt: IsNull() },
  });
  const files = ingestFiles(deps);
  for (const extract of stale) {
    await ds.transaction(async (tx) => {
      const result = await tx.getRepository(Extract).update(
        { id: extract.id, status: extract.status },
        { status: 'rejected', decidedAt: now, decidedByLabel: SYSTEM_ACTOR.label, decisionNote: `Set aside: no decision within ${days} days of the upload.` },
      );
      if (result.affected !== 1) return;
      await recordAudit(tx, {
        actor: SYSTEM_ACTOR,
        action: 'extract.reject',
        programId: extract.programId,
        subjectType: 'extract',
        subjectId: extract.id,
        details: { period: extract.period, sha256: extract.sha256, reason: 'abandoned', days },
      });
    });
    files.removeExtract(extract.id);
  }
  const incoming = files.incoming();
  for (const name of fs.readdirSync(incoming)) {
    const file = path.join(incoming, name);
    if (fs.statSync(file).mtimeMs < now.getTime() - 24 * 3600 * 1000) fs.rmSync(file, { force: true });
  }
  return stale.length;
}

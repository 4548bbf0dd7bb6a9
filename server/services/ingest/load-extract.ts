import type { EntityManager } from 'typeorm';
import { loadDataLocalInfile, rawConnection } from '../../db/raw-connection';
import { Cohort } from '../../entities/cohort.entity';
import { Extract, type ObservationSlots } from '../../entities/extract.entity';
import { AppError } from '../../lib/errors';
import { recordAudit, type AuditActor } from '../audit.service';
import { requestRecompute } from '../recompute/run-queue';
import { wakeRecompute } from '../recompute/wake';
import type { IngestDeps } from './validate-extract';
import { ingestFiles } from './work-dir';

/** The staging table of one extract: same columns and key as `observation`, dropped after the swap. */
export function stageTable(extractId: number): string {
  return `observation_stage_${extractId}`;
}

/**
 * Loads an extract in status `loading`: its clean chunks go into a staging table of its own with
 * `LOAD DATA LOCAL INFILE` (MariaDB's bulk path), then one transaction copies them into
 * `observation`, marks the extract accepted and the month's previous extract superseded, and records
 * the audit events. Until that commit nothing of the extract is visible; if anything fails, the
 * previous extract stays as it was and the staging table is dropped on the next attempt.
 */
export async function loadExtract(deps: IngestDeps, extractId: number): Promise<void> {
  const ds = deps.dataSource;
  const repo = ds.getRepository(Extract);
  const extract = await repo.findOneByOrFail({ id: extractId });
  if (extract.status !== 'loading') return;
  const files = ingestFiles(deps);
  const chunks = files.chunks(extractId);
  const expected = extract.rowsAccepted ?? 0;
  if (chunks.length === 0 && expected > 0) {
    throw new AppError('extract_processing_failed', 'The checked rows of this extract are no longer on the server. Upload the file again.');
  }
  const slots = extract.slots;
  if (!slots) throw new AppError('extract_processing_failed', 'This extract was never checked completely. Upload the file again.');
  const stage = stageTable(extractId);
  const { conn, release } = await rawConnection(ds);
  try {
    await ds.query(`DROP TABLE IF EXISTS \`${stage}\``);
    await ds.query(`CREATE TABLE \`${stage}\` LIKE observation`);
    let loaded = 0;
    const started = Date.now();
    await repo.update({ id: extractId }, { progress: { phase: 'loading', done: 0, total: expected, unit: 'rows' } });
    const sql =
      `LOAD DATA LOCAL INFILE ? INTO TABLE \`${stage}\` CHARACTER SET utf8mb4 FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' ` +
      `(${loadColumns(slots).join(', ')}) SET extract_id = ${Number(extractId)}, subject_hash = UNHEX(@subject_hash)`;
    for (const chunk of chunks) {
      loaded += await loadDataLocalInfile(conn, sql, chunk, files.root);
      await repo.update({ id: extractId }, { progress: { phase: 'loading', done: loaded, total: expected, unit: 'rows' } });
    }
    if (loaded !== expected) {
      throw new AppError('extract_processing_failed', `The database took ${loaded} rows where ${expected} were checked. Nothing was stored; try again.`);
    }
    await repo.update({ id: extractId }, { progress: { phase: 'publishing', done: loaded, total: expected, unit: 'rows' } });
    const staged = Date.now();
    const replaced = await ds.transaction(async (tx) => publish(tx, extract, stage));
    wakeRecompute(ds);
    deps.logger.info({ extractId, rows: loaded, superseded: replaced, stageMs: staged - started, publishMs: Date.now() - staged }, 'extract accepted');
  } finally {
    release().catch(() => undefined);
  }
  await ds.query(`DROP TABLE IF EXISTS \`${stage}\``);
  files.removeExtract(extractId);
}

/** Columns of a clean chunk line, in the order the validation pass writes them. */
function loadColumns(slots: ObservationSlots): string[] {
  const outcomes = Object.values(slots.outcomes).sort((a, b) => a - b).map((s) => `o${s}`);
  const covariates = Object.values(slots.covariates).sort((a, b) => a - b).map((s) => `c${s}`);
  return ['row_no', '@subject_hash', 'score', 'take_up', 'cluster_code', ...outcomes, ...covariates];
}

/** The swap: in one transaction the staged rows become the month's visible observations. @returns the superseded extract id */
async function publish(tx: EntityManager, extract: Extract, stage: string): Promise<number | null> {
  const repo = tx.getRepository(Extract);
  // Locks the month's accepted extract (if any) so two loads of one month cannot both win.
  const current = await repo
    .createQueryBuilder('e')
    .setLock('pessimistic_write')
    .where('e.programId = :programId AND e.period = :period AND e.status = :status AND e.id <> :id', {
      programId: extract.programId,
      period: extract.period,
      status: 'accepted',
      id: extract.id,
    })
    .getOne();
  const still = await repo.createQueryBuilder('e').setLock('pessimistic_write').where('e.id = :id', { id: extract.id }).getOneOrFail();
  if (still.status !== 'loading') throw new AppError('extract_state_conflict', 'The extract changed while it was being loaded.');
  await tx.query(`INSERT INTO observation SELECT * FROM \`${stage}\``);
  const now = new Date();
  const actor: AuditActor = { userId: extract.decidedByUserId, label: extract.decidedByLabel ?? 'system' };
  if (current) {
    await repo.update({ id: current.id }, { status: 'superseded', supersededById: extract.id, supersededAt: now });
    await recordAudit(tx, {
      actor,
      action: 'extract.supersede',
      programId: extract.programId,
      subjectType: 'extract',
      subjectId: current.id,
      details: { period: extract.period, supersededBy: extract.id, sha256: current.sha256, rows: current.rowsAccepted },
    });
  }
  await repo.update({ id: extract.id }, { status: 'accepted', acceptedAt: now, progress: null, problemCode: null, problemMessage: null });
  await tx.createQueryBuilder().insert().into(Cohort).values({ programId: extract.programId, period: extract.period }).orIgnore().execute();
  await recordAudit(tx, {
    actor,
    action: 'extract.accept',
    programId: extract.programId,
    subjectType: 'extract',
    subjectId: extract.id,
    details: { period: extract.period, sha256: extract.sha256, rowsAccepted: extract.rowsAccepted, rowsRejected: extract.rowsRejected, replaces: current?.id ?? null },
  });
  // The month's data changed: results computed from it are stale, so a recompute is queued with the swap.
  await requestRecompute(tx, { programId: extract.programId, trigger: 'extract-accepted', actor, now });
  return current?.id ?? null;
}

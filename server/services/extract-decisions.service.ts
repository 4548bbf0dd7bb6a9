import fs from 'node:fs';
import { In, IsNull, type EntityManager } from 'typeorm';
import type { ExtractDetailDto } from '@shared/api/extracts';
import type { ExtractMappingRequest, ExtractRejectRequest } from '@shared/schemas/extract';
import { Extract } from '../entities/extract.entity';
import { ExtractRejectedRow } from '../entities/extract-rejected-row.entity';
import { AppError } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { createDataSource, findDataSource, saveMapping } from './data-sources.service';
import { findExtract, getExtractDetail } from './extracts.service';
import { ingestWorker } from './ingest/ingest-worker';
import { requestRecompute } from './recompute/run-queue';
import { wakeRecompute } from './recompute/wake';
import { buildRowRules } from './ingest/mapping-rules';
import { programFacts } from './ingest/program-facts';
import type { IngestDeps } from './ingest/validate-extract';
import { ingestFiles } from './ingest/work-dir';

const detail = (deps: IngestDeps, programId: number, id: number) => getExtractDetail(deps, programId, id);

/**
 * Sets the column mapping of an uploaded extract (or changes it after a report) and starts
 * validation; saves it under the data source unless told not to.
 * @throws AppError extract_column_missing | extract_mapping_invalid | extract_state_conflict | not_found | conflict
 */
export async function setExtractMapping(
  deps: IngestDeps,
  programId: number,
  extractId: number,
  actor: AuditActor,
  body: ExtractMappingRequest,
): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  const extract = await findExtract(ds, programId, extractId);
  if (extract.status !== 'uploaded' && extract.status !== 'awaiting-decision') {
    throw stateConflict(extract, 'change its column mapping');
  }
  if (!fs.existsSync(ingestFiles(deps).upload(extract.id, extract.format))) {
    throw new AppError('extract_state_conflict', 'The uploaded file is no longer kept, so the mapping cannot change. Upload the file again.');
  }
  const program = await programFacts(ds.manager, programId);
  buildRowRules(body.mapping, extract.columns, program, extract.period, extract.format);
  await ds.transaction(async (tx) => {
    const source =
      body.newSourceName !== undefined ? await createDataSource(tx, programId, body.newSourceName) : await findDataSource(tx, programId, body.sourceId!);
    if (body.save) {
      await saveMapping(tx, { programId, sourceId: source.id, fingerprint: extract.headerFingerprint, columns: extract.columns, mapping: body.mapping, actor });
    }
    const result = await tx.getRepository(Extract).update(
      { id: extract.id, status: In(['uploaded', 'awaiting-decision']) },
      {
        sourceId: source.id,
        mapping: body.mapping,
        mappingOrigin: 'entered',
        status: 'validating',
        attempts: 0,
        report: null,
        problemCode: null,
        problemMessage: null,
        rowsRead: null,
        rowsAccepted: null,
        rowsRejected: null,
      },
    );
    if (result.affected !== 1) throw stateConflict(extract, 'change its column mapping');
  });
  ingestWorker(deps).enqueue(extract.id);
  return detail(deps, programId, extract.id);
}

/**
 * The analyst's accept: the extract goes to `loading` and the background worker makes it the
 * month's visible data. Accepting twice is harmless. The raw upload is deleted now (the checked,
 * pseudonymised rows are what gets loaded).
 * @throws AppError extract_state_conflict (with the blocking problem's message when there is one)
 */
export async function acceptExtract(deps: IngestDeps, programId: number, extractId: number, actor: AuditActor, note?: string): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  const extract = await findExtract(ds, programId, extractId);
  if (extract.status === 'loading' || extract.status === 'accepted') return detail(deps, programId, extract.id);
  if (extract.status === 'awaiting-decision' && extract.problemCode) {
    throw new AppError('extract_state_conflict', `This extract cannot be accepted: ${extract.problemMessage ?? 'it has a problem.'}`, {
      details: { problem: extract.problemCode },
    });
  }
  const result = await ds.getRepository(Extract).update(
    { id: extract.id, status: 'awaiting-decision', problemCode: IsNull() },
    { status: 'loading', attempts: 0, decidedAt: new Date(), decidedByUserId: actor.userId, decidedByLabel: actor.label, decisionNote: note ?? null },
  );
  if (result.affected !== 1) throw stateConflict(await findExtract(ds, programId, extractId), 'accept it');
  ingestFiles(deps).removeUpload(extract.id);
  ingestWorker(deps).enqueue(extract.id);
  return detail(deps, programId, extract.id);
}

/** The analyst's reject: nothing of the file is stored beyond its record and report. Rejecting twice is harmless. */
export async function rejectExtract(deps: IngestDeps, programId: number, extractId: number, actor: AuditActor, body: ExtractRejectRequest): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  const extract = await findExtract(ds, programId, extractId);
  if (extract.status === 'rejected') return detail(deps, programId, extract.id);
  const rejectable = ['uploaded', 'awaiting-decision', 'failed'] as const;
  if (!(rejectable as readonly string[]).includes(extract.status) || (extract.status === 'failed' && extract.decidedAt !== null)) {
    throw stateConflict(extract, 'reject it');
  }
  await ds.transaction(async (tx) => {
    const result = await tx.getRepository(Extract).update(
      { id: extract.id, status: extract.status },
      { status: 'rejected', decidedAt: new Date(), decidedByUserId: actor.userId, decidedByLabel: actor.label, decisionNote: body.reason ?? null, progress: null },
    );
    if (result.affected !== 1) throw stateConflict(extract, 'reject it');
    await recordAudit(tx, {
      actor,
      action: 'extract.reject',
      programId,
      subjectType: 'extract',
      subjectId: extract.id,
      details: { period: extract.period, sha256: extract.sha256, problem: extract.problemCode, rowsRejected: extract.rowsRejected },
    });
  });
  ingestFiles(deps).removeExtract(extract.id);
  return detail(deps, programId, extract.id);
}

/**
 * Makes a superseded extract the month's visible data again (its rows were kept), and the one
 * that replaced it superseded, in one transaction.
 * @throws AppError extract_state_conflict | extract_observations_purged
 */
export async function restoreExtract(deps: IngestDeps, programId: number, extractId: number, actor: AuditActor): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  await ds.transaction(async (tx) => {
    const repo = tx.getRepository(Extract);
    const target = await lockExtract(tx, programId, extractId);
    if (target.status !== 'superseded') throw stateConflict(target, 'restore it');
    if (target.observationsPurgedAt) {
      throw new AppError('extract_observations_purged', 'The rows of this extract were deleted by the retention rule, so it cannot be restored. Upload the file again.');
    }
    const current = await repo
      .createQueryBuilder('e')
      .setLock('pessimistic_write')
      .where('e.programId = :programId AND e.period = :period AND e.status = :status', { programId, period: target.period, status: 'accepted' })
      .getOne();
    const now = new Date();
    if (current) await repo.update({ id: current.id }, { status: 'superseded', supersededById: target.id, supersededAt: now });
    await repo.update({ id: target.id }, { status: 'accepted', acceptedAt: now, supersededById: null, supersededAt: null });
    await recordAudit(tx, {
      actor,
      action: 'extract.restore',
      programId,
      subjectType: 'extract',
      subjectId: target.id,
      details: { period: target.period, sha256: target.sha256, replaces: current?.id ?? null },
    });
    await requestRecompute(tx, { programId, trigger: 'extract-accepted', actor, now });
  });
  wakeRecompute(ds);
  return detail(deps, programId, extractId);
}

/** Runs a failed step again: validation if no decision was taken yet, otherwise the load. */
export async function retryExtract(deps: IngestDeps, programId: number, extractId: number): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  const extract = await findExtract(ds, programId, extractId);
  if (extract.status !== 'failed') throw stateConflict(extract, 'retry it');
  const next = extract.decidedAt ? 'loading' : 'validating';
  if (next === 'validating') {
    await ds.getRepository(ExtractRejectedRow).delete({ extractId });
    ingestFiles(deps).removeChunks(extractId);
  }
  const result = await ds.getRepository(Extract).update({ id: extract.id, status: 'failed' }, { status: next, attempts: 0, problemCode: null, problemMessage: null });
  if (result.affected !== 1) throw stateConflict(extract, 'retry it');
  ingestWorker(deps).enqueue(extract.id);
  return detail(deps, programId, extract.id);
}

async function lockExtract(tx: EntityManager, programId: number, extractId: number): Promise<Extract> {
  const found = await tx
    .getRepository(Extract)
    .createQueryBuilder('e')
    .setLock('pessimistic_write')
    .where('e.id = :extractId AND e.programId = :programId', { extractId, programId })
    .getOne();
  if (!found) throw new AppError('not_found', 'Extract was not found.');
  return found;
}

const STATE_WORDS: Record<Extract['status'], string> = {
  uploaded: 'still needs its column mapping',
  validating: 'is being checked',
  'awaiting-decision': 'is waiting for your decision',
  loading: 'is being loaded',
  accepted: 'is already accepted',
  rejected: 'was rejected',
  failed: 'failed to process (retry it first)',
  superseded: 'was replaced by a later file for the same month',
};

function stateConflict(extract: Extract, action: string): AppError {
  return new AppError('extract_state_conflict', `This extract ${STATE_WORDS[extract.status]}, so you cannot ${action} now.`, {
    details: { status: extract.status },
  });
}

import fs from 'node:fs';
import type { DataSource } from 'typeorm';
import type { ExtractProgressDto, ProblemDto } from '@shared/api/extracts';
import type { Config } from '../../config/env';
import { ClusterCode } from '../../entities/cluster-code.entity';
import { Extract } from '../../entities/extract.entity';
import { ExtractRejectedRow } from '../../entities/extract-rejected-row.entity';
import { AppError } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import { buildRowRules, slotsOf } from './mapping-rules';
import { cutoffOrThrow, programFacts } from './program-facts';
import { openTable } from './table-reader';
import { runValidationPass, type RejectedRow } from './validate-pass';
import { judge } from './verdict';
import { ingestFiles } from './work-dir';

export interface IngestDeps {
  dataSource: DataSource;
  config: Config;
  logger: Logger;
}

/** Limits of one extract. Rows: 5 million (a 200 MB file holds about 2 million of ours). */
export const INGEST_LIMITS = {
  maxRows: 5_000_000,
  rowsPerChunk: 250_000,
  /** Rejected rows kept for the table and rejected.csv; all are counted. */
  keepRejected: 100_000,
} as const;

/**
 * Validates an extract in status `validating` from its uploaded file and mapping, and leaves it
 * `awaiting-decision` with its report (and, if the file cannot be used, the problem). Starts over
 * cleanly when run again after an interruption.
 */
export async function validateExtract(deps: IngestDeps, extractId: number): Promise<void> {
  const ds = deps.dataSource;
  const repo = ds.getRepository(Extract);
  const extract = await repo.findOneByOrFail({ id: extractId });
  if (extract.status !== 'validating' || !extract.mapping) return;
  await ds.getRepository(ExtractRejectedRow).delete({ extractId });
  const files = ingestFiles(deps);
  files.removeChunks(extractId);

  const program = await programFacts(ds.manager, extract.programId);
  const file = files.upload(extractId, extract.format);
  if (!fs.existsSync(file)) {
    throw new AppError('extract_processing_failed', 'The uploaded file is no longer on the server, so it cannot be checked. Upload it again.');
  }
  let progressWrite = Promise.resolve();
  const setProgress = (progress: ExtractProgressDto) => {
    progressWrite = progressWrite.then(() => repo.update({ id: extractId }, { progress }).then(() => undefined)).catch(() => undefined);
  };
  setProgress({ phase: 'validating', done: 0, total: fs.statSync(file).size, unit: 'bytes' });

  try {
    const cutoff = cutoffOrThrow(program.schedule, extract.period);
    const rules = buildRowRules(extract.mapping, extract.columns, program, extract.period, extract.format);
    const table = await openTable(file, extract.format, { sheet: extract.sheet, delimiter: extract.delimiter });
    const pass = await runValidationPass({
      table,
      rules,
      programId: program.id,
      cutoff,
      eligibleSide: program.eligibleSide,
      pseudonymKey: deps.config.secrets.pseudonymKey,
      chunkPath: (n) => files.chunk(extractId, n),
      rowsPerChunk: INGEST_LIMITS.rowsPerChunk,
      maxRows: INGEST_LIMITS.maxRows,
      keepRejected: INGEST_LIMITS.keepRejected,
      saveRejected: (rows) => saveRejectedRows(ds, extractId, rows),
      clusterCode: (hash) => clusterCodeOf(ds, program.id, hash),
      progress: (done, total) => setProgress({ phase: 'validating', done, total, unit: 'bytes' }),
    });
    const { report, problem } = judge(pass, {
      period: extract.period,
      cutoff,
      eligibleSide: program.eligibleSide,
      maxRejectedShare: program.maxRejectedShare,
      maxRows: INGEST_LIMITS.maxRows,
    });
    await progressWrite;
    await finish(ds, extractId, problem, {
      report,
      slots: slotsOf(rules),
      rowsRead: pass.rowsRead,
      rowsAccepted: pass.rowsAccepted,
      rowsRejected: pass.rowsRejected,
    });
    deps.logger.info({ extractId, rowsRead: pass.rowsRead, rowsRejected: pass.rowsRejected, problem: problem?.code ?? null }, 'extract validated');
  } catch (err) {
    // Problems of the file or the mapping end the check with a report the analyst can act on.
    if (!(err instanceof AppError) || err.code === 'extract_processing_failed') throw err;
    await progressWrite;
    files.removeChunks(extractId);
    await finish(ds, extractId, { code: err.code, message: err.message }, {});
    deps.logger.info({ extractId, problem: err.code }, 'extract validated with a whole-file problem');
  }
}

async function finish(ds: DataSource, extractId: number, problem: ProblemDto | null, result: Partial<Extract>): Promise<void> {
  await ds.getRepository(Extract).update(
    { id: extractId, status: 'validating' },
    {
      report: null,
      slots: null,
      rowsRead: null,
      rowsAccepted: null,
      rowsRejected: null,
      ...result,
      status: 'awaiting-decision',
      problemCode: problem?.code ?? null,
      problemMessage: problem?.message ?? null,
      progress: null,
    },
  );
}

async function saveRejectedRows(ds: DataSource, extractId: number, rows: RejectedRow[]): Promise<void> {
  const values = rows.map((r) => [extractId, r.line, r.column, r.code, r.reason.slice(0, 300), r.value]);
  await ds.query('INSERT INTO extract_rejected_row (extract_id, line, column_name, code, reason, value) VALUES ?', [values]);
}

/** The code of a cluster value's keyed hash, created the first time the program sees it. */
async function clusterCodeOf(ds: DataSource, programId: number, valueHash: Buffer): Promise<number> {
  await ds.query('INSERT IGNORE INTO cluster_code (program_id, value_hash) VALUES (?, ?)', [programId, valueHash]);
  const row = await ds.getRepository(ClusterCode).findOneByOrFail({ programId, valueHash });
  return row.id;
}

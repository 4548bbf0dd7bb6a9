import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Not } from 'typeorm';
import type { ExtractUploadResultDto } from '@shared/api/extracts';
import type { ExtractFormat, ExtractUploadFields } from '@shared/schemas/extract';
import { Extract } from '../entities/extract.entity';
import { SavedMapping } from '../entities/saved-mapping.entity';
import { AppError } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { findDataSource } from './data-sources.service';
import { getExtractDetail } from './extracts.service';
import { headerColumns, headerFingerprint } from './ingest/header';
import { ingestWorker } from './ingest/ingest-worker';
import { buildRowRules } from './ingest/mapping-rules';
import { cutoffOrThrow, programFacts } from './ingest/program-facts';
import { openTable } from './ingest/table-reader';
import type { IngestDeps } from './ingest/validate-extract';
import { ingestFiles } from './ingest/work-dir';

export interface ReceivedFile {
  /** Where the upload landed on disk (under var/ingest/incoming). */
  path: string;
  originalName: string;
}

/**
 * Takes an uploaded file for a program and month: refuses what cannot be an extract (wrong type,
 * empty, not UTF-8, broken header, no cutoff for the month) without storing anything, recognises
 * a file uploaded before by its SHA-256, reads the header and, when a saved mapping of the same
 * header exists, starts validation in the background. The file is moved into the extract's folder.
 * @throws AppError extract_format_unsupported | extract_empty | extract_encoding_invalid |
 *   extract_unreadable | extract_header_invalid | extract_sheet_not_found | extract_period_invalid | not_found
 */
export async function receiveExtract(
  deps: IngestDeps,
  programId: number,
  actor: AuditActor,
  file: ReceivedFile,
  fields: ExtractUploadFields,
): Promise<ExtractUploadResultDto> {
  const ds = deps.dataSource;
  try {
    const program = await programFacts(ds.manager, programId);
    cutoffOrThrow(program.schedule, fields.period);
    const source = fields.sourceId ? await findDataSource(ds.manager, programId, fields.sourceId) : null;
    const format = detectFormat(file);
    const sha256 = await sha256Of(file.path);
    const byteSize = fs.statSync(file.path).size;

    const previous = await ds.getRepository(Extract).findOne({ where: { programId, sha256, status: Not('rejected') }, order: { id: 'DESC' } });
    if (previous) return { extract: await getExtractDetail(deps, programId, previous.id), duplicate: true };

    const table = await openTable(file.path, format, { sheet: fields.sheet ?? null });
    await table.close();
    const columns = headerColumns(table.headerCells);
    const fingerprint = headerFingerprint(columns);
    const saved = await ds.getRepository(SavedMapping).find({
      where: { programId, headerFingerprint: fingerprint, ...(source ? { sourceId: source.id } : {}) },
      order: { savedAt: 'DESC' },
    });
    // Without a chosen source, a header saved under exactly one source identifies it.
    const sources = new Set(saved.map((m) => m.sourceId));
    const match = saved.length > 0 && sources.size === 1 ? saved[0]! : null;
    const mapping = match && !fields.reviewMapping && fitsProgram(match, columns, program, fields.period, format) ? match.mapping : null;

    const extract = await ds.transaction(async (tx) => {
      const repo = tx.getRepository(Extract);
      const created = await repo.save(
        repo.create({
          programId,
          sourceId: source?.id ?? match?.sourceId ?? null,
          period: fields.period,
          status: mapping ? 'validating' : 'uploaded',
          format,
          fileName: safeFileName(file.originalName, format),
          byteSize,
          sha256,
          sheet: table.sheet,
          delimiter: table.delimiter,
          columns,
          headerFingerprint: fingerprint,
          mapping,
          mappingOrigin: mapping ? 'saved' : null,
          uploadedByUserId: actor.userId,
          uploadedByLabel: actor.label,
        }),
      );
      await recordAudit(tx, {
        actor,
        action: 'extract.upload',
        programId,
        subjectType: 'extract',
        subjectId: created.id,
        details: { period: fields.period, sha256, byteSize, format, columns: columns.length, mappedAutomatically: mapping !== null },
      });
      return created;
    });
    const files = ingestFiles(deps);
    fs.mkdirSync(files.extractDir(extract.id), { recursive: true, mode: 0o700 });
    fs.renameSync(file.path, files.upload(extract.id, format));
    if (mapping) ingestWorker(deps).enqueue(extract.id);
    deps.logger.info({ extractId: extract.id, programId, byteSize, format, mappedAutomatically: mapping !== null }, 'extract uploaded');
    return { extract: await getExtractDetail(deps, programId, extract.id), duplicate: false };
  } finally {
    fs.rmSync(file.path, { force: true });
  }
}

/** A saved mapping still fits when its columns exist and the program's definitions have not changed since. */
function fitsProgram(saved: SavedMapping, columns: string[], program: Awaited<ReturnType<typeof programFacts>>, period: string, format: ExtractFormat): boolean {
  try {
    buildRowRules(saved.mapping, columns, program, period, format);
    return true;
  } catch {
    return false;
  }
}

/** CSV by name (.csv, .txt, .tsv), XLSX by name and by its zip signature. @throws AppError extract_format_unsupported | extract_unreadable */
function detectFormat(file: ReceivedFile): ExtractFormat {
  const ext = path.extname(file.originalName).toLowerCase();
  if (ext === '.csv' || ext === '.txt' || ext === '.tsv') return 'csv';
  if (ext === '.xlsx') {
    const head = Buffer.alloc(4);
    const fd = fs.openSync(file.path, 'r');
    const n = fs.readSync(fd, head, 0, 4, 0);
    fs.closeSync(fd);
    if (n === 0) throw new AppError('extract_empty', 'The file is empty. Export the month again and upload the new file.');
    if (head.readUInt32BE(0) === 0xd0cf11e0) {
      throw new AppError(
        'extract_unreadable',
        'This workbook is in the old .xls format or is password-protected. Save it as .xlsx without a password, or export CSV, and upload it again.',
      );
    }
    if (head.readUInt32BE(0) !== 0x504b0304) {
      throw new AppError('extract_unreadable', 'The file is named .xlsx but is not an Excel workbook. Save it again from the spreadsheet program, or export CSV.');
    }
    return 'xlsx';
  }
  if (ext === '.xls' || ext === '.xlsm' || ext === '.ods') {
    throw new AppError('extract_format_unsupported', `Cutline reads .xlsx workbooks and CSV files, not ${ext}. Save the file as .xlsx or CSV and upload it again.`);
  }
  throw new AppError('extract_format_unsupported', 'Cutline reads CSV files (.csv) and Excel workbooks (.xlsx). Export the extract in one of these and upload it again.');
}

async function sha256Of(file: string): Promise<string> {
  const hash = createHash('sha256');
  await pipeline(fs.createReadStream(file, { highWaterMark: 1024 * 1024 }), hash);
  return hash.digest('hex');
}

/** The base name, without folders or control characters, at most 200 characters. */
function safeFileName(name: string, format: ExtractFormat): string {
  // eslint-disable-next-line no-control-regex
  const base = path.basename(name.replace(/\\/g, '/')).replace(/[\u0000-\u001f\u007f]/g, '').trim();
  return (base || `extract.${format}`).slice(0, 200);
}

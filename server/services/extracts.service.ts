import fs from 'node:fs';
import type { DataSource } from 'typeorm';
import type { ErrorCode } from '@shared/errors';
import type { ExtractDetailDto, ExtractSummaryDto, RejectedRowDto } from '@shared/api/extracts';
import type { ListDto } from '@shared/api/programs';
import { guessMapping } from '@shared/ingest/guess-mapping';
import type { ExtractListQuery } from '@shared/schemas/extract';
import type { PageQuery } from '@shared/schemas/paging';
import { Extract } from '../entities/extract.entity';
import { ExtractRejectedRow } from '../entities/extract-rejected-row.entity';
import type { ExtractSource } from '../entities/extract-source.entity';
import { SavedMapping } from '../entities/saved-mapping.entity';
import { notFound } from '../lib/errors';
import { programFacts } from './ingest/program-facts';
import type { IngestDeps } from './ingest/validate-extract';
import { ingestFiles } from './ingest/work-dir';

/** An extract of the program. @throws not_found (also when it belongs to another program) */
export async function findExtract(ds: DataSource, programId: number, extractId: number): Promise<Extract> {
  const extract = await ds.getRepository(Extract).findOne({ where: { id: extractId, programId }, relations: { source: true } });
  if (!extract) throw notFound('Extract');
  return extract;
}

/** The program's extracts, newest upload first, optionally of one status or month. */
export async function listExtracts(ds: DataSource, programId: number, query: ExtractListQuery): Promise<ListDto<ExtractSummaryDto>> {
  const where = { programId, ...(query.status ? { status: query.status } : {}), ...(query.period ? { period: query.period } : {}) };
  const [rows, total] = await ds.getRepository(Extract).findAndCount({
    where,
    relations: { source: true },
    order: { uploadedAt: 'DESC', id: 'DESC' },
    skip: (query.page - 1) * query.pageSize,
    take: query.pageSize,
  });
  return { items: rows.map(toSummaryDto), total, page: query.page, pageSize: query.pageSize };
}

/** The extract with its report and what the analyst may do next. */
export async function getExtractDetail(deps: IngestDeps, programId: number, extractId: number): Promise<ExtractDetailDto> {
  const ds = deps.dataSource;
  const extract = await findExtract(ds, programId, extractId);
  const replaces =
    extract.status === 'accepted' || extract.status === 'superseded'
      ? null
      : await ds.getRepository(Extract).findOneBy({ programId, period: extract.period, status: 'accepted' });
  const uploadKept = fs.existsSync(ingestFiles(deps).upload(extract.id, extract.format));
  return {
    ...toSummaryDto(extract),
    sheet: extract.sheet,
    columns: extract.columns,
    headerFingerprint: extract.headerFingerprint,
    mapping: extract.mapping,
    mappingOrigin: extract.mappingOrigin,
    suggestedMapping: extract.status === 'uploaded' ? await suggestMapping(ds, extract) : null,
    report: extract.report,
    canAccept: extract.status === 'awaiting-decision' && extract.problemCode === null,
    canRemap: (extract.status === 'uploaded' || extract.status === 'awaiting-decision') && uploadKept,
    replaces: replaces && replaces.id !== extract.id
      ? { id: replaces.id, sha256: replaces.sha256, rowsAccepted: replaces.rowsAccepted, acceptedAt: replaces.acceptedAt?.toISOString() ?? null }
      : null,
    decisionNote: extract.decisionNote,
  };
}

/**
 * A starting point for the mapping form: the saved mapping of this header (of the chosen source, or
 * any source of the program), else the source's latest mapping where its columns still exist, else
 * a guess from the column names.
 */
async function suggestMapping(ds: DataSource, extract: Extract): Promise<ExtractDetailDto['suggestedMapping']> {
  if (extract.mapping) return extract.mapping;
  const repo = ds.getRepository(SavedMapping);
  const sameHeader = await repo.findOne({
    where: { programId: extract.programId, headerFingerprint: extract.headerFingerprint, ...(extract.sourceId ? { sourceId: extract.sourceId } : {}) },
    order: { savedAt: 'DESC' },
  });
  if (sameHeader) return sameHeader.mapping;
  const program = await programFacts(ds.manager, extract.programId);
  const guess = guessMapping(extract.columns, program.outcomes, program.covariates);
  if (!extract.sourceId) return guess;
  const latest = await repo.findOne({ where: { sourceId: extract.sourceId }, order: { savedAt: 'DESC' } });
  if (!latest) return guess;
  const has = new Set(extract.columns.map((c) => c.trim().toLowerCase()));
  const keep = (c: string | undefined) => (c && has.has(c.trim().toLowerCase()) ? c : undefined);
  const pick = (m: Record<string, string>) => Object.fromEntries(Object.entries(m).filter(([, c]) => keep(c)));
  const m = latest.mapping;
  return {
    ...guess,
    ...stripUndefined({
      subjectId: keep(m.subjectId),
      score: keep(m.score),
      takeUp: keep(m.takeUp),
      periodColumn: keep(m.periodColumn),
      applicationDate: keep(m.applicationDate),
      cluster: keep(m.cluster),
    }),
    takeUpValues: m.takeUpValues,
    dateFormat: m.dateFormat,
    decimalSeparator: m.decimalSeparator,
    outcomes: { ...guess.outcomes, ...pick(m.outcomes) },
    covariates: { ...guess.covariates, ...pick(m.covariates) },
  };
}

function stripUndefined<T extends Record<string, unknown>>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

export function toSummaryDto(e: Extract): ExtractSummaryDto {
  const source = e.source as ExtractSource | null | undefined;
  return {
    id: e.id,
    programId: e.programId,
    period: e.period,
    status: e.status,
    format: e.format,
    fileName: e.fileName,
    byteSize: e.byteSize,
    sha256: e.sha256,
    source: source ? { id: source.id, name: source.name } : null,
    uploaded: { at: e.uploadedAt.toISOString(), by: e.uploadedByLabel },
    decided: e.decidedAt ? { at: e.decidedAt.toISOString(), by: e.decidedByLabel ?? 'system' } : null,
    rowsRead: e.rowsRead,
    rowsAccepted: e.rowsAccepted,
    rowsRejected: e.rowsRejected,
    progress: e.progress,
    problem: e.problemCode ? { code: e.problemCode as ErrorCode, message: e.problemMessage ?? '' } : null,
    supersededById: e.supersededById,
    observationsPurgedAt: e.observationsPurgedAt?.toISOString() ?? null,
  };
}

/** One page of the rejected rows, in file order. */
export async function listRejectedRows(ds: DataSource, programId: number, extractId: number, page: PageQuery): Promise<ListDto<RejectedRowDto>> {
  await findExtract(ds, programId, extractId);
  const [rows, total] = await ds.getRepository(ExtractRejectedRow).findAndCount({
    where: { extractId },
    order: { line: 'ASC' },
    skip: (page.page - 1) * page.pageSize,
    take: page.pageSize,
  });
  return { items: rows.map(toRejectedDto), total, page: page.page, pageSize: page.pageSize };
}

function toRejectedDto(r: ExtractRejectedRow): RejectedRowDto {
  return { line: r.line, column: r.columnName, code: r.code as ErrorCode, reason: r.reason, value: r.value };
}

/**
 * Writes rejected.csv (line, column, code, reason, value) in batches by line, so a large report is
 * never held in memory. Cells that a spreadsheet would run as a formula are prefixed with '.
 */
export async function writeRejectedCsv(ds: DataSource, extractId: number, write: (chunk: string) => Promise<void>): Promise<void> {
  await write('\uFEFFline,column,code,reason,value\r\n');
  let after = 0;
  for (;;) {
    const rows = await ds
      .getRepository(ExtractRejectedRow)
      .createQueryBuilder('r')
      .where('r.extractId = :extractId AND r.line > :after', { extractId, after })
      .orderBy('r.line', 'ASC')
      .take(5000)
      .getMany();
    if (rows.length === 0) return;
    await write(rows.map((r) => [String(r.line), csvCell(r.columnName), r.code, csvCell(r.reason), csvCell(r.value)].join(',')).join('\r\n') + '\r\n');
    after = rows[rows.length - 1]!.line;
  }
}

function csvCell(value: string | null): string {
  if (value === null) return '';
  const safe = /^[=+\-@\t\r]/.test(value) && !/^[+-]?\d/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

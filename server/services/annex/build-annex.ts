import { PassThrough, type Writable } from 'node:stream';
import type { DataSource } from 'typeorm';
import { gatherAnnexContent, type AnnexContent, type AnnexRequest } from './annex-content';
import { binnedDataSheet } from './binned-data-sheet';
import { caveatsSheet } from './caveats-sheet';
import { coverSheet } from './cover-sheet';
import { dataDictionarySheet } from './data-dictionary-sheet';
import { diagnosticsSheet } from './diagnostics-sheet';
import { methodNotesSheet } from './method-notes-sheet';
import { summarySheet } from './summary-sheet';
import { writeSheets } from './write-sheets';

export const ANNEX_CONTENT_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Streams the annex workbook of gathered content to `output` (a response, a file, a buffer). */
export async function writeAnnex(content: AnnexContent, output: Writable): Promise<void> {
  const sheets = [coverSheet, summarySheet, diagnosticsSheet, binnedDataSheet, caveatsSheet, methodNotesSheet, dataDictionarySheet].map((build) => build(content));
  await writeSheets(output, { creator: content.request.generatedBy, created: content.request.generatedAt, title: `Technical annex: ${content.program.name}` }, sheets);
}

/** `cutline-annex-<program>-<cohort or "all">-<YYYYMMDD>.xlsx` */
export function annexFileName(content: AnnexContent): string {
  const which = content.request.scope.kind === 'cohort' ? content.request.scope.period : 'all';
  const day = content.request.generatedAt.toISOString().slice(0, 10).replaceAll('-', '');
  return `cutline-annex-${content.program.slug}-${which}-${day}.xlsx`;
}

/**
 * The annex as one buffer, for an e-mail attachment: the same content and workbook as the
 * download. The caller records its own audit event (e.g. with the e-mail it goes out with).
 * @throws no_primary_design | result_not_found when the program has nothing to annex yet
 */
export async function buildAnnexBuffer(ds: DataSource, programId: number, request: AnnexRequest): Promise<{ filename: string; content: Buffer; contentType: string }> {
  const content = await gatherAnnexContent(ds, programId, request);
  const chunks: Buffer[] = [];
  const sink = new PassThrough();
  sink.on('data', (chunk: Buffer) => chunks.push(chunk));
  const ended = new Promise<void>((resolve, reject) => {
    sink.on('end', resolve);
    sink.on('error', reject);
  });
  await writeAnnex(content, sink);
  await ended;
  return { filename: annexFileName(content), content: Buffer.concat(chunks), contentType: ANNEX_CONTENT_TYPE };
}

import type { DataSource } from 'typeorm';
import { AppError } from '../../lib/errors';
import { buildAnnexBuffer, ANNEX_CONTENT_TYPE } from './build-annex';

export interface AnnexAttachments {
  attachments: Array<{ filename: string; content: Buffer; contentType: string }>;
  /** Programs whose annex is attached (a program without results yet has none). */
  programIds: number[];
}

/**
 * The technical annex of each program, for a director's summary e-mail when they opted in
 * (`attachAnnex`): the same workbook an evaluator downloads, whole program. A program with no
 * design or no results yet is left out rather than failing the message.
 */
export async function annexAttachments(ds: DataSource, programIds: readonly number[], recipientName: string, now: Date): Promise<AnnexAttachments> {
  const out: AnnexAttachments = { attachments: [], programIds: [] };
  for (const programId of programIds) {
    try {
      const annex = await buildAnnexBuffer(ds, programId, { scope: { kind: 'program' }, generatedBy: `Cutline, summary e-mail for ${recipientName}`, generatedAt: now });
      out.attachments.push({ filename: annex.filename, content: annex.content, contentType: ANNEX_CONTENT_TYPE });
      out.programIds.push(programId);
    } catch (err) {
      if (err instanceof AppError && (err.code === 'no_primary_design' || err.code === 'result_not_found')) continue;
      throw err;
    }
  }
  return out;
}

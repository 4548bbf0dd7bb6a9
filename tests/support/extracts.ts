import type request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { DataSource } from 'typeorm';
import type { ExtractDetailDto, ExtractUploadResultDto } from '@shared/api/extracts';
import { EXTRACT_BUSY_STATUSES, type ColumnMappingInput } from '@shared/schemas/extract';

/** A signed-in supertest agent (tests/support/sign-in.ts), or any agent for refusal tests. */
export type Caller = TestAgent;

export interface UploadArgs {
  programId: number;
  content: string | Buffer;
  fileName?: string;
  period?: string;
  sourceId?: number;
  sheet?: string;
  reviewMapping?: boolean;
}

/** `POST /api/programs/:programId/extracts` with a file; returns the raw response. */
export function postExtract(caller: Caller, args: UploadArgs): request.Test {
  let req = caller.post(`/api/programs/${args.programId}/extracts`).field('period', args.period ?? '2025-04');
  if (args.sourceId !== undefined) req = req.field('sourceId', String(args.sourceId));
  if (args.sheet !== undefined) req = req.field('sheet', args.sheet);
  if (args.reviewMapping) req = req.field('reviewMapping', 'true');
  const buffer = typeof args.content === 'string' ? Buffer.from(args.content, 'utf8') : args.content;
  return req.attach('file', buffer, args.fileName ?? 'extract.csv');
}

/** Uploads and expects the upload to be taken (201, or 200 for a duplicate). */
export async function uploadExtract(caller: Caller, args: UploadArgs): Promise<ExtractUploadResultDto> {
  const res = await postExtract(caller, args);
  if (res.status !== 201 && res.status !== 200) throw new Error(`upload answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body as ExtractUploadResultDto;
}

/** Polls the extract (as the client does) until background work on it has finished. */
export async function settledExtract(caller: Caller, programId: number, extractId: number): Promise<ExtractDetailDto> {
  for (;;) {
    const res = await caller.get(`/api/programs/${programId}/extracts/${extractId}`).expect(200);
    const body = res.body as ExtractDetailDto;
    if (!EXTRACT_BUSY_STATUSES.includes(body.status)) return body;
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** Maps an uploaded extract (creating a data source unless one is given) and waits for the report. */
export async function mapExtract(
  caller: Caller,
  programId: number,
  extractId: number,
  mapping: ColumnMappingInput,
  source: { sourceId: number } | { newSourceName: string } = { newSourceName: 'Test export' },
): Promise<ExtractDetailDto> {
  const res = await caller.put(`/api/programs/${programId}/extracts/${extractId}/mapping`).send({ ...source, mapping });
  if (res.status !== 200) throw new Error(`mapping answered ${res.status}: ${JSON.stringify(res.body)}`);
  return settledExtract(caller, programId, extractId);
}

/** Accepts and waits until the load has finished. */
export async function acceptAndSettle(caller: Caller, programId: number, extractId: number): Promise<ExtractDetailDto> {
  await caller.post(`/api/programs/${programId}/extracts/${extractId}/accept`).send({}).expect(200);
  return settledExtract(caller, programId, extractId);
}

/**
 * What "the database is unchanged" means for an extract test: the stored observations (count and
 * checksum), every extract that is or was visible, cohorts, and no staging table left behind.
 */
export async function visibleState(ds: DataSource): Promise<unknown> {
  const [observations] = await ds.query(
    'SELECT COUNT(*) AS n, COALESCE(BIT_XOR(CRC32(CONCAT_WS(",", extract_id, row_no, HEX(subject_hash), score, take_up))), 0) AS crc FROM observation',
  );
  const extracts = await ds.query("SELECT id, status, period, sha256, rows_accepted FROM extract WHERE status IN ('accepted', 'superseded', 'loading') ORDER BY id");
  const cohorts = await ds.query('SELECT program_id, period FROM cohort ORDER BY program_id, period');
  const stages = await ds.query("SELECT table_name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name LIKE 'observation\\_stage\\_%'");
  return { observations: { n: Number(observations.n), crc: String(observations.crc) }, extracts, cohorts, stages };
}

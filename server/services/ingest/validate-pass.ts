import fs from 'node:fs';
import { once } from 'node:events';
import type { ErrorCode } from '@shared/errors';
import type { EligibleSide } from '@shared/schemas/program';
import { isEligible } from '@shared/domain/cutoff-schedule';
import { collectGarbage } from '../../lib/collect-garbage';
import { cellPreview } from './cells';
import { pseudonym, pseudonymKey } from './pseudonym';
import { pseudonymsOnThread } from './pseudonym-thread';
import { checkRow, RowValues, type RowRules } from './row-checks';
import { SubjectIndex } from './subject-index';
import type { OpenedTable, TableRow } from './table-reader';

export interface RejectedRow {
  line: number;
  column: string | null;
  code: ErrorCode;
  reason: string;
  value: string | null;
}

export interface PassInput {
  table: OpenedTable;
  rules: RowRules;
  programId: number;
  cutoff: number;
  eligibleSide: EligibleSide;
  pseudonymKey: string;
  /** Path of clean chunk `n` (0-based). */
  chunkPath: (n: number) => string;
  rowsPerChunk: number;
  maxRows: number;
  /** Rejected rows beyond this many are counted but not kept. */
  keepRejected: number;
  saveRejected: (rows: RejectedRow[]) => Promise<void>;
  /** Integer code of a cluster value's keyed hash (created on first sight). */
  clusterCode: (hash: Buffer) => Promise<number>;
  progress: (bytesRead: number, totalBytes: number) => void;
}

export interface GroupCount {
  code: ErrorCode;
  column: string | null;
  reason: string;
  count: number;
  quoted: Map<string, number>;
}

export interface PassResult {
  rowsRead: number;
  rowsAccepted: number;
  rowsRejected: number;
  rejectedKept: number;
  groups: GroupCount[];
  duplicates: { count: number; firstLine: number; repeatsLine: number } | null;
  eligibleRows: number;
  ineligibleRows: number;
  takeUpOnes: number;
  takeUpRows: number;
  scoreMin: number;
  scoreMax: number;
  clusters: number;
  chunks: number;
  tooManyRows: boolean;
}

const NULL = '\\N';

/** A row that passed the checks, waiting for its pseudonym; `rest` is its outcome and covariate fields, tab-led. */
interface CheckedRow {
  line: number;
  subject: string;
  score: number;
  takeUp: 0 | 1 | null;
  cluster: string | null;
  rest: string;
}

interface PendingBatch {
  rows: CheckedRow[];
  /** Their pseudonyms, 32 bytes each, in order. */
  hashes: Promise<Buffer>;
}

/** Rows between two full garbage collections (`server/lib/collect-garbage.ts`). */
const ROWS_PER_COLLECTION = 100_000;

/**
 * One streaming pass over the file: checks every row, pseudonymises identifiers (HMAC, on a worker
 * thread one batch behind the checks), writes the accepted rows as tab-separated chunks ready for
 * `LOAD DATA` and hands rejected rows over in batches. Holds two batches of rows, the subject index
 * and the cluster codes in memory. Rejected rows are found in line order except that a duplicate
 * subject is found one batch late; they are stored by line.
 */
export async function runValidationPass(input: PassInput): Promise<PassResult> {
  const { rules, table } = input;
  const subjects = new SubjectIndex();
  const clusterCodes = new Map<string, number>();
  const groups = new Map<string, GroupCount>();
  let rejectedBatch: RejectedRow[] = [];
  const r: PassResult = {
    rowsRead: 0,
    rowsAccepted: 0,
    rowsRejected: 0,
    rejectedKept: 0,
    groups: [],
    duplicates: null,
    eligibleRows: 0,
    ineligibleRows: 0,
    takeUpOnes: 0,
    takeUpRows: 0,
    scoreMin: Number.POSITIVE_INFINITY,
    scoreMax: Number.NEGATIVE_INFINITY,
    clusters: 0,
    chunks: 0,
    tooManyRows: false,
  };
  const writer = new ChunkWriter(input.chunkPath, input.rowsPerChunk);
  const key = pseudonymKey(input.pseudonymKey);
  const values = new RowValues(rules);
  let lastProgress = 0;

  /** Counts a rejected row; returns a promise only when a batch of kept rows must be saved. */
  const reject = (line: number, code: ErrorCode, column: string | null, reason: string, value: string | null, quoted?: string) => {
    r.rowsRejected++;
    const key = `${code}\u0000${column ?? ''}`;
    let group = groups.get(key);
    if (!group) groups.set(key, (group = { code, column, reason, count: 0, quoted: new Map() }));
    group.count++;
    if (quoted !== undefined && (group.quoted.size < 50 || group.quoted.has(quoted))) group.quoted.set(quoted, (group.quoted.get(quoted) ?? 0) + 1);
    if (r.rejectedKept < input.keepRejected) {
      r.rejectedKept++;
      rejectedBatch.push({ line, column, code, reason, value });
      if (rejectedBatch.length >= 1000) {
        const batch = rejectedBatch;
        rejectedBatch = [];
        return input.saveRejected(batch);
      }
    }
    return undefined;
  };

  /** Checks one row; one that passes waits in `checked` for its pseudonym. Returns a promise only when it must wait. */
  const check = (row: TableRow, checked: CheckedRow[]): Promise<void> | undefined => {
    const bad = checkRow(rules, row.cells, values);
    if (bad) return reject(row.line, bad.code, bad.column, bad.reason, bad.cell === null ? null : cellPreview(bad.cell), bad.quoted);
    let rest = '';
    for (const v of values.outcomes) rest += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
    for (let i = 0; i < values.covariates.length; i++) {
      if (rules.covariates[i]!.column === null) continue;
      const v = values.covariates[i]!;
      rest += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
    }
    checked.push({ line: row.line, subject: values.subject, score: values.score, takeUp: values.takeUp, cluster: values.cluster, rest });
    return undefined;
  };

  /** Accepts a checked row with its pseudonym, in line order; returns a promise only when it must wait (a batch to save, a new cluster, a full buffer). */
  const accept = (row: CheckedRow, hash: Buffer): Promise<void> | undefined => {
    const firstLine = subjects.add(hash, row.line);
    if (firstLine !== 0) {
      if (!r.duplicates) r.duplicates = { count: 0, firstLine, repeatsLine: row.line };
      r.duplicates.count++;
      return reject(row.line, 'extract_duplicate_subject', rules.columns[rules.subjectId] ?? null, `The same subject already appears on line ${firstLine}.`, null);
    }
    r.rowsAccepted++;
    if (isEligible(row.score, input.cutoff, input.eligibleSide)) r.eligibleRows++;
    else r.ineligibleRows++;
    if (row.takeUp !== null) {
      r.takeUpRows++;
      r.takeUpOnes += row.takeUp;
    }
    if (row.score < r.scoreMin) r.scoreMin = row.score;
    if (row.score > r.scoreMax) r.scoreMax = row.score;
    const head = `${row.line}\t${hash.toString('hex')}\t${row.score}\t${row.takeUp ?? NULL}\t`;
    if (row.cluster === null) return writer.write(`${head}${NULL}${row.rest}\n`);
    const clusterHash = pseudonym(key, 'cluster', input.programId, row.cluster);
    const known = clusterCodes.get(clusterHash.toString('hex'));
    if (known !== undefined) return writer.write(`${head}${known}${row.rest}\n`);
    return input.clusterCode(clusterHash).then((code) => {
      clusterCodes.set(clusterHash.toString('hex'), code);
      return writer.write(`${head}${code}${row.rest}\n`);
    });
  };

  /** Accepts a checked batch once its pseudonyms have arrived. */
  const acceptBatch = async (batch: PendingBatch): Promise<void> => {
    const hashes = await batch.hashes;
    for (let i = 0; i < batch.rows.length; i++) {
      const waiting = accept(batch.rows[i]!, hashes.subarray(32 * i, 32 * i + 32));
      if (waiting) await waiting;
    }
  };

  // A batch's pseudonyms are computed on the worker thread while this one checks the next batch.
  let pending: PendingBatch | null = null;
  try {
    rows: for await (const batch of table.batches) {
      const now = Date.now();
      if (now - lastProgress > 250) {
        lastProgress = now;
        input.progress(table.bytesRead(), table.totalBytes);
      }
      const checked: CheckedRow[] = [];
      let full = false;
      for (const row of batch) {
        if (++r.rowsRead % ROWS_PER_COLLECTION === 0) collectGarbage();
        if (r.rowsRead > input.maxRows) {
          r.tooManyRows = full = true;
          break;
        }
        const waiting = check(row, checked);
        if (waiting) await waiting;
      }
      const hashes = pseudonymsOnThread(input.pseudonymKey, 'subject', input.programId, checked.map((c) => c.subject));
      // Awaited in turn below; a pass cut short by an error must not leave it unhandled.
      hashes.catch(() => undefined);
      if (pending) await acceptBatch(pending);
      pending = { rows: checked, hashes };
      if (full) break rows;
    }
    if (pending) await acceptBatch(pending);
    if (rejectedBatch.length > 0) await input.saveRejected(rejectedBatch);
    r.chunks = await writer.finish();
  } finally {
    writer.abort();
    await table.close();
  }
  input.progress(table.totalBytes, table.totalBytes);
  r.groups = [...groups.values()].sort((a, b) => b.count - a.count);
  r.clusters = clusterCodes.size;
  return r;
}

/** Writes text lines into numbered chunk files, with back-pressure. */
class ChunkWriter {
  private stream: fs.WriteStream | null = null;
  private chunk = -1;
  private rowsInChunk = 0;
  private buffer = '';

  constructor(
    private readonly pathOf: (n: number) => string,
    private readonly rowsPerChunk: number,
  ) {}

  /** Adds a line; returns a promise only when the caller must wait (new chunk or back-pressure). */
  write(line: string): Promise<void> | undefined {
    if (!this.stream || this.rowsInChunk >= this.rowsPerChunk) return this.next().then(() => this.append(line));
    return this.append(line);
  }

  private append(line: string): Promise<void> | undefined {
    this.buffer += line;
    this.rowsInChunk++;
    return this.buffer.length >= 256 * 1024 ? this.flush() : undefined;
  }

  /** @returns the number of chunk files written. */
  async finish(): Promise<number> {
    await this.close();
    return this.chunk + 1;
  }

  abort(): void {
    this.stream?.destroy();
    this.stream = null;
  }

  private async next(): Promise<void> {
    await this.close();
    this.chunk++;
    this.rowsInChunk = 0;
    this.stream = fs.createWriteStream(this.pathOf(this.chunk), { mode: 0o600 });
  }

  private async flush(): Promise<void> {
    if (!this.stream || this.buffer === '') return;
    const ok = this.stream.write(this.buffer);
    this.buffer = '';
    if (!ok) await once(this.stream, 'drain');
  }

  private async close(): Promise<void> {
    if (!this.stream) return;
    await this.flush();
    const stream = this.stream;
    this.stream = null;
    await new Promise<void>((resolve, reject) => stream.end((err?: Error | null) => (err ? reject(err) : resolve())));
  }
}

import fs from 'node:fs';
import { once } from 'node:events';
import type { ErrorCode } from '@shared/errors';
import type { EligibleSide } from '@shared/schemas/program';
import { isEligible } from '@shared/domain/cutoff-schedule';
import { collectGarbage } from '../../lib/collect-garbage';
import { cellPreview } from './cells';
import { pseudonym, pseudonymKey } from './pseudonym';
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

/** Rows between two full garbage collections (`server/lib/collect-garbage.ts`). */
const ROWS_PER_COLLECTION = 100_000;

/**
 * One streaming pass over the file: checks every row, pseudonymises identifiers (HMAC), writes the
 * accepted rows as tab-separated chunks ready for `LOAD DATA` and hands rejected rows over in
 * batches. Holds only the current row, the subject index and the cluster codes in memory.
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

  /** One row; returns a promise only when it must wait (a batch to save, a new cluster, a full buffer). */
  const handle = (row: TableRow): Promise<void> | undefined => {
    const bad = checkRow(rules, row.cells, values);
    if (bad) return reject(row.line, bad.code, bad.column, bad.reason, bad.cell === null ? null : cellPreview(bad.cell), bad.quoted);
    const checked = values;
    const hash = pseudonym(key, 'subject', input.programId, checked.subject);
    const firstLine = subjects.add(hash, row.line);
    if (firstLine !== 0) {
      if (!r.duplicates) r.duplicates = { count: 0, firstLine, repeatsLine: row.line };
      r.duplicates.count++;
      return reject(row.line, 'extract_duplicate_subject', rules.columns[rules.subjectId] ?? null, `The same subject already appears on line ${firstLine}.`, null);
    }
    r.rowsAccepted++;
    if (isEligible(checked.score, input.cutoff, input.eligibleSide)) r.eligibleRows++;
    else r.ineligibleRows++;
    if (checked.takeUp !== null) {
      r.takeUpRows++;
      r.takeUpOnes += checked.takeUp;
    }
    if (checked.score < r.scoreMin) r.scoreMin = checked.score;
    if (checked.score > r.scoreMax) r.scoreMax = checked.score;
    let rest = '';
    for (const v of checked.outcomes) rest += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
    for (let i = 0; i < checked.covariates.length; i++) {
      if (rules.covariates[i]!.column === null) continue;
      const v = checked.covariates[i]!;
      rest += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
    }
    const head = `${row.line}\t${hash.toString('hex')}\t${checked.score}\t${checked.takeUp ?? NULL}\t`;
    if (checked.cluster === null) return writer.write(`${head}${NULL}${rest}\n`);
    const clusterHash = pseudonym(key, 'cluster', input.programId, checked.cluster);
    const known = clusterCodes.get(clusterHash.toString('hex'));
    if (known !== undefined) return writer.write(`${head}${known}${rest}\n`);
    return input.clusterCode(clusterHash).then((code) => {
      clusterCodes.set(clusterHash.toString('hex'), code);
      return writer.write(`${head}${code}${rest}\n`);
    });
  };

  try {
    rows: for await (const batch of table.batches) {
      const now = Date.now();
      if (now - lastProgress > 250) {
        lastProgress = now;
        input.progress(table.bytesRead(), table.totalBytes);
      }
      for (const row of batch) {
        if (++r.rowsRead % ROWS_PER_COLLECTION === 0) collectGarbage();
        if (r.rowsRead > input.maxRows) {
          r.tooManyRows = true;
          break rows;
        }
        const waiting = handle(row);
        if (waiting) await waiting;
      }
    }
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

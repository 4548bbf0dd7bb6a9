import fs from 'node:fs';
import { once } from 'node:events';
import type { ErrorCode } from '@shared/errors';
import type { EligibleSide } from '@shared/schemas/program';
import { isEligible } from '@shared/domain/cutoff-schedule';
import { cellPreview } from './cells';
import { pseudonym } from './pseudonym';
import { checkRow, type RowRules } from './row-checks';
import { SubjectIndex } from './subject-index';
import type { OpenedTable } from './table-reader';

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
  let lastProgress = 0;

  const reject = async (line: number, code: ErrorCode, column: string | null, reason: string, value: string | null, quoted?: string) => {
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
        await input.saveRejected(rejectedBatch);
        rejectedBatch = [];
      }
    }
  };

  try {
    for await (const row of table.rows) {
      r.rowsRead++;
      if (r.rowsRead > input.maxRows) {
        r.tooManyRows = true;
        break;
      }
      if ((r.rowsRead & 4095) === 0) {
        const now = Date.now();
        if (now - lastProgress > 250) {
          lastProgress = now;
          input.progress(table.bytesRead(), table.totalBytes);
        }
      }
      const checked = checkRow(rules, row.cells);
      if (!checked.ok) {
        await reject(row.line, checked.code, checked.column, checked.reason, checked.cell === null ? null : cellPreview(checked.cell), checked.quoted);
        continue;
      }
      const hash = pseudonym(input.pseudonymKey, 'subject', input.programId, checked.subject);
      const firstLine = subjects.add(hash, row.line);
      if (firstLine !== 0) {
        if (!r.duplicates) r.duplicates = { count: 0, firstLine, repeatsLine: row.line };
        r.duplicates.count++;
        await reject(row.line, 'extract_duplicate_subject', rules.columns[rules.subjectId] ?? null, `The same subject already appears on line ${firstLine}.`, null);
        continue;
      }
      let cluster: number | null = null;
      if (checked.cluster !== null) {
        const clusterHash = pseudonym(input.pseudonymKey, 'cluster', input.programId, checked.cluster);
        const hex = clusterHash.toString('hex');
        cluster = clusterCodes.get(hex) ?? null;
        if (cluster === null) {
          cluster = await input.clusterCode(clusterHash);
          clusterCodes.set(hex, cluster);
        }
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
      let line = `${row.line}\t${hash.toString('hex')}\t${checked.score}\t${checked.takeUp ?? NULL}\t${cluster ?? NULL}`;
      for (const v of checked.outcomes) line += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
      for (const [i, v] of checked.covariates.entries()) if (rules.covariates[i]!.column !== null) line += Number.isNaN(v) ? `\t${NULL}` : `\t${v}`;
      await writer.write(`${line}\n`);
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

  async write(line: string): Promise<void> {
    if (!this.stream || this.rowsInChunk >= this.rowsPerChunk) await this.next();
    this.buffer += line;
    this.rowsInChunk++;
    if (this.buffer.length >= 256 * 1024) await this.flush();
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

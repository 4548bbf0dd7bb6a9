import { sortOrder } from './sort-order';
import type { EligibleSide } from './types';

/** Side index used in every per-side array: 0 = ineligible (t < 0), 1 = eligible (t ≥ 0). */
export type SideIndex = 0 | 1;
export const INELIGIBLE: SideIndex = 0;
export const ELIGIBLE: SideIndex = 1;
/** Sign of a side in a jump (eligible minus ineligible). */
export const SIDE_SIGN = [-1, 1] as const;

/**
 * Observations in the engine's own coordinates: t = score − cutoff when the eligible side is at or
 * above the cutoff, cutoff − score when it is at or below. So t ≥ 0 ⇔ eligible whatever the
 * program's convention, and every fit deals with one orientation only. Distances and bandwidths
 * keep score units.
 *
 * Entries are grouped by side (ineligible first), so loops run per side without a data-dependent
 * branch, in one of three layouts that keep windowed passes short:
 * - `sorted`: every observation, t ascending; a window |t| ≤ h is an index range found by binary
 *   search. Needed by the nearest-neighbour variance.
 * - `bucketed`: every observation, each side cut into `BUCKETS` equal-width bins of |t| and ordered
 *   by bin (a counting sort: two passes, no comparisons); a window is the range of the bins it
 *   touches. Enough for every bandwidth rule.
 * - `compact`: only the observations inside one window, for estimates at a given bandwidth.
 * In every layout callers still weight each entry; ranges only bound the work.
 */
export interface OrientedData {
  /** Oriented centred score, score units. */
  t: Float64Array;
  /** Outcome columns fitted together on the same design (e.g. [outcome, takeUp]). */
  columns: readonly Float64Array[];
  /** Dense cluster codes 0…clusterCount−1, or null. */
  cluster: Int32Array | null;
  clusterCount: number;
  /** Entries in the arrays. */
  n: number;
  /** Index of the first eligible entry: ineligible entries are [0, split), eligible [split, n). */
  split: number;
  layout: 'sorted' | 'bucketed' | 'compact';
  /** Whether the arrays hold every observation (false for a compact window copy). */
  complete: boolean;
  /** Bucketed layout: start index of each bin, ineligible bins then eligible bins, plus the end (2·BUCKETS + 1). */
  bucketStarts: Int32Array | null;
  /** Observations per side in the whole data, indexed by `SideIndex`. */
  sideCounts: [number, number];
  /** Largest |t| per side in the whole data (0 when a side is empty; the window for a compact copy), score units. */
  sideRanges: [number, number];
}

/** Bins per side of the bucketed layout: windows then overrun by at most one bin's worth of rows. */
export const BUCKETS = 256;

/** Raw columns after type and length checks. */
export interface RawColumns {
  score: Float64Array;
  columns: readonly Float64Array[];
  cluster: Int32Array | null;
}

/**
 * Checks every value (finite; column `takeUpColumn`, when given, 0 or 1), orients the score and
 * counts each side in one pass; then lays the data out: `window` given ⇒ a compact copy of the
 * rows with |t| ≤ window; otherwise `sorted` or `bucketed` (see `OrientedData`).
 *
 * Every pass is branch-free per row (x − x is 0 only for finite x, d·(1 − d) only for d ∈ {0, 1};
 * rows outside the window go to a spare slot): with rows in random order a data-dependent branch
 * mispredicts and costs more than the arithmetic. A failed check reruns a slow pass for the message.
 * @throws RangeError naming `fn` and the first bad entry.
 */
export function prepareData(
  fn: string,
  raw: RawColumns,
  cutoff: number,
  eligibleSide: EligibleSide,
  takeUpColumn: number | null,
  window: number | null,
  layout: 'sorted' | 'bucketed' = 'sorted',
): OrientedData {
  const { score, columns, cluster } = raw;
  const n = score.length;
  const above = eligibleSide === 'at-or-above';
  const sign = above ? 1 : -1;
  const shift = above ? -cutoff : cutoff;
  const limit = window ?? Infinity;
  const keep = window === null;
  const t = keep ? new Float64Array(n) : null;
  const y = columns[0];
  const d = columns[1];
  const dBinary = takeUpColumn === 1 ? 1 : 0;
  let bad = 0;
  let n1 = 0;
  let in0 = 0;
  let in1 = 0;
  for (let i = 0; i < n; i++) {
    const x = score[i]!;
    const v = sign * x + shift + 0; // "+ 0" turns −0 into +0: a score at the cutoff is eligible
    if (t) t[i] = v;
    const e = +(v >= 0);
    const inside = +(Math.abs(v) <= limit);
    n1 += e;
    in1 += inside * e;
    in0 += inside * (1 - e);
    bad += x - x;
    if (y) bad += y[i]! - y[i]!;
    if (d) {
      const di = d[i]!;
      bad += dBinary * Math.abs(di * (1 - di)) + (1 - dBinary) * (di - di);
    }
  }
  for (let c = 2; c < columns.length; c++) {
    const column = columns[c]!;
    for (let i = 0; i < n; i++) bad += column[i]! - column[i]!;
  }
  if (bad !== 0) throw firstBadValue(fn, score, columns, takeUpColumn);
  const sideCounts: [number, number] = [n - n1, n1];
  if (t) {
    if (layout === 'bucketed') return bucketed(t, columns, cluster, n1, sideCounts);
    const order = sortOrder(t);
    const st = gather(t, order);
    const cols = columns.map((col) => gather(col, order));
    const dense = cluster ? densifyCodes(gatherInt(cluster, order)) : null;
    const split = n - n1;
    const sideRanges: [number, number] = [split > 0 ? -st[0]! : 0, n1 > 0 ? st[n - 1]! : 0];
    return {
      t: st,
      columns: cols,
      cluster: dense?.codes ?? null,
      clusterCount: dense?.count ?? 0,
      n,
      split,
      layout: 'sorted',
      complete: true,
      bucketStarts: null,
      sideCounts,
      sideRanges,
    };
  }
  // Compact copy: row i goes to the next slot of its side, or to the spare slot `size` when outside.
  const size = in0 + in1;
  const ct = new Float64Array(size + 1);
  const cols = columns.map(() => new Float64Array(size + 1));
  const labels = cluster ? new Int32Array(size + 1) : null;
  let j0 = 0;
  let j1 = in0;
  for (let i = 0; i < n; i++) {
    const v = sign * score[i]! + shift + 0;
    const e = +(v >= 0);
    const inside = +(Math.abs(v) <= limit);
    const j = size + inside * (j0 + e * (j1 - j0) - size);
    ct[j] = v;
    for (let c = 0; c < cols.length; c++) cols[c]![j] = columns[c]![i]!;
    if (labels && cluster) labels[j] = cluster[i]!;
    j0 += inside * (1 - e);
    j1 += inside * e;
  }
  const dense = labels ? densifyCodes(labels.subarray(0, size)) : null;
  return {
    t: ct.subarray(0, size),
    columns: cols.map((col) => col.subarray(0, size)),
    cluster: dense?.codes ?? null,
    clusterCount: dense?.count ?? 0,
    n: size,
    split: in0,
    layout: 'compact',
    complete: false,
    bucketStarts: null,
    sideCounts,
    sideRanges: [limit, limit],
  };
}

/** Same observations, other outcome columns (e.g. a pseudo-outcome for bandwidth selection). */
export function withColumns(data: OrientedData, columns: readonly Float64Array[]): OrientedData {
  return { ...data, columns };
}

/**
 * Index range [lo, hi) of one side holding every entry with |t| ≤ h on that side: a binary search
 * in the sorted layout, the bins up to h in the bucketed one, the whole side otherwise.
 */
export function sideRange(data: OrientedData, side: SideIndex, h: number): [number, number] {
  const { layout, split, n } = data;
  if (layout === 'sorted') return side === INELIGIBLE ? [lowerBound(data.t, -h), split] : [split, upperBound(data.t, h)];
  if (layout === 'bucketed' && data.bucketStarts) {
    const range = data.sideRanges[side];
    // One bin of margin: the bin of a row at exactly |t| = h may round up by one.
    const last = range > 0 ? Math.min(BUCKETS - 1, Math.floor((h / range) * BUCKETS) + 1) : BUCKETS - 1;
    const starts = data.bucketStarts;
    return side === INELIGIBLE ? [0, starts[last + 1]!] : [split, starts[BUCKETS + last + 1]!];
  }
  return side === INELIGIBLE ? [0, split] : [split, n];
}

/**
 * Counting sort into `BUCKETS` bins of |t| per side (bin 0 nearest the cutoff), ineligible side
 * first: one pass to count, one to scatter every column straight to its place (few enough bins
 * that the write positions stay in cache). Order inside a bin is input order.
 */
function bucketed(t: Float64Array, columns: readonly Float64Array[], cluster: Int32Array | null, n1: number, sideCounts: [number, number]): OrientedData {
  const n = t.length;
  let r0 = 0;
  let r1 = 0;
  for (let i = 0; i < n; i++) {
    const v = t[i]!;
    if (v > r1) r1 = v;
    if (-v > r0) r0 = -v;
  }
  // Bin of row i: side·BUCKETS + min(BUCKETS − 1, ⌊|t|·BUCKETS/range⌋).
  const scale0 = r0 > 0 ? BUCKETS / r0 : 0;
  const scale1 = r1 > 0 ? BUCKETS / r1 : 0;
  const top = BUCKETS - 1;
  const cursor = new Int32Array(2 * BUCKETS + 1);
  for (let i = 0; i < n; i++) {
    const v = t[i]!;
    const e = +(v >= 0);
    const b = e * BUCKETS + Math.min(top, (Math.abs(v) * (e * scale1 + (1 - e) * scale0)) | 0);
    cursor[b + 1]!++;
  }
  for (let b = 1; b <= 2 * BUCKETS; b++) cursor[b]! += cursor[b - 1]!;
  const starts = cursor.slice();
  const st = new Float64Array(n);
  const cols = columns.map(() => new Float64Array(n));
  const y0 = columns[0];
  const y1 = columns[1];
  const c0 = cols[0];
  const c1 = cols[1];
  const labels = cluster ? new Int32Array(n) : null;
  for (let i = 0; i < n; i++) {
    const v = t[i]!;
    const e = +(v >= 0);
    const b = e * BUCKETS + Math.min(top, (Math.abs(v) * (e * scale1 + (1 - e) * scale0)) | 0);
    const j = cursor[b]!++;
    st[j] = v;
    if (y0 && c0) c0[j] = y0[i]!;
    if (y1 && c1) c1[j] = y1[i]!;
    if (labels && cluster) labels[j] = cluster[i]!;
  }
  for (let c = 2; c < columns.length; c++) {
    const out = cols[c]!;
    const col = columns[c]!;
    cursor.set(starts);
    for (let i = 0; i < n; i++) {
      const v = t[i]!;
      const e = +(v >= 0);
      const b = e * BUCKETS + Math.min(top, (Math.abs(v) * (e * scale1 + (1 - e) * scale0)) | 0);
      out[cursor[b]!++] = col[i]!;
    }
  }
  const dense = labels ? densifyCodes(labels) : null;
  return {
    t: st,
    columns: cols,
    cluster: dense?.codes ?? null,
    clusterCount: dense?.count ?? 0,
    n,
    split: n - n1,
    layout: 'bucketed',
    complete: true,
    bucketStarts: starts,
    sideCounts,
    sideRanges: [r0, r1],
  };
}

/** First index with t[i] ≥ value. */
function lowerBound(t: Float64Array, value: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with t[i] > value. */
function upperBound(t: Float64Array, value: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid]! <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function firstBadValue(fn: string, score: Float64Array, columns: readonly Float64Array[], takeUpColumn: number | null): RangeError {
  for (let i = 0; i < score.length; i++) {
    if (!Number.isFinite(score[i]!)) return new RangeError(`${fn}: data.score[${i}] is not a finite number`);
  }
  for (let c = 0; c < columns.length; c++) {
    const column = columns[c]!;
    for (let i = 0; i < column.length; i++) {
      const v = column[i]!;
      if (c === takeUpColumn) {
        if (v !== 0 && v !== 1) return new RangeError(`${fn}: data.takeUp[${i}] is ${v}; take-up must be 0 or 1`);
      } else if (!Number.isFinite(v)) {
        return new RangeError(`${fn}: data.${c === 0 ? 'outcome' : `column ${c}`}[${i}] is not a finite number`);
      }
    }
  }
  return new RangeError(`${fn}: data contain a value that is not a finite number`);
}

function gather(values: Float64Array, order: Uint32Array): Float64Array {
  const out = new Float64Array(order.length);
  for (let i = 0; i < order.length; i++) out[i] = values[order[i]!]!;
  return out;
}

function gatherInt(values: Int32Array, order: Uint32Array): Int32Array {
  const out = new Int32Array(order.length);
  for (let i = 0; i < order.length; i++) out[i] = values[order[i]!]!;
  return out;
}

/** Maps arbitrary int32 labels to 0…G−1 in order of first appearance. */
function densifyCodes(labels: Int32Array): { codes: Int32Array; count: number } {
  const codes = new Int32Array(labels.length);
  let min = 0;
  let max = 0;
  for (let i = 0; i < labels.length; i++) {
    const v = labels[i]!;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (min >= 0 && max < 4 * labels.length + 1024) {
    // Small non-negative labels: a lookup table instead of a Map.
    const table = new Int32Array(max + 1).fill(-1);
    let count = 0;
    for (let i = 0; i < labels.length; i++) {
      const v = labels[i]!;
      let code = table[v]!;
      if (code < 0) code = table[v] = count++;
      codes[i] = code;
    }
    return { codes, count };
  }
  const index = new Map<number, number>();
  for (let i = 0; i < labels.length; i++) {
    const label = labels[i]!;
    let code = index.get(label);
    if (code === undefined) {
      code = index.size;
      index.set(label, code);
    }
    codes[i] = code;
  }
  return { codes, count: index.size };
}

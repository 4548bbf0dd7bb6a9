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
 * Entries are grouped by side, so loops run per side without a data-dependent branch. Two layouts
 * keep passes short: `sorted` (t ascending, every observation), where any window |t| ≤ h is a
 * contiguous index range found by binary search; or a compact copy of only the observations inside
 * one window (`complete` false), for estimates at a given bandwidth.
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
  /** Whether t is ascending (otherwise only grouped by side). */
  sorted: boolean;
  /** Whether the arrays hold every observation (false for a compact window copy). */
  complete: boolean;
  /** Observations per side in the whole data, indexed by `SideIndex`. */
  sideCounts: [number, number];
  /** Largest |t| per side in the whole data (0 when a side is empty; the window for a compact copy), score units. */
  sideRanges: [number, number];
}

/** Raw columns after type and length checks. */
export interface RawColumns {
  score: Float64Array;
  columns: readonly Float64Array[];
  cluster: Int32Array | null;
}

/**
 * Checks every value (finite; column `takeUpColumn`, when given, 0 or 1), orients the score and
 * counts each side in one pass; then either sorts every observation by t (`window` null) or, in a
 * second pass, copies out only those with |t| ≤ window, ineligible ones first.
 *
 * Both passes are branch-free per row (x − x is 0 only for finite x, d·(1 − d) only for d ∈ {0, 1};
 * rows outside the window are written to a spare slot): with rows in random order a data-dependent
 * branch mispredicts and costs more than the arithmetic. A failed check reruns a slow pass for the
 * message.
 * @throws RangeError naming `fn` and the first bad entry.
 */
export function prepareData(
  fn: string,
  raw: RawColumns,
  cutoff: number,
  eligibleSide: EligibleSide,
  takeUpColumn: number | null,
  window: number | null,
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
    const order = sortOrder(t);
    const st = gather(t, order);
    const cols = columns.map((col) => gather(col, order));
    const dense = cluster ? densifyCodes(gatherInt(cluster, order)) : null;
    const split = n - n1;
    const sideRanges: [number, number] = [split > 0 ? -st[0]! : 0, n1 > 0 ? st[n - 1]! : 0];
    return { t: st, columns: cols, cluster: dense?.codes ?? null, clusterCount: dense?.count ?? 0, n, split, sorted: true, complete: true, sideCounts, sideRanges };
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
    sorted: false,
    complete: false,
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
 * on sorted data, the whole side otherwise. Callers still weight (or test) entries inside it.
 */
export function sideRange(data: OrientedData, side: SideIndex, h: number): [number, number] {
  if (side === INELIGIBLE) return [data.sorted ? lowerBound(data.t, -h) : 0, data.split];
  return [data.split, data.sorted ? upperBound(data.t, h) : data.n];
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

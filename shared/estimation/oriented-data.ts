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
 * The checking pass is branch-free per row (x − x is 0 only for finite x, d·(1 − d) only for
 * d ∈ {0, 1}): with rows in random order a data-dependent branch mispredicts and costs more than
 * the arithmetic. A failed check reruns a slow pass for the message.
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
  // Hot loops live in small functions of numbers and typed arrays only, each with one
  // configuration: V8 then optimises each whole and never deoptimises on the next call.
  const counts = new Float64Array(4);
  const y = columns[0] ?? score;
  const d = columns[1] ?? score;
  const dBinary = takeUpColumn === 1 ? 1 : 0;
  if (!keep && columns.length <= 2 && !cluster) return compactInOnePass(fn, raw, sign, shift, limit, dBinary);
  const t = keep ? new Float64Array(n) : null;
  if (t) scanRowsWritingT(score, y, d, columns.length, dBinary, sign, shift, t, counts);
  else scanRows(score, y, d, columns.length, dBinary, sign, shift, limit, counts);
  let bad = counts[0]!;
  for (let c = 2; c < columns.length; c++) bad += finiteCheck(columns[c]!);
  if (bad !== 0) throw firstBadValue(fn, score, columns, takeUpColumn);
  const n1 = counts[1]!;
  const in0 = counts[2]!;
  const in1 = counts[3]!;
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
  // Compact copy of the rows inside the window, ineligible rows first.
  const size = in0 + in1;
  const ct = new Float64Array(size);
  let cols: Float64Array[];
  let dense: { codes: Int32Array; count: number } | null = null;
  if (columns.length <= 2 && !cluster) {
    const cy = new Float64Array(columns.length > 0 ? size : 0);
    const cd = new Float64Array(columns.length > 1 ? size : 0);
    compactRows(score, y, d, columns.length, sign, shift, limit, in0, ct, cy, cd);
    cols = [cy, cd].slice(0, columns.length);
  } else {
    const slot = new Int32Array(n);
    compactSlots(score, sign, shift, limit, in0, ct, slot);
    cols = columns.map((col) => scatterInto(col, slot, size));
    dense = cluster ? densifyCodes(scatterIntInto(cluster, slot, size)) : null;
  }
  return {
    t: ct,
    columns: cols,
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

/**
 * The first pass of the compact layout: orients each score, counts the eligible side and the rows
 * inside the window per side, and sums check values that are 0 only for valid data (x − x for
 * finite x, |d·(1 − d)| for d ∈ {0, 1}). out = [bad, n eligible, inside ineligible, inside eligible].
 */
function scanRows(
  score: Float64Array,
  y: Float64Array,
  d: Float64Array,
  columnCount: number,
  dBinary: number,
  sign: number,
  shift: number,
  limit: number,
  out: Float64Array,
): void {
  const n = score.length;
  const hasY = columnCount > 0 ? 1 : 0;
  const hasD = columnCount > 1 ? 1 : 0;
  let bad = 0;
  let n1 = 0;
  let inside = 0;
  let in1 = 0;
  for (let i = 0; i < n; i++) {
    const x = score[i]!;
    const v = sign * x + shift + 0; // "+ 0" turns −0 into +0: a score at the cutoff is eligible
    const e = +(v >= 0);
    const k = +(Math.abs(v) <= limit);
    n1 += e;
    inside += k;
    in1 += k * e;
    const yi = y[i]!;
    const di = d[i]!;
    bad += x - x + hasY * (yi - yi) + hasD * (dBinary * Math.abs(di * (1 - di)) + (1 - dBinary) * (di - di));
  }
  out[0] = bad;
  out[1] = n1;
  out[2] = inside - in1;
  out[3] = in1;
}

/** The same checks and count for the layouts that keep every row, writing t as it goes. */
function scanRowsWritingT(
  score: Float64Array,
  y: Float64Array,
  d: Float64Array,
  columnCount: number,
  dBinary: number,
  sign: number,
  shift: number,
  t: Float64Array,
  out: Float64Array,
): void {
  const n = score.length;
  const hasY = columnCount > 0 ? 1 : 0;
  const hasD = columnCount > 1 ? 1 : 0;
  let bad = 0;
  let n1 = 0;
  for (let i = 0; i < n; i++) {
    const x = score[i]!;
    const v = sign * x + shift + 0;
    t[i] = v;
    n1 += +(v >= 0);
    const yi = y[i]!;
    const di = d[i]!;
    bad += x - x + hasY * (yi - yi) + hasD * (dBinary * Math.abs(di * (1 - di)) + (1 - dBinary) * (di - di));
  }
  out[0] = bad;
  out[1] = n1;
  out[2] = n - n1;
  out[3] = n1;
}

/**
 * The compact layout in one pass (up to two columns, no clusters): checks every row as `scanRows`
 * does and copies the rows inside the window, ineligible ones from the front of full-length
 * buffers and eligible ones from the back, then moves the eligible block next to the other. The
 * buffers' untouched pages are never written (the allocator hands out zero pages lazily), so the
 * only cost of their length is address space.
 */
function compactInOnePass(fn: string, raw: RawColumns, sign: number, shift: number, limit: number, dBinary: number): OrientedData {
  const { score, columns } = raw;
  const n = score.length;
  const cols = columns.length;
  const ct = new Float64Array(n);
  const cy = new Float64Array(cols > 0 ? n : 0);
  const cd = new Float64Array(cols > 1 ? n : 0);
  const counts = new Float64Array(4);
  scanAndCopy(score, columns[0] ?? score, columns[1] ?? score, cols, dBinary, sign, shift, limit, ct, cy, cd, counts);
  if (counts[0] !== 0) throw firstBadValue(fn, score, columns, dBinary ? 1 : null);
  const n1 = counts[1]!;
  const in0 = counts[2]!;
  const in1 = counts[3]!;
  const size = in0 + in1;
  const pack = (buffer: Float64Array) => {
    buffer.copyWithin(in0, n - in1, n);
    return buffer.subarray(0, size);
  };
  return {
    t: pack(ct),
    columns: [pack(cy), pack(cd)].slice(0, cols),
    cluster: null,
    clusterCount: 0,
    n: size,
    split: in0,
    layout: 'compact',
    complete: false,
    bucketStarts: null,
    sideCounts: [n - n1, n1],
    sideRanges: [limit, limit],
  };
}

/**
 * The loop of `compactInOnePass`: out = [bad, n eligible, inside ineligible, inside eligible]; rows
 * inside go to ct/cy/cd at the next front slot (ineligible) or the next back slot (eligible).
 * Skipping outside rows is a predictable branch (the window is usually a small or a large share).
 */
function scanAndCopy(
  score: Float64Array,
  y: Float64Array,
  d: Float64Array,
  columnCount: number,
  dBinary: number,
  sign: number,
  shift: number,
  limit: number,
  ct: Float64Array,
  cy: Float64Array,
  cd: Float64Array,
  out: Float64Array,
): void {
  const n = score.length;
  const hasY = columnCount > 0 ? 1 : 0;
  const hasD = columnCount > 1 ? 1 : 0;
  let bad = 0;
  let n1 = 0;
  let front = 0;
  let back = n - 1;
  for (let i = 0; i < n; i++) {
    const x = score[i]!;
    const v = sign * x + shift + 0; // "+ 0" turns −0 into +0: a score at the cutoff is eligible
    const e = +(v >= 0);
    n1 += e;
    const yi = y[i]!;
    const di = d[i]!;
    bad += x - x + hasY * (yi - yi) + hasD * (dBinary * Math.abs(di * (1 - di)) + (1 - dBinary) * (di - di));
    if (!(Math.abs(v) <= limit)) continue;
    const j = front + e * (back - front);
    front += 1 - e;
    back -= e;
    ct[j] = v;
    if (hasY) cy[j] = yi;
    if (hasD) cd[j] = di;
  }
  out[0] = bad;
  out[1] = n1;
  out[2] = front;
  out[3] = n - 1 - back;
}

/** Σ (x − x): 0 when every value is finite. */
function finiteCheck(values: Float64Array): number {
  let bad = 0;
  for (let i = 0; i < values.length; i++) bad += values[i]! - values[i]!;
  return bad;
}

/**
 * Second pass of the compact layout (up to two columns, no clusters): copies the rows inside the
 * window, ineligible rows from 0 and eligible ones from `in0`. Skipping outside rows is a branch,
 * but a predictable one (the window is usually a small or a large share); the side is arithmetic.
 */
function compactRows(
  score: Float64Array,
  y: Float64Array,
  d: Float64Array,
  columnCount: number,
  sign: number,
  shift: number,
  limit: number,
  in0: number,
  ct: Float64Array,
  cy: Float64Array,
  cd: Float64Array,
): void {
  let j0 = 0;
  let j1 = in0;
  const hasY = columnCount > 0;
  const hasD = columnCount > 1;
  for (let i = 0; i < score.length; i++) {
    const v = sign * score[i]! + shift + 0;
    if (!(Math.abs(v) <= limit)) continue;
    const e = +(v >= 0);
    const j = j0 + e * (j1 - j0);
    j0 += 1 - e;
    j1 += e;
    ct[j] = v;
    if (hasY) cy[j] = y[i]!;
    if (hasD) cd[j] = d[i]!;
  }
}

/** The general second pass: slot[i] is row i's place, or −1 outside the window. */
function compactSlots(score: Float64Array, sign: number, shift: number, limit: number, in0: number, ct: Float64Array, slot: Int32Array): void {
  let j0 = 0;
  let j1 = in0;
  for (let i = 0; i < score.length; i++) {
    const v = sign * score[i]! + shift + 0;
    if (!(Math.abs(v) <= limit)) {
      slot[i] = -1;
      continue;
    }
    const e = +(v >= 0);
    const j = j0 + e * (j1 - j0);
    j0 += 1 - e;
    j1 += e;
    ct[j] = v;
    slot[i] = j;
  }
}

function scatterInto(values: Float64Array, slot: Int32Array, size: number): Float64Array {
  const out = new Float64Array(size);
  for (let i = 0; i < slot.length; i++) {
    const j = slot[i]!;
    if (j >= 0) out[j] = values[i]!;
  }
  return out;
}

function scatterIntInto(values: Int32Array, slot: Int32Array, size: number): Int32Array {
  const out = new Int32Array(size);
  for (let i = 0; i < slot.length; i++) {
    const j = slot[i]!;
    if (j >= 0) out[j] = values[i]!;
  }
  return out;
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
  const extremes = new Float64Array(2);
  sideExtremes(t, extremes);
  const [r0, r1] = extremes as unknown as [number, number];
  const bins = new Uint16Array(n);
  const starts = new Int32Array(2 * BUCKETS + 1);
  binRows(t, r0 > 0 ? BUCKETS / r0 : 0, r1 > 0 ? BUCKETS / r1 : 0, bins, starts);
  for (let b = 1; b <= 2 * BUCKETS; b++) starts[b]! += starts[b - 1]!;
  const cursor = new Int32Array(2 * BUCKETS + 1);
  // t and the first two columns in one scatter pass; any others (and clusters) one pass each.
  const st = new Float64Array(n);
  const cols = columns.map(() => new Float64Array(n));
  cursor.set(starts);
  scatterThreeByBin(t, columns[0] ?? t, columns[1] ?? t, bins, cursor, st, cols[0] ?? st, cols[1] ?? st);
  for (let c = 2; c < columns.length; c++) {
    cursor.set(starts);
    scatterByBin(columns[c]!, bins, cursor, cols[c]!);
  }
  let labels: Int32Array | null = null;
  if (cluster) {
    labels = new Int32Array(n);
    cursor.set(starts);
    scatterIntByBin(cluster, bins, cursor, labels);
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

/** out = [largest −t over t < 0, largest t over t ≥ 0] (0 for an empty side). */
function sideExtremes(t: Float64Array, out: Float64Array): void {
  let r0 = 0;
  let r1 = 0;
  for (let i = 0; i < t.length; i++) {
    const v = t[i]!;
    if (v > r1) r1 = v;
    if (-v > r0) r0 = -v;
  }
  out[0] = r0;
  out[1] = r1;
}

/** bins[i] = side·BUCKETS + min(BUCKETS − 1, ⌊|t|·BUCKETS/range⌋); counts[b + 1] counts bin b. */
function binRows(t: Float64Array, scale0: number, scale1: number, bins: Uint16Array, counts: Int32Array): void {
  const top = BUCKETS - 1;
  for (let i = 0; i < t.length; i++) {
    const v = t[i]!;
    const e = +(v >= 0);
    const b = e * BUCKETS + Math.min(top, (Math.abs(v) * (e * scale1 + (1 - e) * scale0)) | 0);
    bins[i] = b;
    counts[b + 1]!++;
  }
}

/** Scatters t and two columns by bin in one pass (when a column is absent its slot repeats t, harmlessly). */
function scatterThreeByBin(
  t: Float64Array,
  y: Float64Array,
  d: Float64Array,
  bins: Uint16Array,
  cursor: Int32Array,
  st: Float64Array,
  sy: Float64Array,
  sd: Float64Array,
): void {
  for (let i = 0; i < t.length; i++) {
    const j = cursor[bins[i]!]!++;
    st[j] = t[i]!;
    sy[j] = y[i]!;
    sd[j] = d[i]!;
  }
}

function scatterByBin(values: Float64Array, bins: Uint16Array, cursor: Int32Array, out: Float64Array): void {
  for (let i = 0; i < values.length; i++) out[cursor[bins[i]!]!++] = values[i]!;
}

function scatterIntByBin(values: Int32Array, bins: Uint16Array, cursor: Int32Array, out: Int32Array): void {
  for (let i = 0; i < values.length; i++) out[cursor[bins[i]!]!++] = values[i]!;
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

import type { EligibleSide } from '../schemas/program';
import { scoreAt } from './centred-score';
import { DiagnosticError } from './errors';
import { remember, type DiagnosticsMemo } from './memo';
import { fitPolynomial, polynomialDerivative, polynomialValue } from './polynomial-fit';

/** Order of the global polynomial used to estimate the mean's slope and the variance (METHODS §5a: order 4). */
const MEAN_ORDER = 4;
const VARIANCE_ORDER = 2;
/** Points at which the variance function is averaged over a side (evenly spaced bins). */
const VARIANCE_GRID = 64;

export type BinSpacing = 'evenly-spaced' | 'quantile-spaced';

/** IMSE-optimal number of bins on one side. */
export interface SideBinCount {
  /** Bins used: ⌈J*⌉, at least 1, at most the side's distinct scores. */
  count: number;
  /** The unrounded optimum J* = (2B/V)^(1/3) (0 when the mean is flat). */
  optimal: number;
}

export interface BinCounts {
  ineligible: SideBinCount;
  eligible: SideBinCount;
}

/** One bin of the chart, in score units. */
export interface BinnedMean {
  side: 'ineligible' | 'eligible';
  /** Bin edges (evenly spaced) or smallest/largest score in the bin (quantile-spaced). */
  scoreLow: number;
  scoreHigh: number;
  /** Mean score of the observations in the bin. */
  scoreMean: number;
  /** Mean of the variable in the bin. */
  mean: number;
  n: number;
}

export interface BinnedSeries {
  spacing: BinSpacing;
  counts: BinCounts;
  /** Bins of both sides, ordered by score. */
  bins: BinnedMean[];
}

interface SideData {
  /** |t|, distance from the cutoff (score units), ascending. */
  distance: Float64Array;
  y: Float64Array;
  /** Signed centred score of each entry (for reporting). */
  t: Float64Array;
}

/**
 * The IMSE-optimal number of bins of a binned-means chart on each side (Calonico, Cattaneo &
 * Titiunik 2015, JASA 110(512); the structure IMSE(J) ≈ B/J² + V·J is derived in METHODS §5a, the
 * constants are ours):
 * - evenly spaced, side length L: B = L²/12·E[μ'(X)²], V = ∫σ²(x)dx / (n_s·L), so
 *   J* = (2B/V)^(1/3) ∝ n^(1/3);
 * - quantile spaced (equal counts, bin width ≈ 1/(J·f(x))): B = E[μ'(X)²/f(X)²]/12, V = E[σ²(X)]/n_s.
 * μ' from a global quartic on the side, σ²(x) from a quadratic fitted to its squared residuals
 * (floored at a tenth of their mean), f from spacings of the sorted scores (m = √n_s apart).
 * @throws DiagnosticError when a side has fewer than 10 observations.
 */
export function optimalBinCounts(t: Float64Array, y: Float64Array, spacing: BinSpacing, memo?: DiagnosticsMemo): BinCounts {
  const [ineligible, eligible] = splitSides(t, y, memo);
  return { ineligible: sideBinCount(ineligible, spacing), eligible: sideBinCount(eligible, spacing) };
}

/**
 * Binned means for the chart with the IMSE-optimal count on each side (or the counts given).
 * Evenly spaced bins run from the cutoff to the side's extreme score; quantile-spaced bins hold
 * counts that differ by at most one. `memo` keeps the order of the scores between the charts of
 * the same scores (`runDiagnostics` draws eight).
 */
export function binnedMeans(
  t: Float64Array,
  y: Float64Array,
  spacing: BinSpacing,
  placement: { cutoff: number; eligibleSide: EligibleSide },
  counts?: BinCounts,
  memo?: DiagnosticsMemo,
): BinnedSeries {
  counts ??= optimalBinCounts(t, y, spacing, memo);
  const sides = splitSides(t, y, memo);
  const bins: BinnedMean[] = [];
  for (const s of [0, 1] as const) {
    const data = sides[s];
    const j = s === 0 ? counts.ineligible.count : counts.eligible.count;
    const label = s === 0 ? 'ineligible' : 'eligible';
    const groups = spacing === 'evenly-spaced' ? evenGroups(data, j) : quantileGroups(data, j);
    const sideBins = groups
      .filter((g) => g.n > 0)
      .map((g) => {
        const edges = [scoreAt(s === 0 ? -g.distanceLow : g.distanceLow, placement.cutoff, placement.eligibleSide), scoreAt(s === 0 ? -g.distanceHigh : g.distanceHigh, placement.cutoff, placement.eligibleSide)];
        return {
          side: label,
          scoreLow: Math.min(edges[0]!, edges[1]!),
          scoreHigh: Math.max(edges[0]!, edges[1]!),
          scoreMean: scoreAt(g.tSum / g.n, placement.cutoff, placement.eligibleSide),
          mean: g.ySum / g.n,
          n: g.n,
        } satisfies BinnedMean;
      });
    bins.push(...sideBins);
  }
  bins.sort((a, b) => a.scoreMean - b.scoreMean);
  return { spacing, counts, bins };
}

interface Group {
  distanceLow: number;
  distanceHigh: number;
  tSum: number;
  ySum: number;
  n: number;
}

function evenGroups(data: SideData, j: number): Group[] {
  const length = data.distance[data.distance.length - 1]!;
  const width = length / j;
  const groups: Group[] = Array.from({ length: j }, (_, k) => ({ distanceLow: k * width, distanceHigh: (k + 1) * width, tSum: 0, ySum: 0, n: 0 }));
  for (let i = 0; i < data.distance.length; i++) {
    const k = width > 0 ? Math.min(j - 1, Math.floor(data.distance[i]! / width)) : 0;
    const g = groups[k]!;
    g.tSum += data.t[i]!;
    g.ySum += data.y[i]!;
    g.n += 1;
  }
  return groups;
}

function quantileGroups(data: SideData, j: number): Group[] {
  const n = data.distance.length;
  const groups: Group[] = [];
  for (let k = 0; k < j; k++) {
    const lo = Math.floor((k * n) / j);
    const hi = Math.floor(((k + 1) * n) / j);
    let tSum = 0;
    let ySum = 0;
    for (let i = lo; i < hi; i++) {
      tSum += data.t[i]!;
      ySum += data.y[i]!;
    }
    groups.push({ distanceLow: data.distance[lo] ?? 0, distanceHigh: data.distance[Math.max(lo, hi - 1)] ?? 0, tSum, ySum, n: hi - lo });
  }
  return groups;
}

function sideBinCount(data: SideData, spacing: BinSpacing): SideBinCount {
  const n = data.distance.length;
  if (n < 10) throw new DiagnosticError('too_few_observations', 'The chart needs at least 10 observations on each side of the cutoff.');
  const length = data.distance[n - 1]!;
  let distinct = 1;
  for (let i = 1; i < n; i++) distinct += +(data.distance[i] !== data.distance[i - 1]);
  if (!(length > 0) || distinct < 2 || !varies(data.y)) return { count: 1, optimal: 0 };
  const meanFit = fitPolynomial(data.distance, data.y, null, Math.min(MEAN_ORDER, distinct - 1), length);
  if (!meanFit) return { count: 1, optimal: 0 };
  const residual2 = new Float64Array(n);
  let residualMean = 0;
  for (let i = 0; i < n; i++) {
    residual2[i] = (data.y[i]! - polynomialValue(meanFit, data.distance[i]!)) ** 2;
    residualMean += residual2[i]! / n;
  }
  const varianceFit = fitPolynomial(data.distance, residual2, null, Math.min(VARIANCE_ORDER, distinct - 1), length);
  const floor = residualMean / 10;
  const sigma2 = (x: number) => Math.max(floor, varianceFit ? polynomialValue(varianceFit, x) : residualMean);
  // A variable that is an exact polynomial of the score has no noise to average: one bin per value.
  if (!(residualMean > 0)) return { count: distinct, optimal: distinct };

  let optimal: number;
  if (spacing === 'evenly-spaced') {
    let slope2 = 0;
    for (let i = 0; i < n; i++) slope2 += polynomialDerivative(meanFit, data.distance[i]!, 1) ** 2 / n;
    let variance = 0;
    for (let g = 0; g < VARIANCE_GRID; g++) variance += sigma2(((g + 0.5) / VARIANCE_GRID) * length) / VARIANCE_GRID;
    const b = (length * length * slope2) / 12;
    const v = variance / n; // ∫σ²dx/(n·L) with ∫σ²dx = L·(mean of σ² over the side)
    optimal = Math.cbrt((2 * b) / v);
  } else {
    const m = Math.max(1, Math.ceil(Math.sqrt(n)));
    let bias = 0;
    let variance = 0;
    const minimumSpacing = length / n;
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - m);
      const hi = Math.min(n - 1, i + m);
      const density = (hi - lo) / n / Math.max(data.distance[hi]! - data.distance[lo]!, minimumSpacing * (hi - lo));
      bias += (polynomialDerivative(meanFit, data.distance[i]!, 1) / density) ** 2 / n;
      variance += sigma2(data.distance[i]!) / n;
    }
    optimal = Math.cbrt((2 * (bias / 12)) / (variance / n));
  }
  if (!Number.isFinite(optimal)) optimal = distinct;
  const count = Math.max(1, Math.min(Math.ceil(optimal), distinct));
  return { count, optimal };
}

/** Whether the values are not all the same. */
function varies(values: Float64Array): boolean {
  for (let i = 1; i < values.length; i++) if (values[i] !== values[0]) return true;
  return false;
}

/** Each side's data by distance from the cutoff, ascending. */
function splitSides(t: Float64Array, y: Float64Array, memo: DiagnosticsMemo | undefined): [SideData, SideData] {
  if (t.length !== y.length) throw new RangeError('binnedMeans: the score and the variable must have the same length');
  const { ineligible, eligible } = remember(memo, 'chart side order', [t], () => sideOrder(t));
  const make = (idx: Uint32Array): SideData => {
    const side = { distance: new Float64Array(idx.length), y: new Float64Array(idx.length), t: new Float64Array(idx.length) };
    for (let k = 0; k < idx.length; k++) {
      const i = idx[k]!;
      side.distance[k] = Math.abs(t[i]!);
      side.y[k] = y[i]!;
      side.t[k] = t[i]!;
    }
    return side;
  };
  return [make(ineligible), make(eligible)];
}

/** Indices of each side ordered by distance from the cutoff, ties in index order (as a stable sort would leave them). */
function sideOrder(t: Float64Array): { ineligible: Uint32Array; eligible: Uint32Array } {
  const order = orderByDistance(t);
  let eligibleCount = 0;
  for (let i = 0; i < t.length; i++) eligibleCount += +(t[i]! >= 0);
  const sides = { ineligible: new Uint32Array(t.length - eligibleCount), eligible: new Uint32Array(eligibleCount) };
  for (let k = 0, a = 0, b = 0; k < order.length; k++) {
    const i = order[k]!;
    if (t[i]! >= 0) sides.eligible[b++] = i;
    else sides.ineligible[a++] = i;
  }
  return sides;
}

/**
 * Indices by |t| ascending, ties by index: the distinct distances sorted natively, each entry's
 * rank found by binary search, then a counting sort on the ranks (stable). Several times faster
 * than a comparator sort on a million entries.
 */
function orderByDistance(t: Float64Array): Uint32Array {
  const n = t.length;
  const distance = new Float64Array(n);
  for (let i = 0; i < n; i++) distance[i] = Math.abs(t[i]!);
  const sorted = Float64Array.from(distance).sort();
  let distinct = 0;
  for (let k = 0; k < n; k++) if (k === 0 || sorted[k] !== sorted[distinct - 1]) sorted[distinct++] = sorted[k]!;
  const rank = new Uint32Array(n);
  const starts = new Uint32Array(distinct + 1);
  for (let i = 0; i < n; i++) {
    let lo = 0;
    let hi = distinct - 1;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (sorted[mid]! < distance[i]!) lo = mid + 1;
      else hi = mid;
    }
    rank[i] = lo;
    starts[lo + 1]! += 1;
  }
  for (let r = 0; r < distinct; r++) starts[r + 1]! += starts[r]!;
  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) order[starts[rank[i]!]!++] = i;
  return order;
}

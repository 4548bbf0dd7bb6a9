import type { EligibleSide } from '../schemas/program';
import { normalCdf } from '../estimation';

/**
 * A score is treated as recorded on a grid when at most this share of observations have a value
 * of their own (common practice, no source): below it, exact values repeat and heaping can be
 * counted value by value.
 */
const GRID_MAX_DISTINCT_SHARE = 0.5;
/** Steps tried for the grid, as multiples of a power of ten. */
const GRID_MULTIPLES = [1, 2, 5] as const;
/** A score with fewer distinct values than this on a side within the window is "discrete" (common practice, no source). */
export const FEW_DISTINCT_VALUES = 10;
/** Score values listed either side of the cutoff in `nearCutoff`. */
const VALUES_LISTED = 3;

/** Count of observations at one score value. */
export interface ValueCount {
  score: number;
  count: number;
}

/** Observations on multiples of a round number, against the neighbouring grid values. */
export interface RoundValueHeaping {
  /** The round number, score units (10 and 5 grid steps). */
  base: number;
  /** Share of all observations on a multiple of `base`. */
  share: number;
  /** Observations on multiples of `base`. */
  count: number;
  /** Observations one grid step either side of those multiples, halved (what smooth counts would give). */
  expected: number;
  /** count / expected (1 without heaping; null when nothing neighbours the multiples). */
  ratio: number | null;
  /** One-sided p-value for "more than the neighbours" (binomial 1/3 among value and its two neighbours, normal approximation). */
  p: number;
}

/** The score value at the cutoff against its neighbours. */
export interface CutoffHeaping {
  score: number;
  count: number;
  /** Mean count of the two grid values either side (four values). */
  neighbourMean: number;
  ratio: number | null;
  /** One-sided p-value for "more than the neighbours" (binomial 1/5, normal approximation). */
  p: number;
}

export interface HeapingResult {
  /** Distinct score values in the data. */
  distinctValues: number;
  /** Grid step the scores are recorded on (score units), or null for a continuous score. */
  step: number | null;
  /** Distinct score values within `window` of the cutoff, on each side. */
  distinctNearCutoff: { ineligible: number; eligible: number };
  /** The half-width used for `distinctNearCutoff`, score units. */
  window: number;
  /** True when either side has fewer than 10 distinct values within the window. */
  discrete: boolean;
  /** Multiples of 10 and of 5 grid steps (empty for a continuous score). */
  roundValues: RoundValueHeaping[];
  /** Null for a continuous score or when the cutoff is not on the grid. */
  atCutoff: CutoffHeaping | null;
  /** Counts at the grid values next to the cutoff (three either side plus the cutoff's own). */
  nearCutoff: ValueCount[];
}

/**
 * Score heaping (common practice, no source for the thresholds; Kolesár & Rothe 2018 for why a
 * discrete score matters): whether scores pile up on round values or on the few values at and
 * beside the cutoff, compared with the neighbouring values, and how many distinct values lie near
 * the cutoff. Works on the raw score scale because "round" means round in the agency's units.
 *
 * @param score raw scores.
 * @param cutoff the cutoff, score units (a score at the cutoff is eligible).
 * @param window half-width around the cutoff for counting distinct values (e.g. the bandwidth), score units.
 */
export function scoreHeaping(score: Float64Array, cutoff: number, eligibleSide: EligibleSide, window: number): HeapingResult {
  if (!(window > 0)) throw new RangeError(`scoreHeaping: window must be positive, got ${window}`);
  const counts = new Map<number, number>();
  for (const v of score) counts.set(v, (counts.get(v) ?? 0) + 1);
  const values = [...counts.keys()].sort((a, b) => a - b);
  const step = values.length <= GRID_MAX_DISTINCT_SHARE * score.length ? gridStep(values) : null;
  const distinctNearCutoff = { ineligible: 0, eligible: 0 };
  for (const v of values) {
    if (Math.abs(v - cutoff) > window) continue;
    const eligible = eligibleSide === 'at-or-above' ? v >= cutoff : v <= cutoff;
    distinctNearCutoff[eligible ? 'eligible' : 'ineligible'] += 1;
  }
  const result: HeapingResult = {
    distinctValues: values.length,
    step,
    distinctNearCutoff,
    window,
    discrete: Math.min(distinctNearCutoff.ineligible, distinctNearCutoff.eligible) < FEW_DISTINCT_VALUES,
    roundValues: [],
    atCutoff: null,
    nearCutoff: [],
  };
  if (step === null) return result;
  const keys = new Map<number, number>();
  for (const [v, c] of counts) keys.set(Math.round(v / step), c);
  const at = (k: number) => keys.get(k) ?? 0;
  const lowestKey = Math.round(values[0]! / step);
  const highestKey = Math.round(values[values.length - 1]! / step);
  for (const multiple of [10, 5]) {
    let count = 0;
    let neighbours = 0;
    for (const [k, c] of keys) {
      // The extremes have a neighbour on one side only; they would look heaped.
      if (k % multiple !== 0 || k === lowestKey || k === highestKey) continue;
      count += c;
      neighbours += at(k - 1) + at(k + 1);
    }
    const expected = neighbours / 2;
    result.roundValues.push({
      base: roundTo(multiple * step, step),
      share: count / score.length,
      count,
      expected,
      ratio: expected > 0 ? count / expected : null,
      p: binomialExcessP(count, count + neighbours, 1 / 3),
    });
  }
  const c = cutoff / step;
  if (Math.abs(c - Math.round(c)) < 1e-9) {
    const k0 = Math.round(c);
    const count = at(k0);
    const neighbours = at(k0 - 2) + at(k0 - 1) + at(k0 + 1) + at(k0 + 2);
    result.atCutoff = {
      score: roundTo(k0 * step, step),
      count,
      neighbourMean: neighbours / 4,
      ratio: neighbours > 0 ? count / (neighbours / 4) : null,
      p: binomialExcessP(count, count + neighbours, 1 / 5),
    };
    for (let j = -VALUES_LISTED; j <= VALUES_LISTED; j++) result.nearCutoff.push({ score: roundTo((k0 + j) * step, step), count: at(k0 + j) });
  }
  return result;
}

/**
 * The coarsest step of the form m·10^e (m ∈ {1, 2, 5}) on which every value lies, or null when
 * the values are not on such a grid.
 */
export function gridStep(sortedValues: readonly number[]): number | null {
  if (sortedValues.length < 2) return null;
  let smallestGap = Infinity;
  for (let i = 1; i < sortedValues.length; i++) smallestGap = Math.min(smallestGap, sortedValues[i]! - sortedValues[i - 1]!);
  for (let e = Math.ceil(Math.log10(smallestGap)) + 1; e >= -8; e--) {
    for (const m of [...GRID_MULTIPLES].reverse()) {
      const step = m * Math.pow(10, e);
      if (step > smallestGap * (1 + 1e-9)) continue;
      if (sortedValues.every((v) => Math.abs(v / step - Math.round(v / step)) < 1e-6)) return step;
    }
  }
  return null;
}

/** P(X ≥ k) for X ~ Binomial(n, q), normal approximation with continuity correction; 1 when n = 0. */
function binomialExcessP(k: number, n: number, q: number): number {
  if (n === 0) return 1;
  const sd = Math.sqrt(n * q * (1 - q));
  return 1 - normalCdf((k - 0.5 - n * q) / sd);
}

/** Rounds to the step's decimals so reported values read like the agency's (60, not 59.99999999). */
function roundTo(value: number, step: number): number {
  const decimals = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  return Number(value.toFixed(decimals));
}

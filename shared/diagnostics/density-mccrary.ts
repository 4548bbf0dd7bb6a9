import { DiagnosticError } from './errors';
import { boundaryConstants, twoSidedP } from '../estimation';
import { fitPolynomial, polynomialDerivative, polynomialValue } from './polynomial-fit';

/** Boundary variance constant C₂ of the triangular kernel (METHODS §3a: 24/5, derived). */
const TRIANGULAR_BOUNDARY_VARIANCE = boundaryConstants('triangular').c2;
/** McCrary's (2008) bandwidth constant for the triangular kernel (METHODS §4a, from memory). */
const MCCRARY_BANDWIDTH_CONSTANT = 3.348;
/** A quartic needs five coefficients; one more bin leaves a residual degree of freedom. */
const MIN_BINS_PER_SIDE = 6;

/** One histogram cell, in centred score units (t ≥ 0 eligible). */
export interface DensityBin {
  /** Bin midpoint, centred score units. */
  t: number;
  /** count / (n · binWidth): a density per score unit. */
  height: number;
  count: number;
}

/** The histogram the McCrary test smooths. */
export interface DensityHistogram {
  /** Bin width b = 2·sd(score)·n^(−1/2), score units; the cutoff is a bin edge. */
  binWidth: number;
  n: number;
  ineligible: DensityBin[];
  eligible: DensityBin[];
}

export interface McCraryResult {
  /** θ = ln f̂(eligible side) − ln f̂(ineligible side) at the cutoff. */
  theta: number;
  se: number;
  z: number;
  /** Two-sided p-value against the standard normal. */
  p: number;
  /** Density at the cutoff from each side, per score unit. */
  densityIneligible: number;
  densityEligible: number;
  /** Bin width and smoothing bandwidth, score units. */
  binWidth: number;
  h: number;
}

/**
 * The histogram of McCrary (2008, J. Econometrics 142(2):698–714), step 1–2 of METHODS §4a:
 * bin width b = 2σ̂n^(−1/2), bins [kb, (k+1)b) in centred units so the cutoff is an edge and no
 * bin straddles it, heights count/(n·b). Every bin between the data's extremes is listed, empty
 * ones too (an empty bin is information about the density).
 *
 * A score recorded on a grid coarser than b (e.g. whole points) would leave bins alternately full
 * and empty, and the value at the cutoff alone in the first eligible bin; pass the grid step as
 * `minimumBinWidth` so each bin holds one score value (McCrary's advice that bins respect the
 * score's discreteness; from memory).
 * @throws DiagnosticError `too_little_variation` when the score has no spread.
 */
export function densityHistogram(t: Float64Array, minimumBinWidth = 0): DensityHistogram {
  const n = t.length;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = t[i]!;
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (t[i]! - mean) ** 2;
  const sd = Math.sqrt(ss / (n - 1));
  if (!(sd > 0)) throw new DiagnosticError('too_little_variation', 'The score has the same value for everyone, so its density cannot be examined.');
  const binWidth = Math.max((2 * sd) / Math.sqrt(n), minimumBinWidth);
  const lowest = Math.floor(min / binWidth);
  const highest = Math.floor(max / binWidth);
  const counts = new Float64Array(highest - lowest + 1);
  for (let i = 0; i < n; i++) counts[Math.floor(t[i]! / binWidth) - lowest]! += 1;
  const ineligible: DensityBin[] = [];
  const eligible: DensityBin[] = [];
  for (let j = 0; j < counts.length; j++) {
    const k = j + lowest;
    const bin = { t: (k + 0.5) * binWidth, height: counts[j]! / (n * binWidth), count: counts[j]! };
    (k < 0 ? ineligible : eligible).push(bin);
  }
  return { binWidth, n, ineligible, eligible };
}

/**
 * McCrary's bandwidth rule of thumb (METHODS §4a step 5, from memory): on each side a global
 * quartic in the bin midpoints fitted to the heights; with σ̃² its mean squared residual and f̃''
 * its second derivative at the midpoints, h_side = 3.348·[σ̃²·(side's range) / Σ f̃''(X_j)²]^(1/5);
 * h is the average of the two sides. McCrary advises checking it by eye; we report it.
 * @throws DiagnosticError when a side has fewer than six bins or the quartic is flat.
 */
export function mccraryBandwidth(histogram: DensityHistogram): number {
  const sides = [histogram.ineligible, histogram.eligible];
  let total = 0;
  for (const bins of sides) {
    if (bins.length < MIN_BINS_PER_SIDE) {
      throw new DiagnosticError('too_few_observations', `The density test needs scores spread over at least ${MIN_BINS_PER_SIDE} histogram bins on each side of the cutoff.`);
    }
    const x = bins.map((b) => b.t);
    const y = bins.map((b) => b.height);
    const range = bins.length * histogram.binWidth;
    const fit = fitPolynomial(x, y, null, 4, range);
    if (!fit) throw new DiagnosticError('singular_fit', 'The histogram of scores could not be fitted to choose the density bandwidth.');
    let rss = 0;
    let curvature = 0;
    for (let j = 0; j < x.length; j++) {
      rss += (y[j]! - polynomialValue(fit, x[j]!)) ** 2;
      curvature += polynomialDerivative(fit, x[j]!, 2) ** 2;
    }
    const sigma2 = rss / x.length;
    // A straight-line density has no curvature: fall back to the whole side as the window.
    const hSide = curvature > 0 ? MCCRARY_BANDWIDTH_CONSTANT * Math.pow((sigma2 * range) / curvature, 0.2) : range;
    total += Math.min(hSide, range);
  }
  return total / 2;
}

/**
 * Triangular-kernel local-linear smooth of the histogram heights on one side, evaluated at
 * centred position `at` (McCrary step 3). Only that side's bins enter.
 * @returns the fitted density, or null when fewer than two bins get positive weight.
 */
export function smoothHistogram(bins: readonly DensityBin[], at: number, h: number): number | null {
  const x = new Float64Array(bins.length);
  const y = new Float64Array(bins.length);
  const w = new Float64Array(bins.length);
  for (let j = 0; j < bins.length; j++) {
    const d = bins[j]!.t - at;
    x[j] = d;
    y[j] = bins[j]!.height;
    w[j] = Math.max(0, 1 - Math.abs(d) / h);
  }
  const fit = fitPolynomial(x, y, w, 1, h);
  return fit ? fit.coefficients[0]! : null;
}

/**
 * SE of θ̂: √[(1/(n h))·(24/5)·(1/f̂₊ + 1/f̂₋)] (METHODS §4a).
 * @example mccrarySe(1000, 0.2, 1, 1) // 0.21909 (METHODS §4c)
 */
export function mccrarySe(n: number, h: number, fPlus: number, fMinus: number): number {
  return Math.sqrt((TRIANGULAR_BOUNDARY_VARIANCE / (n * h)) * (1 / fPlus + 1 / fMinus));
}

/**
 * McCrary (2008) density discontinuity test at the cutoff (METHODS §4a): histogram, bandwidth
 * rule, local-linear smoothing from each side, θ̂ = ln f̂₊ − ln f̂₋ with
 * SE = √[(1/(n h))·(24/5)·(1/f̂₊ + 1/f̂₋)] (24/5 is the triangular boundary constant; derived).
 * "+" is the eligible side, so θ̂ > 0 means more mass just inside eligibility.
 *
 * @param t centred scores (`centredScore`).
 * @param h smoothing bandwidth in score units; default McCrary's rule of thumb.
 * @param minimumBinWidth the score's grid step, when it has one (see `densityHistogram`).
 * @throws DiagnosticError when a side has too few bins or a density estimate is not positive.
 * @example mccraryTest(centredScore(score, 60, 'at-or-above')).p
 */
export function mccraryTest(t: Float64Array, h?: number, minimumBinWidth = 0): McCraryResult {
  const histogram = densityHistogram(t, minimumBinWidth);
  const bandwidth = h ?? mccraryBandwidth(histogram);
  if (!(bandwidth > 0)) throw new RangeError(`mccraryTest: h must be positive, got ${bandwidth}`);
  const fMinus = smoothHistogram(histogram.ineligible, 0, bandwidth);
  const fPlus = smoothHistogram(histogram.eligible, 0, bandwidth);
  if (fMinus === null || fPlus === null) {
    throw new DiagnosticError('too_few_observations', 'Too few histogram bins lie within the density bandwidth on one side of the cutoff.');
  }
  if (!(fMinus > 0 && fPlus > 0)) {
    throw new DiagnosticError('density_not_positive', 'The estimated density of scores at the cutoff is zero on one side, so the density test is undefined.');
  }
  const n = histogram.n;
  const theta = Math.log(fPlus) - Math.log(fMinus);
  const se = mccrarySe(n, bandwidth, fPlus, fMinus);
  const z = theta / se;
  return { theta, se, z, p: twoSidedP(z), densityIneligible: fMinus, densityEligible: fPlus, binWidth: histogram.binWidth, h: bandwidth };
}

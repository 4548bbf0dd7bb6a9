import { DiagnosticError } from './errors';
import { twoSidedP } from '../estimation';
import { invertPositiveDefinite } from './polynomial-fit';

/** A local quadratic in the CDF, i.e. local linear in the density. */
const ORDER = 2;

export interface LocalPolynomialDensityResult {
  /** (f̂₊ − f̂₋) / √V̂: approximately standard normal without a jump. */
  statistic: number;
  /** Two-sided p-value. */
  p: number;
  /** Density at the cutoff from each side, per score unit. */
  densityIneligible: number;
  densityEligible: number;
  /** Bandwidth, score units. */
  h: number;
  /** Observations inside h on each side. */
  usedIneligible: number;
  usedEligible: number;
}

interface SlopeFit {
  /** d F̂ / d t at the cutoff: the density per score unit. */
  density: number;
  /** Influence φ_k of every observation on the density, in sorted order (length n). */
  influence: Float64Array;
  used: number;
}

/**
 * A density discontinuity test in the spirit of Cattaneo, Jansson & Ma (2020, JASA): no binning.
 * Sort the scores, take the empirical CDF F̂ᵢ = #{tⱼ ≤ tᵢ}/n, and on each side fit a
 * triangular-kernel local polynomial in t to F̂ within h; the slope at the cutoff estimates the
 * density from that side (METHODS §4b).
 *
 * Variance (our derivation, not the paper's estimator): with ℓᵢ = e₁ᵀΓ̂⁻¹wᵢrᵢ, Γ̂ = (1/n)Σwᵢrᵢrᵢᵀ,
 * the slope is (1/n)Σℓᵢ F̂ᵢ, a V-statistic in the data. Its Hájek projection gives the influence
 * of observation k,
 *   φ_k = ℓ_k·(F̂_k − r_kᵀβ̂) + (1/n)·Σ_{i: tᵢ ≥ t_k} ℓᵢ,
 * (the second term is how k moves the CDF of every observation above it; observations below the
 * window shift F̂ by a constant, which the intercept absorbs). V̂(f̂₊ − f̂₋) = (1/n²)Σ_k(φ_k − φ̄)²
 * with φ_k the difference of the two sides' influences, so any dependence between sides is kept.
 *
 * Local quadratics (p = 2) at an MSE-rate bandwidth leave a bias of order h² in each side's slope,
 * but with the same constant on both sides [derived: reflecting u → −u maps the left fit's bias
 * e₁ᵀΓ₋⁻¹ϑ₋ onto the right's], so without a jump it cancels in f̂₊ − f̂₋ when f is smooth. A cubic
 * bias correction was tried and kept the size but lost most of the power (56% against 99% in the
 * manipulation design of tests/reference/density-tests.test.ts). The bandwidth is the caller's:
 * `runDiagnostics` passes McCrary's rule of thumb, which has the same n^(−1/5) rate.
 *
 * @param t centred scores (any order).
 * @param h bandwidth in score units.
 * @throws DiagnosticError when a side has fewer than 2·(order + 1) observations inside h.
 */
export function localPolynomialDensityTest(t: Float64Array, h: number): LocalPolynomialDensityResult {
  if (!(h > 0)) throw new RangeError(`localPolynomialDensityTest: h must be positive, got ${h}`);
  const sorted = Float64Array.from(t).sort();
  const n = sorted.length;
  const cdf = empiricalCdf(sorted);
  const split = lowerBound(sorted, 0);
  const test = [slopeAtCutoff(sorted, cdf, split, h, 0, ORDER), slopeAtCutoff(sorted, cdf, split, h, 1, ORDER)];
  let mean = 0;
  for (let k = 0; k < n; k++) mean += test[1]!.influence[k]! - test[0]!.influence[k]!;
  mean /= n;
  let ss = 0;
  for (let k = 0; k < n; k++) ss += (test[1]!.influence[k]! - test[0]!.influence[k]! - mean) ** 2;
  const se = Math.sqrt(ss) / n;
  const statistic = (test[1]!.density - test[0]!.density) / se;
  return {
    statistic,
    p: twoSidedP(statistic),
    densityIneligible: test[0]!.density,
    densityEligible: test[1]!.density,
    h,
    usedIneligible: test[0]!.used,
    usedEligible: test[1]!.used,
  };
}

/** F̂ᵢ = #{tⱼ ≤ tᵢ}/n on sorted data (ties share the largest rank). */
function empiricalCdf(sorted: Float64Array): Float64Array {
  const n = sorted.length;
  const cdf = new Float64Array(n);
  let i = n - 1;
  while (i >= 0) {
    let j = i;
    while (j > 0 && sorted[j - 1] === sorted[i]) j--;
    for (let m = j; m <= i; m++) cdf[m] = (i + 1) / n;
    i = j - 1;
  }
  return cdf;
}

function slopeAtCutoff(sorted: Float64Array, cdf: Float64Array, split: number, h: number, side: 0 | 1, order: number): SlopeFit {
  const n = sorted.length;
  const k = order + 1;
  const lo = side === 0 ? lowerBound(sorted, -h) : split;
  const hi = side === 0 ? split : upperBound(sorted, h);
  const used = hi - lo;
  if (used < 2 * k) {
    throw new DiagnosticError('too_few_observations', `The density test needs at least ${2 * k} scores within the bandwidth on each side of the cutoff.`);
  }
  const gram = new Float64Array(k * k);
  const cross = new Float64Array(k);
  const r = new Float64Array(k);
  for (let i = lo; i < hi; i++) {
    const u = sorted[i]! / h;
    const w = Math.max(0, 1 - Math.abs(u)) / n;
    powers(u, r);
    for (let a = 0; a < k; a++) {
      cross[a]! += w * r[a]! * cdf[i]!;
      for (let b = 0; b < k; b++) gram[a * k + b]! += w * r[a]! * r[b]!;
    }
  }
  const inverse = invertPositiveDefinite(gram, k);
  if (!inverse) throw new DiagnosticError('singular_fit', 'Too few distinct scores near the cutoff to fit the density.');
  const beta = new Float64Array(k);
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) beta[a]! += inverse[a * k + b]! * cross[b]!;
  // ℓᵢ = e₁ᵀΓ̂⁻¹wᵢrᵢ, in u units; divide by h at the end for score units.
  const ell = new Float64Array(hi - lo);
  for (let i = lo; i < hi; i++) {
    const u = sorted[i]! / h;
    const w = Math.max(0, 1 - Math.abs(u));
    powers(u, r);
    let v = 0;
    for (let b = 0; b < k; b++) v += inverse[k + b]! * r[b]!;
    ell[i - lo] = w * v;
  }
  // suffix[j] = Σ_{i ≥ j} ℓᵢ within the window; a tie group shares the suffix of its first member.
  const suffix = new Float64Array(hi - lo + 1);
  for (let j = hi - lo - 1; j >= 0; j--) suffix[j] = suffix[j + 1]! + ell[j]!;
  const influence = new Float64Array(n);
  const total = suffix[0]! / n;
  for (let m = 0; m < lo; m++) influence[m] = total / h;
  let groupStart = lo;
  for (let i = lo; i < hi; i++) {
    if (i === lo || sorted[i] !== sorted[i - 1]) groupStart = i;
    const u = sorted[i]! / h;
    powers(u, r);
    let fitted = 0;
    for (let b = 0; b < k; b++) fitted += beta[b]! * r[b]!;
    influence[i] = (ell[i - lo]! * (cdf[i]! - fitted) + suffix[groupStart - lo]! / n) / h;
  }
  // Observations above the window do not move F̂ inside it: influence 0 (already).
  return { density: beta[1]! / h, influence, used };
}

function powers(u: number, out: Float64Array): void {
  let p = 1;
  for (let j = 0; j < out.length; j++) {
    out[j] = p;
    p *= u;
  }
}

/** First index with sorted[i] ≥ value. */
function lowerBound(sorted: Float64Array, value: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with sorted[i] > value. */
function upperBound(sorted: Float64Array, value: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

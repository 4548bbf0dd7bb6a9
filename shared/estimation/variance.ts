import { EstimationError } from './errors';
import { kernelWeight } from './kernels';
import type { SideFit } from './local-polynomial';
import { polynomialAt } from './local-polynomial';
import { sideRange, type OrientedData } from './oriented-data';
import type { VarianceKind } from './types';

/**
 * Every estimate in the engine is linear in the outcome on each side: θ̂ₛ = Σᵢ ωᵢyᵢ. The
 * conventional intercept has ωᵢ = wᵢ·e₀ᵀ(RᵀWR)⁻¹rᵢ; the bias-corrected intercept and the
 * derivative estimates used by the bandwidth rules are other rows or sums of such terms. So one
 * routine computes every variance:
 *
 *   V̂(θ̂ₛ) = Σᵢ ωᵢ² ω̂ᵢ,   with ω̂ᵢ = ε̂ᵢ² (HC0), ε̂ᵢ²/(1−hᵢᵢ) (HC2), ε̂ᵢ²/(1−hᵢᵢ)² (HC3),
 *   HC1 = HC0·nₛ/(nₛ−k), or eᵢ² from nearest neighbours,
 *
 * which is e₀ᵀA[Σ wᵢ²ω̂ᵢrᵢrᵢᵀ]Ae₀ of METHODS §2a written through the weights (MacKinnon & White
 * 1985; hᵢᵢ = wᵢrᵢᵀArᵢ is the leverage of the weighted fit whose residuals are used). Several columns
 * (outcome and take-up) give a covariance matrix, the piece the delta method needs (§2b). With
 * clusters, ψᵢ = ±ωᵢε̂ᵢ is summed within clusters across both sides before squaring, so clusters that
 * straddle the cutoff get their cross-side covariance (§2d):
 *
 *   V̂_CL = G/(G−1) · Σ_g (Σ_{i∈g} ψᵢ)²   (HC0), times (n−1)/(n−K) for HC1.
 */

/** One term of a linear functional: ωᵢ += K(tᵢ/h)·(row · (1, u, …, uᵖ)), u = tᵢ/h of `fit`. */
export interface FunctionalTerm {
  fit: SideFit;
  row: Float64Array;
}

/** A linear estimator on one side and the fit whose residuals measure its noise. */
export interface SideFunctional {
  terms: FunctionalTerm[];
  residualFit: SideFit;
}

export interface VarianceSettings {
  kind: VarianceKind;
  /** Nearest-neighbour residuals per column; required when kind is `nearest-neighbour`. */
  neighbourResiduals: readonly Float64Array[] | null;
}

export interface FunctionalCovariance {
  /** Per side (ineligible, eligible): cols×cols covariance, row-major. */
  sides: [Float64Array, Float64Array];
  /** cols×cols covariance of eligible minus ineligible. */
  jump: Float64Array;
  /** Clusters with an observation in the functional's window (0 without clusters). */
  clusters: number;
}

/** Covariance of per-side linear functionals and of their difference, in one pass. */
export function functionalCovariance(
  data: OrientedData,
  functionals: readonly [SideFunctional, SideFunctional],
  settings: VarianceSettings,
): FunctionalCovariance {
  const { t, columns, cluster, clusterCount } = data;
  const cols = columns.length;
  const cc = cols * cols;
  const kind = settings.kind;
  const nn = kind === 'nearest-neighbour' ? settings.neighbourResiduals : null;
  if (kind === 'nearest-neighbour' && (!nn || nn.length !== cols)) {
    throw new RangeError('functionalCovariance: nearest-neighbour residuals are missing');
  }
  const leveraged = kind === 'hc2' || kind === 'hc3';
  const matrices = [new Float64Array(cc), new Float64Array(cc)];
  const inWindow = [0, 0];
  const clusterSums = cluster ? new Float64Array(2 * clusterCount * cols) : null;
  const touched = cluster ? new Uint8Array(2 * clusterCount) : null;
  const resid = new Float64Array(cols);
  for (const s of [0, 1] as const) {
    const f = functionals[s]!;
    const terms = f.terms;
    const reach = Math.max(...terms.map((term) => term.fit.h));
    const [lo, hi] = sideRange(data, s, reach);
    const rf = f.residualFit;
    const mat = matrices[s]!;
    let count = 0;
    for (let i = lo; i < hi; i++) {
      const ti = t[i]!;
      let omega = 0;
      let inside = 0;
      for (let j = 0; j < terms.length; j++) {
        const term = terms[j]!;
        const u = ti / term.fit.h;
        const w = kernelWeight(term.fit.kernelCode, u);
        inside += w;
        omega += w * polynomialAt(term.row, u);
      }
      if (!(inside > 0)) continue;
      count++;
      const ur = ti / rf.h;
      if (nn) {
        for (let c = 0; c < cols; c++) resid[c] = nn[c]![i]!;
      } else {
        for (let c = 0; c < cols; c++) resid[c] = columns[c]![i]! - polynomialAt(rf.coefficients[c]!, ur);
      }
      let adjust = 1;
      if (leveraged) {
        const lev = leverage(rf, ur);
        const room = 1 - lev;
        if (!(room > 1e-10)) {
          throw new EstimationError('singular_fit', 'An observation decides its own fitted value (leverage 1), so HC2/HC3 are undefined; widen the bandwidth or use hc0/hc1.');
        }
        adjust = kind === 'hc2' ? 1 / room : 1 / (room * room);
      }
      const o2 = omega * omega * adjust;
      for (let a = 0; a < cols; a++) for (let b = 0; b < cols; b++) mat[a * cols + b]! += o2 * resid[a]! * resid[b]!;
      if (clusterSums && touched && cluster) {
        const g = cluster[i]!;
        touched[s * clusterCount + g] = 1;
        const base = (s * clusterCount + g) * cols;
        for (let c = 0; c < cols; c++) clusterSums[base + c]! += omega * resid[c]!;
      }
    }
    inWindow[s] = count;
  }
  if (!clusterSums || !touched) {
    const sides = matrices.map((m, s) => {
      if (kind !== 'hc1') return m;
      const rf = functionals[s]!.residualFit;
      const k = rf.order + 1;
      const factor = rf.used > k ? rf.used / (rf.used - k) : 1;
      return m.map((v) => v * factor);
    }) as [Float64Array, Float64Array];
    const jump = new Float64Array(cc);
    for (let j = 0; j < cc; j++) jump[j] = sides[0][j]! + sides[1][j]!;
    return { sides, jump, clusters: 0 };
  }
  // Clustered: per side, and for the jump with ψ signed + on the eligible side, − on the other.
  const params = [functionals[0].residualFit.order + 1, functionals[1].residualFit.order + 1];
  const clusterFactor = (groups: number, obs: number, k: number) => {
    let factor = groups > 1 ? groups / (groups - 1) : 1;
    if (kind === 'hc1' && obs > k) factor *= (obs - 1) / (obs - k);
    return factor;
  };
  const sides: Float64Array[] = [];
  for (let s = 0; s < 2; s++) {
    const m = new Float64Array(cc);
    let groups = 0;
    for (let g = 0; g < clusterCount; g++) {
      if (!touched[s * clusterCount + g]) continue;
      groups++;
      const base = (s * clusterCount + g) * cols;
      for (let a = 0; a < cols; a++) for (let b = 0; b < cols; b++) m[a * cols + b]! += clusterSums[base + a]! * clusterSums[base + b]!;
    }
    const factor = clusterFactor(groups, inWindow[s]!, params[s]!);
    sides.push(m.map((v) => v * factor));
  }
  const jump = new Float64Array(cc);
  let groups = 0;
  const psi = new Float64Array(cols);
  for (let g = 0; g < clusterCount; g++) {
    if (!touched[g] && !touched[clusterCount + g]) continue;
    groups++;
    for (let c = 0; c < cols; c++) psi[c] = clusterSums[(clusterCount + g) * cols + c]! - clusterSums[g * cols + c]!;
    for (let a = 0; a < cols; a++) for (let b = 0; b < cols; b++) jump[a * cols + b]! += psi[a]! * psi[b]!;
  }
  const factor = clusterFactor(groups, inWindow[0]! + inWindow[1]!, params[0]! + params[1]!);
  for (let j = 0; j < cc; j++) jump[j]! *= factor;
  return { sides: sides as [Float64Array, Float64Array], jump, clusters: groups };
}

/** hᵢᵢ = K(u)·rᵀA r of a fit at scaled position u (0 outside its window). */
function leverage(fit: SideFit, u: number): number {
  const w = kernelWeight(fit.kernelCode, u);
  if (w <= 0 || !fit.inverse) return 0;
  const k = fit.order + 1;
  const a = fit.inverse;
  let total = 0;
  let pi = 1;
  for (let i = 0; i < k; i++) {
    let rowSum = 0;
    let pj = 1;
    for (let j = 0; j < k; j++) {
      rowSum += a[i * k + j]! * pj;
      pj *= u;
    }
    total += pi * rowSum;
    pi *= u;
  }
  return w * total;
}

import { EstimationError } from './errors';
import { kernelCoefficients, kernelWeight } from './kernels';
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
  const matrices = [new Float64Array(cc), new Float64Array(cc)];
  const inWindow = [0, 0];
  const clusterSums = cluster ? new Float64Array(2 * clusterCount * cols) : null;
  const touched = cluster ? new Uint8Array(2 * clusterCount) : null;
  for (const s of [0, 1] as const) {
    const f = functionals[s]!;
    const reach = Math.max(...f.terms.map((term) => term.fit.h));
    const [lo, hi] = sideRange(data, s, reach);
    const fast = !cluster && cols <= 2 && f.terms.length <= 2 && f.terms.every((term) => term.row.length <= 6) && f.residualFit.order <= 5;
    const pass = fast
      ? unrolledSide(t, lo, hi, f, columns, nn, kind, matrices[s]!)
      : generalSide(t, lo, hi, f, columns, nn, kind, matrices[s]!, cluster, clusterCount, clusterSums, touched, s);
    if (pass.badLeverage) {
      throw new EstimationError('singular_fit', 'An observation decides its own fitted value (leverage 1), so HC2/HC3 are undefined; widen the bandwidth or use hc0/hc1.');
    }
    inWindow[s] = pass.count;
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

interface SidePass {
  /** Entries with positive weight in some term. */
  count: number;
  /** Whether some entry had leverage 1 (HC2/HC3 undefined). */
  badLeverage: boolean;
}

/** The general pass: any number of terms and columns, clusters. */
function generalSide(
  t: Float64Array,
  lo: number,
  hi: number,
  f: SideFunctional,
  columns: readonly Float64Array[],
  nn: readonly Float64Array[] | null,
  kind: VarianceKind,
  mat: Float64Array,
  cluster: Int32Array | null,
  clusterCount: number,
  clusterSums: Float64Array | null,
  touched: Uint8Array | null,
  s: number,
): SidePass {
  const cols = columns.length;
  const resid = new Float64Array(cols);
  const terms = f.terms;
  const rf = f.residualFit;
  const leveraged = kind === 'hc2' || kind === 'hc3';
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
      const room = 1 - leverage(rf, ur);
      if (!(room > 1e-10)) return { count, badLeverage: true };
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
  return { count, badLeverage: false };
}

/** Coefficients padded with zeros to six, so Horner's rule unrolls. */
type Six = [number, number, number, number, number, number];
function pad6(values: Float64Array | null): Six {
  const out: Six = [0, 0, 0, 0, 0, 0];
  if (values) for (let j = 0; j < Math.min(6, values.length); j++) out[j] = values[j]!;
  return out;
}

/**
 * The common case written out with scalars (one or two terms, one or two columns, orders up to 5,
 * no clusters): every polynomial is a six-coefficient Horner chain and the leverage rᵀAr is one
 * polynomial in u of degree ≤ 10 (the anti-diagonal sums of A), so the loop has no inner loops and
 * no data-dependent branches. Same sums as `generalSide` up to rounding order.
 */
function unrolledSide(
  t: Float64Array,
  lo: number,
  hi: number,
  f: SideFunctional,
  columns: readonly Float64Array[],
  nn: readonly Float64Array[] | null,
  kind: VarianceKind,
  mat: Float64Array,
): SidePass {
  const cols = columns.length;
  const [first, second] = f.terms as [FunctionalTerm, FunctionalTerm | undefined];
  const rf = f.residualFit;
  const [p0, p1, p2] = kernelCoefficients(first.fit.kernelCode);
  const [q0, q1, q2] = kernelCoefficients(second ? second.fit.kernelCode : 0);
  const [g0, g1, g2] = kernelCoefficients(rf.kernelCode);
  const ih1 = 1 / first.fit.h;
  const ih2 = second ? 1 / second.fit.h : 0;
  const has2 = second ? 1 : 0;
  const ihr = 1 / rf.h;
  const [a0, a1, a2, a3, a4, a5] = pad6(first.row);
  const [b0, b1, b2, b3, b4, b5] = pad6(second ? second.row : null);
  const [c0, c1, c2, c3, c4, c5] = pad6(rf.coefficients[0] ?? null);
  const [d0, d1, d2, d3, d4, d5] = pad6(rf.coefficients[1] ?? null);
  // Leverage polynomial: Σ_s (Σ_{i+j=s} A_ij) u^s.
  const lev: [number, number, number, number, number, number, number, number, number, number, number] = [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];
  const k = rf.order + 1;
  if (rf.inverse) for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) lev[i + j]! += rf.inverse[i * k + j]!;
  const [l0, l1, l2, l3, l4, l5, l6, l7, l8, l9, l10] = lev;
  const leveraged = kind === 'hc2' || kind === 'hc3' ? 1 : 0;
  const cube = kind === 'hc3';
  const useNN = nn !== null;
  const y0 = (useNN ? nn[0] : columns[0]) ?? t;
  const y1 = (useNN ? nn[1] : columns[1]) ?? t;
  const two = cols === 2;
  let m00 = 0;
  let m01 = 0;
  let m11 = 0;
  let count = 0;
  let bad = 0;
  for (let i = lo; i < hi; i++) {
    const ti = t[i]!;
    const u1 = ti * ih1;
    const u2 = ti * ih2;
    const w1 = localWeight(p0, p1, p2, u1);
    const w2 = has2 * localWeight(q0, q1, q2, u2);
    count += +(w1 + w2 > 0);
    const omega =
      w1 * (a0 + u1 * (a1 + u1 * (a2 + u1 * (a3 + u1 * (a4 + u1 * a5))))) + w2 * (b0 + u2 * (b1 + u2 * (b2 + u2 * (b3 + u2 * (b4 + u2 * b5)))));
    const ur = ti * ihr;
    let e0 = y0[i]!;
    let e1 = two ? y1[i]! : 0;
    if (!useNN) {
      e0 -= c0 + ur * (c1 + ur * (c2 + ur * (c3 + ur * (c4 + ur * c5))));
      e1 -= d0 + ur * (d1 + ur * (d2 + ur * (d3 + ur * (d4 + ur * d5))));
    }
    let o2 = omega * omega;
    if (leveraged) {
      const wr = localWeight(g0, g1, g2, ur);
      const h =
        wr * (l0 + ur * (l1 + ur * (l2 + ur * (l3 + ur * (l4 + ur * (l5 + ur * (l6 + ur * (l7 + ur * (l8 + ur * (l9 + ur * l10))))))))));
      const room = 1 - h;
      bad += +(room <= 1e-10);
      o2 = cube ? o2 / (room * room) : o2 / room;
    }
    m00 += o2 * e0 * e0;
    m01 += o2 * e0 * e1;
    m11 += o2 * e1 * e1;
  }
  mat[0]! += m00;
  if (two) {
    mat[1]! += m01;
    mat[2]! += m01;
    mat[3]! += m11;
  }
  return { count, badLeverage: bad > 0 };
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

/**
 * K(u) from `kernelCoefficients`, the same formula as `weightOf` in kernels.ts, kept in this module
 * on purpose: V8 stops inlining an imported function into loops this large when the code runs under
 * tsx (measured: three to four times slower), and an un-inlined call per row dominates the pass.
 */
function localWeight(c0: number, c1: number, c2: number, u: number): number {
  const a = Math.abs(u);
  const v1 = 1 - a;
  const v2 = 1 - a * a;
  return c0 * (v1 + Math.abs(v1)) + c1 * (v2 + Math.abs(v2)) + c2 * +(a <= 1);
}

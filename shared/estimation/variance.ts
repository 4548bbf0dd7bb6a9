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
function pad6(values: Float64Array | null): Float64Array {
  const out = new Float64Array(6);
  if (values) out.set(values.subarray(0, 6));
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
  // Parameters of the loop, packed so the loop function takes numbers and typed arrays only.
  const params = new Float64Array(PARAMS);
  params.set(kernelCoefficients(first.fit.kernelCode), 0);
  params.set(kernelCoefficients(second ? second.fit.kernelCode : 0), 3);
  params.set(kernelCoefficients(rf.kernelCode), 6);
  params[9] = 1 / first.fit.h;
  params[10] = second ? 1 / second.fit.h : 0;
  params[11] = second ? 1 : 0;
  params[12] = 1 / rf.h;
  params.set(pad6(first.row), 13);
  params.set(pad6(second ? second.row : null), 19);
  params.set(pad6(rf.coefficients[0] ?? null), 25);
  params.set(pad6(rf.coefficients[1] ?? null), 31);
  // Leverage polynomial: Σ_s (Σ_{i+j=s} A_ij) u^s, coefficients at 37…47.
  const k = rf.order + 1;
  if (rf.inverse) for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) params[37 + i + j]! += rf.inverse[i * k + j]!;
  params[48] = kind === 'hc2' || kind === 'hc3' ? 1 : 0;
  params[49] = kind === 'hc3' ? 1 : 0;
  params[50] = nn ? 1 : 0;
  params[51] = cols === 2 ? 1 : 0;
  const y0 = (nn ? nn[0] : columns[0]) ?? t;
  const y1 = (nn ? nn[1] : columns[1]) ?? t;
  const out = new Float64Array(5);
  // Two loops rather than one with a branch on the kind: each then sees one configuration only,
  // and V8's optimised code does not depend on which kind ran first.
  if (params[48]) leveragedVarianceLoop(t, lo, hi, y0, y1, params, out);
  else varianceLoop(t, lo, hi, y0, y1, params, out);
  mat[0]! += out[0]!;
  if (cols === 2) {
    mat[1]! += out[1]!;
    mat[2]! += out[1]!;
    mat[3]! += out[2]!;
  }
  return { count: out[3]!, badLeverage: out[4]! > 0 };
}

const PARAMS = 52;

/** The loop of `unrolledSide` for HC0, HC1 and nearest-neighbour: out = [Σω²e₀², Σω²e₀e₁, Σω²e₁², rows in window, 0]. */
function varianceLoop(t: Float64Array, lo: number, hi: number, y0: Float64Array, y1: Float64Array, params: Float64Array, out: Float64Array): void {
  const p0 = params[0]!;
  const p1 = params[1]!;
  const p2 = params[2]!;
  const q0 = params[3]!;
  const q1 = params[4]!;
  const q2 = params[5]!;
  const ih1 = params[9]!;
  const ih2 = params[10]!;
  const has2 = params[11]!;
  const ihr = params[12]!;
  const a0 = params[13]!;
  const a1 = params[14]!;
  const a2 = params[15]!;
  const a3 = params[16]!;
  const a4 = params[17]!;
  const a5 = params[18]!;
  const b0 = params[19]!;
  const b1 = params[20]!;
  const b2 = params[21]!;
  const b3 = params[22]!;
  const b4 = params[23]!;
  const b5 = params[24]!;
  const c0 = params[25]!;
  const c1 = params[26]!;
  const c2 = params[27]!;
  const c3 = params[28]!;
  const c4 = params[29]!;
  const c5 = params[30]!;
  const d0 = params[31]!;
  const d1 = params[32]!;
  const d2 = params[33]!;
  const d3 = params[34]!;
  const d4 = params[35]!;
  const d5 = params[36]!;
  const useNN = params[50]!;
  const two = params[51]!;
  const fitted = 1 - useNN;
  let m00 = 0;
  let m01 = 0;
  let m11 = 0;
  let count = 0;
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
    const e0 = y0[i]! - fitted * (c0 + ur * (c1 + ur * (c2 + ur * (c3 + ur * (c4 + ur * c5)))));
    const e1 = two * (y1[i]! - fitted * (d0 + ur * (d1 + ur * (d2 + ur * (d3 + ur * (d4 + ur * d5))))));
    const o2 = omega * omega;
    m00 += o2 * e0 * e0;
    m01 += o2 * e0 * e1;
    m11 += o2 * e1 * e1;
  }
  out[0] = m00;
  out[1] = m01;
  out[2] = m11;
  out[3] = count;
  out[4] = 0;
}

/**
 * The loop of `unrolledSide` for HC2 (ω̂ = ε̂²/(1−h)) and HC3 (ε̂²/(1−h)²), the power chosen by
 * arithmetic: out = [Σω²ω̂ products, rows in window, rows with leverage 1].
 */
function leveragedVarianceLoop(t: Float64Array, lo: number, hi: number, y0: Float64Array, y1: Float64Array, params: Float64Array, out: Float64Array): void {
  const p0 = params[0]!;
  const p1 = params[1]!;
  const p2 = params[2]!;
  const q0 = params[3]!;
  const q1 = params[4]!;
  const q2 = params[5]!;
  const g0 = params[6]!;
  const g1 = params[7]!;
  const g2 = params[8]!;
  const ih1 = params[9]!;
  const ih2 = params[10]!;
  const has2 = params[11]!;
  const ihr = params[12]!;
  const a0 = params[13]!;
  const a1 = params[14]!;
  const a2 = params[15]!;
  const a3 = params[16]!;
  const a4 = params[17]!;
  const a5 = params[18]!;
  const b0 = params[19]!;
  const b1 = params[20]!;
  const b2 = params[21]!;
  const b3 = params[22]!;
  const b4 = params[23]!;
  const b5 = params[24]!;
  const c0 = params[25]!;
  const c1 = params[26]!;
  const c2 = params[27]!;
  const c3 = params[28]!;
  const c4 = params[29]!;
  const c5 = params[30]!;
  const d0 = params[31]!;
  const d1 = params[32]!;
  const d2 = params[33]!;
  const d3 = params[34]!;
  const d4 = params[35]!;
  const d5 = params[36]!;
  const l0 = params[37]!;
  const l1 = params[38]!;
  const l2 = params[39]!;
  const l3 = params[40]!;
  const l4 = params[41]!;
  const l5 = params[42]!;
  const l6 = params[43]!;
  const l7 = params[44]!;
  const l8 = params[45]!;
  const l9 = params[46]!;
  const l10 = params[47]!;
  const cube = params[49]!;
  const useNN = params[50]!;
  const two = params[51]!;
  const fitted = 1 - useNN;
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
    const e0 = y0[i]! - fitted * (c0 + ur * (c1 + ur * (c2 + ur * (c3 + ur * (c4 + ur * c5)))));
    const e1 = two * (y1[i]! - fitted * (d0 + ur * (d1 + ur * (d2 + ur * (d3 + ur * (d4 + ur * d5))))));
    const wr = localWeight(g0, g1, g2, ur);
    const h =
      wr * (l0 + ur * (l1 + ur * (l2 + ur * (l3 + ur * (l4 + ur * (l5 + ur * (l6 + ur * (l7 + ur * (l8 + ur * (l9 + ur * l10))))))))));
    const room = 1 - h;
    bad += +(room <= 1e-10);
    const o2 = (omega * omega) / (room * (cube * room + 1 - cube));
    m00 += o2 * e0 * e0;
    m01 += o2 * e0 * e1;
    m11 += o2 * e1 * e1;
  }
  out[0] = m00;
  out[1] = m01;
  out[2] = m11;
  out[3] = count;
  out[4] = bad;
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

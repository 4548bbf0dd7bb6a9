import { sumOfSquares } from './array-passes';
import { EstimationError } from './errors';
import { formatBandwidth, requireUsableFits } from './fit-checks';
import { fitSides, type SideFit } from './local-polynomial';
import { factorial } from './math';
import { SIDE_SIGN, type OrientedData } from './oriented-data';
import { kernelWeight } from './kernels';
import { dot, matrixRow } from './small-matrix';
import type { KernelName } from './types';
import { functionalCovariance, type VarianceSettings } from './variance';

/**
 * MSE-optimal bandwidths by plug-in, in the manner of Calonico, Cattaneo & Titiunik (2014,
 * METHODS §3c), with every constant estimated from the data in finite-sample form rather than from
 * asymptotic kernel tables (so any kernel and any design density work the same way).
 *
 * For a local polynomial of order p the jump estimate at h has
 *   bias ≈ h^(p+1)·B,  B = Σₛ ±cₛ·mₛ⁽ᵖ⁺¹⁾/(p+1)!,  cₛ = e₀ᵀΓₛ⁻¹ϑₛ (leading-bias constant of side s),
 *   variance ≈ V/(n·h),  V = n·h·Σₛ Var(μ̂ₛ(h)),
 * so MSE(h) = h^(2p+2)B² + V/(nh) is smallest at
 *   h^(2p+3) = V / (2(p+1)·(B² + R)·n)                                   [derived]
 * where R, the estimated variance of B̂, is the regularisation of Imbens & Kalyanaraman (2012):
 * it keeps h finite when the estimated curvature is near zero and vanishes as n grows.
 *
 * mₛ⁽ᵖ⁺¹⁾ comes from an order q = p + 1 fit at the bias bandwidth b, MSE-optimal for it; b needs
 * m⁽q⁺¹⁾, and so on: every stage estimates m⁽ʳ⁾ with the top coefficient of an order r fit at
 *   g^(2r+3) = (2r+1)·V_r / (2·(β_r² + R_r)·n),  β_r = κ_r·m⁽ʳ⁺¹⁾/(r+1)!            [derived]
 * (bias ≈ g·β_r, variance ≈ V_r/(n·g^(2r+1))). `PLUG_IN_STAGES` stages lie below h; the deepest
 * derivative comes from a global polynomial on each whole side (as Imbens & Kalyanaraman's global
 * cubic does for p = 1). The constants V, cₛ, κ_r are measured at the pilot bandwidth with the
 * caller's kernel and variance estimator; each stage's variance (the next stage's R) is its
 * constant scaled by g^(−(2r+1)), the same leading-order scaling, so no residual pass runs at g.
 * The rates are b ∝ n^(−1/(2p+5)) and h ∝ n^(−1/(2p+3)).
 *
 * The per-side version minimises each side's own MSE (its intercept's bias and variance), which
 * avoids the degenerate joint problem when the two sides' biases cancel.
 */
export interface MseBandwidths {
  common: { h: number; b: number };
  perSide: { h: [number, number]; b: [number, number] };
}

/**
 * Plug-in stages below h. With 3 and p = 1: m'' (for h) at b, m''' and m'''' each at its own
 * bandwidth, and m⁽⁵⁾ from global quintics. More stages make a poor global fit matter less (the
 * direct plug-in idea of Ruppert, Sheather & Wand 1995, from memory). Chosen by simulation (tests/reference):
 * with one global stage the Lee-based design's bandwidths came out about twice the asymptotic
 * optimum and its robust intervals covered about 0.90; with three, 0.93. On nearly linear data the
 * deeper stages choose smaller bandwidths than a global pilot would (wider, still valid intervals).
 */
export const PLUG_IN_STAGES = 3;

/** Common and per-side (h, b) for one outcome column; see the comment above `MseBandwidths`. */
export function mseBandwidths(data: OrientedData, order: number, kernel: KernelName, variance: VarianceSettings, pilot: number): MseBandwidths {
  if (data.columns.length !== 1) throw new RangeError('mseBandwidths: expected exactly one outcome column');
  const p = order;
  const q = p + 1;
  const n = data.n;
  const f1 = factorial(p + 1);
  const pilotName = formatBandwidth('pilot', pilot);
  const caps = data.sideRanges;
  const cap = Math.max(caps[0], caps[1]);

  // Deepest stage: a global polynomial of order q + stages on each whole side (uniform weights).
  const deepest = q + PLUG_IN_STAGES;
  const globalFit = fitSides(data, deepest, 'uniform', caps);
  requireUsableFits(globalFit, 'the whole side');
  let next = globalDerivatives(data, globalFit, deepest);
  // Local stages r = deepest − 1 … q + 1, each at its own per-side MSE-optimal bandwidth.
  for (let r = deepest - 1; r > q; r--) {
    const stage = derivativeStage(data, r, kernel, variance, pilot, pilotName);
    const g = [0, 1].map((s) => stageBandwidth(stage, next, s as 0 | 1, r, n, caps[s as 0 | 1])) as [number, number];
    const fits = fitSides(data, r, kernel, g);
    requireUsableFits(fits, formatBandwidth('derivative-stage', Math.min(...g)));
    next = localDerivatives(fits, r, stage, n);
  }

  // b: the order q fit's (p+1)-th derivative. Per side, MSE of each side's m̂⁽ᵖ⁺¹⁾; common, MSE of the
  // jump's bias term Σ ±cₛ·m̂ₛ⁽ᵖ⁺¹⁾/(p+1)! with cₛ = e₀ᵀΓₛ⁻¹ϑₛ of the order p fit at the pilot.
  const stageB = derivativeStage(data, q, kernel, variance, pilot, pilotName);
  const bSides = [0, 1].map((s) => stageBandwidth(stageB, next, s as 0 | 1, q, n, caps[s as 0 | 1])) as [number, number];
  const pFit = fitSides(data, p, kernel, [pilot, pilot]);
  requireUsableFits(pFit, pilotName);
  const biasConst = pFit.map((f) => dot(matrixRow(f.inverse!, 0, p + 1), f.biasMoments));
  const fq1 = factorial(q + 1);
  let bBias = 0;
  let bReg = 0;
  let bVar = 0;
  for (let s = 0; s < 2; s++) {
    const weight = (biasConst[s]! * stageB.kappa[s]!) / (f1 * fq1);
    bBias += SIDE_SIGN[s]! * weight * next.values[s]!;
    bReg += weight * weight * next.variances[s]!;
    bVar += (biasConst[s]! * biasConst[s]! * stageB.v[s]!) / (f1 * f1);
  }
  const bCommon = plugIn((2 * q + 1) * bVar, 2 * (bBias * bBias + bReg) * n, 1 / (2 * q + 3), cap);

  // h: bias ≈ h^(p+1)·Σ ±cₛ mₛ⁽ᵖ⁺¹⁾/(p+1)!, variance V/(nh) with V = n·c·Σ Var(μ̂ₛ(c)).
  const vh = coefficientVariances(data, pFit, 0, () => 1, variance).map((v) => n * pilot * v);
  const rateH = 1 / (2 * p + 3);
  const atCommon = localDerivatives(checkedFits(data, q, kernel, [bCommon, bCommon], 'b'), q, stageB, n);
  let bias = 0;
  let reg = 0;
  for (let s = 0; s < 2; s++) {
    bias += (SIDE_SIGN[s]! * biasConst[s]! * atCommon.values[s]!) / f1;
    reg += (biasConst[s]! * biasConst[s]! * atCommon.variances[s]!) / (f1 * f1);
  }
  const hCommon = plugIn(vh[0]! + vh[1]!, 2 * (p + 1) * (bias * bias + reg) * n, rateH, cap);
  const atSides = localDerivatives(checkedFits(data, q, kernel, bSides, 'b'), q, stageB, n);
  const hSides = [0, 1].map((s) => {
    const bs = (biasConst[s]! * atSides.values[s]!) / f1;
    const rs = (biasConst[s]! * biasConst[s]! * atSides.variances[s]!) / (f1 * f1);
    return plugIn(vh[s]!, 2 * (p + 1) * (bs * bs + rs) * n, rateH, caps[s as 0 | 1]);
  }) as [number, number];

  return { common: { h: hCommon, b: bCommon }, perSide: { h: hSides, b: bSides } };
}

/** Per side, an estimate of m⁽ʳ⁾ and its variance (the regularisation of the next stage). */
interface DerivativeValues {
  values: [number, number];
  variances: [number, number];
}

/**
 * m̂⁽ʳ⁾ = r!·γ̂ᵣ/gʳ from local fits of order r at g, with the variance Vₛ/(n·g^(2r+1)) from the
 * stage's pilot constant — the same leading-order scaling the MSE formula itself uses, so no
 * residual pass is needed at g.
 */
function localDerivatives(fits: readonly [SideFit, SideFit], r: number, stage: { v: number[] }, n: number): DerivativeValues {
  const fr = factorial(r);
  const values = fits.map((f) => (fr * f.coefficients[0]![r]!) / Math.pow(f.h, r)) as [number, number];
  const variances = fits.map((f, s) => stage.v[s]! / (n * Math.pow(f.h, 2 * r + 1))) as [number, number];
  return { values, variances };
}

/**
 * m̂⁽ᴰ⁾ from the global polynomials (uniform weights over each whole side) with the homoskedastic
 * OLS variance σ̂²·[(XᵀX)⁻¹]_DD, σ̂² = RSS/(n − k), RSS from sums (Σy² − γ̂ᵀXᵀy): the deepest stage
 * only regularises, so it need not be heteroskedasticity-robust, and this spares a pass over all
 * rows. With constant weights w, Var(γ̂) = RSS_w·A/(n − k) where A = (XᵀWX)⁻¹ and RSS_w = w·RSS [derived].
 */
function globalDerivatives(data: OrientedData, fits: readonly [SideFit, SideFit], r: number): DerivativeValues {
  const y = data.columns[0]!;
  const squares = [0, 0];
  for (const s of [0, 1] as const) {
    const [lo, hi] = s === 0 ? [0, data.split] : [data.split, data.n];
    squares[s] = sumOfSquares(y, lo, hi);
  }
  const fr = factorial(r);
  const k = r + 1;
  const values = fits.map((f) => (fr * f.coefficients[0]![r]!) / Math.pow(f.h, r)) as [number, number];
  const variances = fits.map((f, s) => {
    const gamma = f.coefficients[0]!;
    const w = kernelWeight(f.kernelCode, 0);
    let fitted = 0;
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) fitted += gamma[a]! * f.gram[a * k + b]! * gamma[b]!;
    const rss = Math.max(0, w * squares[s]! - fitted);
    const scale = fr / Math.pow(f.h, r);
    return f.used > k ? (scale * scale * rss * f.inverse![r * k + r]!) / (f.used - k) : Infinity;
  }) as [number, number];
  return { values, variances };
}

/**
 * Constants of estimating m⁽ʳ⁾ by the top coefficient of an order r fit, measured at the pilot:
 * bias ≈ g·κₛ·mₛ⁽ʳ⁺¹⁾/(r+1)! with κₛ = r!·eᵣᵀΓₛ⁻¹ϑₛ, variance ≈ Vₛ/(n·g^(2r+1)) with
 * Vₛ = n·c^(2r+1)·Var(m̂ₛ⁽ʳ⁾(c)).
 */
function derivativeStage(data: OrientedData, r: number, kernel: KernelName, variance: VarianceSettings, pilot: number, pilotName: string) {
  const fits = checkedFits(data, r, kernel, [pilot, pilot], pilotName);
  const fr = factorial(r);
  const kappa = fits.map((f) => fr * dot(matrixRow(f.inverse!, r, r + 1), f.biasMoments));
  const v = coefficientVariances(data, fits, r, (f) => fr / Math.pow(f.h, r), variance).map((x) => data.n * Math.pow(pilot, 2 * r + 1) * x);
  return { kappa, v };
}

/**
 * Per-side MSE-optimal bandwidth for m⁽ʳ⁾: g^(2r+3) = (2r+1)·V / (2·(β² + R)·n) with β = κ·m⁽ʳ⁺¹⁾/(r+1)!
 * and R = κ²·Var(m̂⁽ʳ⁺¹⁾)/(r+1)!² [derived from MSE(g) = g²β² + V/(n g^(2r+1))].
 */
function stageBandwidth(stage: { kappa: number[]; v: number[] }, next: DerivativeValues, s: 0 | 1, r: number, n: number, cap: number): number {
  const fr1 = factorial(r + 1);
  const beta = (stage.kappa[s]! * next.values[s]) / fr1;
  const reg = (stage.kappa[s]! ** 2 * next.variances[s]) / (fr1 * fr1);
  return plugIn((2 * r + 1) * stage.v[s]!, 2 * (beta * beta + reg) * n, 1 / (2 * r + 3), cap);
}

function checkedFits(data: OrientedData, r: number, kernel: KernelName, h: readonly [number, number], name: string): [SideFit, SideFit] {
  const fits = fitSides(data, r, kernel, h);
  requireUsableFits(fits, name.startsWith('the ') ? name : formatBandwidth(name, Math.min(h[0], h[1])));
  return fits;
}

/** Per side, the variance of scale(fit)·(coefficient `index`) of the fit, residuals from the same fit. */
export function coefficientVariances(
  data: OrientedData,
  fits: readonly [SideFit, SideFit],
  index: number,
  scale: (fit: SideFit) => number,
  variance: VarianceSettings,
): [number, number] {
  const functional = (f: SideFit) => ({ terms: [{ fit: f, row: matrixRow(f.inverse!, index, f.order + 1, scale(f)) }], residualFit: f });
  const cov = functionalCovariance(data, [functional(fits[0]), functional(fits[1])], variance);
  return [cov.sides[0][0]!, cov.sides[1][0]!];
}

/**
 * (numerator / denominator)^exponent, capped at `cap` (the farthest observation) when the
 * denominator vanishes or the value exceeds it.
 * @throws EstimationError `bandwidth_undefined` when the numerator (a variance) is not positive.
 */
export function plugIn(numerator: number, denominator: number, exponent: number, cap: number): number {
  if (!(numerator > 0) || !Number.isFinite(numerator)) {
    throw new EstimationError(
      'bandwidth_undefined',
      'The outcome does not vary near the cutoff, so no bandwidth can be chosen from the data; give a bandwidth instead.',
    );
  }
  if (!(denominator > 0)) return cap;
  const value = Math.pow(numerator / denominator, exponent);
  return Number.isFinite(value) && value < cap ? value : cap;
}

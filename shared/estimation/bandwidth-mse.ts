import { EstimationError } from './errors';
import { formatBandwidth, requireUsableFits } from './fit-checks';
import { fitSides, type SideFit } from './local-polynomial';
import { factorial } from './math';
import { SIDE_SIGN, type OrientedData } from './oriented-data';
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
 * The derivatives come from an order q = p + 1 fit at a bias bandwidth b, itself MSE-optimal for
 * estimating B: the (p+1)-th derivative from an order q fit has bias ≈ b·κₛ·mₛ⁽q⁺¹⁾/(q+1)! and
 * variance ≈ Vᵦ/(n·b^(2p+3)), so
 *   b^(2p+5) = (2p+3)·Vᵦ / (2·(Bᵦ² + Rᵦ)·n)                             [derived]
 * with mₛ⁽q⁺¹⁾ from a global polynomial of order q + 1 on each side (as Imbens & Kalyanaraman's
 * global cubic does for p = 1). V, Vᵦ, cₛ and κₛ are measured at the pilot bandwidth with the
 * caller's kernel and variance estimator, and the rates are b ∝ n^(−1/(2p+5)), h ∝ n^(−1/(2p+3)).
 *
 * The per-side version minimises each side's own MSE (its intercept's bias and variance), which
 * avoids the degenerate joint problem when the two sides' biases cancel.
 */
export interface MseBandwidths {
  common: { h: number; b: number };
  perSide: { h: [number, number]; b: [number, number] };
}

export function mseBandwidths(data: OrientedData, order: number, kernel: KernelName, variance: VarianceSettings, pilot: number): MseBandwidths {
  if (data.columns.length !== 1) throw new RangeError('mseBandwidths: expected exactly one outcome column');
  const p = order;
  const q = p + 1;
  const n = data.n;
  const f1 = factorial(p + 1);
  const f2 = factorial(q + 1);
  const pilotName = formatBandwidth('(pilot)', pilot);

  const pFit = fitSides(data, p, kernel, [pilot, pilot]);
  requireUsableFits(pFit, pilotName);
  const qFit = fitSides(data, q, kernel, [pilot, pilot]);
  requireUsableFits(qFit, pilotName);
  const varLimit = coefficientVariances(data, pFit, 0, () => 1, variance);
  const vh = varLimit.map((v) => n * pilot * v);
  const varDerivPilot = coefficientVariances(data, qFit, p + 1, (f) => f1 / Math.pow(f.h, p + 1), variance);
  const vb = varDerivPilot.map((v) => n * Math.pow(pilot, 2 * p + 3) * v);
  const biasConst = pFit.map((f) => dot(matrixRow(f.inverse!, 0, p + 1), f.biasMoments));
  const kappa = qFit.map((f) => f1 * dot(matrixRow(f.inverse!, p + 1, q + 1), f.biasMoments));

  // Global polynomial of order q + 1 on each whole side (uniform weights) for m⁽q⁺¹⁾.
  const globalFit = fitSides(data, q + 1, 'uniform', data.sideRanges);
  requireUsableFits(globalFit, 'the whole side');
  const top = globalFit.map((f) => (f2 * f.coefficients[0]![q + 1]!) / Math.pow(f.h, q + 1));
  const varTop = coefficientVariances(data, globalFit, q + 1, (f) => f2 / Math.pow(f.h, q + 1), variance);

  const cap = Math.max(data.sideRanges[0], data.sideRanges[1]);
  const rateB = 1 / (2 * p + 5);
  const rateH = 1 / (2 * p + 3);

  // Common b: MSE of the jump's bias term Σ ±cₛ m̂ₛ⁽ᵖ⁺¹⁾/(p+1)!.
  let bBias = 0;
  let bReg = 0;
  let bVar = 0;
  for (let s = 0; s < 2; s++) {
    const weight = (biasConst[s]! * kappa[s]!) / (f1 * f2);
    bBias += SIDE_SIGN[s]! * weight * top[s]!;
    bReg += weight * weight * varTop[s]!;
    bVar += (biasConst[s]! * biasConst[s]! * vb[s]!) / (f1 * f1);
  }
  const bCommon = plugIn((2 * p + 3) * bVar, 2 * (bBias * bBias + bReg) * n, rateB, cap);
  // Per-side b: MSE of each side's m̂ₛ⁽ᵖ⁺¹⁾.
  const bSides = [0, 1].map((s) => {
    const bias = (kappa[s]! * top[s]!) / f2;
    const reg = (kappa[s]! * kappa[s]! * varTop[s]!) / (f2 * f2);
    return plugIn((2 * p + 3) * vb[s]!, 2 * (bias * bias + reg) * n, rateB, data.sideRanges[s as 0 | 1]);
  }) as [number, number];

  // Derivatives m⁽ᵖ⁺¹⁾ from the order q fits at b, and their variances.
  const derivatives = (b: readonly [number, number]) => {
    const fits = fitSides(data, q, kernel, b);
    requireUsableFits(fits, formatBandwidth('b', Math.min(b[0], b[1])));
    const values = fits.map((f) => (f1 * f.coefficients[0]![p + 1]!) / Math.pow(f.h, p + 1));
    const variances = coefficientVariances(data, fits, p + 1, (f) => f1 / Math.pow(f.h, p + 1), variance);
    return { values, variances };
  };
  const atCommon = derivatives([bCommon, bCommon]);
  let bias = 0;
  let reg = 0;
  for (let s = 0; s < 2; s++) {
    bias += (SIDE_SIGN[s]! * biasConst[s]! * atCommon.values[s]!) / f1;
    reg += (biasConst[s]! * biasConst[s]! * atCommon.variances[s]!) / (f1 * f1);
  }
  const hCommon = plugIn(vh[0]! + vh[1]!, 2 * (p + 1) * (bias * bias + reg) * n, rateH, cap);

  const atSides = derivatives(bSides);
  const hSides = [0, 1].map((s) => {
    const bs = (biasConst[s]! * atSides.values[s]!) / f1;
    const rs = (biasConst[s]! * biasConst[s]! * atSides.variances[s]!) / (f1 * f1);
    return plugIn(vh[s]!, 2 * (p + 1) * (bs * bs + rs) * n, rateH, data.sideRanges[s as 0 | 1]);
  }) as [number, number];

  return { common: { h: hCommon, b: bCommon }, perSide: { h: hSides, b: bSides } };
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

import { boundaryConstants, normalCdf, normalQuantile, type KernelName } from '../estimation';

/**
 * Power and minimum detectable effect (MDE) of a cutoff comparison (METHODS §9).
 *
 * SE(ITT)² = DEFF·σ²·(1 − R²) / (n·P·(1 − P)) — the variance of a randomised comparison of n people
 * with a share P eligible, inflated by the design effect DEFF of estimating at a cutoff;
 * MDE(ITT) = M·SE(ITT) with M = z(1 − α/2) + z(power) (2.80 at 5% and 80%); and for a fuzzy design
 * MDE(effect) = MDE(ITT)/|Δ| with Δ the take-up jump (Bloom's no-show logic carried to RD, from
 * memory), so halving the take-up jump quadruples the sample needed.
 *
 * Hand case (stated in the unit test): n = 1,000, P = 0.5, σ = 1, R² = 0, DEFF = 4 (uniform score):
 * SE = √(4/250) = 0.126491, MDE(ITT) = 2.801585·0.126491 = 0.354376, and with Δ = 0.5, MDE(effect) = 0.708751.
 */
export interface PowerInput {
  /** Observations expected near the cutoff (inside the bandwidth), both sides together. */
  n: number;
  /** Share of them on the eligible side, in (0, 1). */
  eligibleShare: number;
  /** Standard deviation of the outcome near the cutoff, outcome units. */
  outcomeSd: number;
  /** Share of outcome variance explained by covariates, in [0, 1). Default 0. */
  rSquared?: number;
  /** Variance inflation of the cutoff comparison over a randomised one (see `schochetDesignEffect`, `localLinearDesignEffect`). */
  designEffect: number;
  /** Take-up jump Δ (fuzzy designs); omit or null for a sharp design. */
  takeUpJump?: number | null;
  /** Two-sided size. Default 0.05. */
  alpha?: number;
  /** Target power. Default 0.8. */
  power?: number;
}

export interface PowerResult {
  alpha: number;
  power: number;
  /** M = z(1 − α/2) + z(power). */
  multiplier: number;
  designEffect: number;
  n: number;
  eligibleShare: number;
  outcomeSd: number;
  rSquared: number;
  takeUpJump: number | null;
  /** Standard error of the effect of being eligible, outcome units. */
  seItt: number;
  /** Smallest effect of being eligible detected with the target power, outcome units. */
  mdeItt: number;
  /** Smallest effect on participants detected with the target power (fuzzy), outcome units. */
  mdeEffect: number | null;
}

/** @example minimumDetectableEffect({ n: 1000, eligibleShare: 0.5, outcomeSd: 1, designEffect: 4 }).mdeItt // ≈ 0.354376 */
export function minimumDetectableEffect(input: PowerInput): PowerResult {
  const r = resolve('minimumDetectableEffect', input);
  if (!(input.n > 0)) throw new RangeError(`minimumDetectableEffect: n must be positive, got ${input.n}`);
  const seItt = Math.sqrt((r.designEffect * r.outcomeSd ** 2 * (1 - r.rSquared)) / (input.n * r.eligibleShare * (1 - r.eligibleShare)));
  const mdeItt = r.multiplier * seItt;
  return { ...r, n: input.n, seItt, mdeItt, mdeEffect: r.takeUpJump === null ? null : mdeItt / Math.abs(r.takeUpJump) };
}

/**
 * Observations needed near the cutoff to detect `targetEffect` (on participants when fuzzy, else
 * of eligibility) with the target power: n = DEFF·σ²(1 − R²)·M² / (P(1 − P)·(target·|Δ|)²).
 * The input's `n` is ignored.
 */
export function sampleForEffect(input: Omit<PowerInput, 'n'>, targetEffect: number): number {
  const r = resolve('sampleForEffect', { ...input, n: 1 });
  if (!(Math.abs(targetEffect) > 0)) throw new RangeError('sampleForEffect: targetEffect must be non-zero');
  const itt = Math.abs(targetEffect) * (r.takeUpJump === null ? 1 : Math.abs(r.takeUpJump));
  return (r.designEffect * r.outcomeSd ** 2 * (1 - r.rSquared) * r.multiplier ** 2) / (r.eligibleShare * (1 - r.eligibleShare) * itt ** 2);
}

/** Power of a two-sided test at size α against a true effect, given its standard error (normal approximation, both tails). */
export function powerAt(effect: number, se: number, alpha = 0.05): number {
  const z = normalQuantile(1 - alpha / 2);
  const d = Math.abs(effect) / se;
  return normalCdf(d - z) + normalCdf(-d - z);
}

/**
 * Schochet's design effect of a full-sample linear RD against a randomised trial of the same size,
 * DEFF = 1/(1 − ρ²), ρ the correlation of eligibility and score (Schochet 2008, NCEE 2008-4026;
 * formula from memory, reproducing the verified Table 4.2 values 2.75 for a normal and 4.00 for a
 * uniform score with the cutoff at the median):
 * - normal score, cutoff at the (1 − P) quantile z: ρ = φ(z)/√(P(1 − P));
 * - uniform score: ρ² = 3P(1 − P) [derived: Cov(Z, U) = P(1 − P)/2, Var U = 1/12].
 */
export function schochetDesignEffect(distribution: 'normal' | 'uniform', eligibleShare: number): number {
  if (!(eligibleShare > 0 && eligibleShare < 1)) throw new RangeError(`schochetDesignEffect: eligibleShare must be in (0, 1), got ${eligibleShare}`);
  const pq = eligibleShare * (1 - eligibleShare);
  const z = normalQuantile(1 - eligibleShare);
  const density = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
  const rho2 = distribution === 'uniform' ? 3 * pq : density ** 2 / pq;
  return 1 / (1 - rho2);
}

/**
 * Design effect of a local-linear estimate at the cutoff relative to a randomised comparison of
 * the observations inside the bandwidth: the boundary variance constant C₂ of the kernel
 * (METHODS §3a, derived; with a locally flat score density, V = C₂σ²(1/n₊ + 1/n₋) and the
 * randomised comparison has σ²(1/n₊ + 1/n₋)). Triangular 4.8, Epanechnikov 4.498, uniform 4.0 —
 * the uniform value equals Schochet's 4.00, as it should. Conventional variance: robust
 * bias-corrected intervals are somewhat wider.
 */
export function localLinearDesignEffect(kernel: KernelName): number {
  return boundaryConstants(kernel).c2;
}

function resolve(fn: string, input: PowerInput) {
  const alpha = input.alpha ?? 0.05;
  const power = input.power ?? 0.8;
  const rSquared = input.rSquared ?? 0;
  const takeUpJump = input.takeUpJump ?? null;
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`${fn}: alpha must be in (0, 1)`);
  if (!(power > 0 && power < 1)) throw new RangeError(`${fn}: power must be in (0, 1)`);
  if (!(rSquared >= 0 && rSquared < 1)) throw new RangeError(`${fn}: rSquared must be in [0, 1)`);
  if (!(input.eligibleShare > 0 && input.eligibleShare < 1)) throw new RangeError(`${fn}: eligibleShare must be in (0, 1)`);
  if (!(input.outcomeSd >= 0)) throw new RangeError(`${fn}: outcomeSd must be non-negative`);
  if (!(input.designEffect > 0)) throw new RangeError(`${fn}: designEffect must be positive`);
  if (takeUpJump !== null && !(Math.abs(takeUpJump) > 0)) throw new RangeError(`${fn}: takeUpJump must be non-zero`);
  const multiplier = normalQuantile(1 - alpha / 2) + normalQuantile(power);
  return { alpha, power, rSquared, takeUpJump, multiplier, designEffect: input.designEffect, eligibleShare: input.eligibleShare, outcomeSd: input.outcomeSd };
}

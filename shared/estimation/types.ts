/**
 * Public types of the estimation engine. Everything a caller passes in or gets back is declared
 * here; results are plain JSON-serialisable objects (no typed arrays, no NaN, no Infinity).
 *
 * Sign convention everywhere: a jump is the limit on the eligible side minus the limit on the
 * ineligible side. A score exactly at the cutoff is eligible.
 */
import type { EligibleSide } from '../schemas/program';

export type { EligibleSide };

/** Kernel weight K(u) on |u| ≤ 1 (see `kernels.ts`). */
export type KernelName = 'triangular' | 'epanechnikov' | 'uniform';

/**
 * How the variance of each jump is estimated.
 * - `hc0`…`hc3`: heteroskedasticity-robust sandwich from the fit's residuals (MacKinnon & White 1985);
 *   with a cluster column, `hc0` and `hc1` give the cluster-robust sandwich.
 * - `nearest-neighbour`: residual variance from the J nearest scores on the same side
 *   (Calonico, Cattaneo & Titiunik 2014; Abadie & Imbens matching variance). Independent data only.
 */
export type VarianceKind = 'hc0' | 'hc1' | 'hc2' | 'hc3' | 'nearest-neighbour';

/**
 * Data-driven bandwidth rules.
 * - `mse`: MSE-optimal common bandwidth (plug-in in the manner of Calonico, Cattaneo & Titiunik 2014).
 * - `mse-per-side`: each side's own MSE-optimal bandwidth.
 * - `coverage`: the MSE bandwidth shrunk by n^(−p/((3+p)(3+2p))) (Calonico, Cattaneo & Farrell).
 * - `ik`: Imbens & Kalyanaraman (2012), local linear only.
 */
export type BandwidthRule = 'mse' | 'mse-per-side' | 'coverage' | 'ik';

/** Columns of one analysis, all the same length, one entry per observation. */
export interface DiscontinuityData {
  /** Running variable (score), in score units. */
  score: Float64Array;
  /** Outcome. */
  outcome: Float64Array;
  /** Program received, 0 or 1. Present ⇒ fuzzy design; absent ⇒ sharp design. */
  takeUp?: Float64Array;
  /** Cluster labels (e.g. office or region) as integer codes; present ⇒ cluster-robust variance. */
  cluster?: Int32Array;
}

/** Options of `estimateDiscontinuity`. Omitted options take the defaults listed. */
export interface DiscontinuityOptions {
  /** Score at which eligibility changes, in score units. */
  cutoff: number;
  /** Which side qualifies; a score exactly at the cutoff is eligible. */
  eligibleSide: EligibleSide;
  /** Default `triangular`. */
  kernel?: KernelName;
  /** Local polynomial order p: 0, 1 or 2. Default 1. */
  order?: 0 | 1 | 2;
  /** A bandwidth h in score units (the same on both sides), or a rule. Default `{ rule: 'mse' }`. */
  bandwidth?: number | { rule: BandwidthRule };
  /**
   * Bias bandwidth b in score units for the bias correction (order p + 1 fit). Default: chosen by
   * the bandwidth rule, or equal to h when h is given (then the robust estimate is the order p + 1
   * fit at h).
   */
  biasBandwidth?: number;
  /**
   * Default `hc3` without clusters (its intervals kept closest to nominal in our small-sample
   * simulations, tests/reference/lee-design.test.ts), `hc1` with clusters.
   */
  variance?: VarianceKind;
  /** Neighbours J of the nearest-neighbour variance. Default 3. */
  neighbours?: number;
  /** Confidence level of every interval, in (0, 1). Default 0.95. */
  level?: number;
}

/** The options as the engine applied them: everything needed to reproduce the result. */
export interface ResolvedOptions {
  cutoff: number;
  eligibleSide: EligibleSide;
  kernel: KernelName;
  order: 0 | 1 | 2;
  /** The bandwidth as requested: a number in score units or a rule. */
  bandwidth: number | { rule: BandwidthRule };
  /** The bias bandwidth as requested, or null when chosen by the engine. */
  biasBandwidth: number | null;
  variance: VarianceKind;
  /** Neighbours J (used only by `nearest-neighbour`). */
  neighbours: number;
  level: number;
  /** Whether a cluster column was given. */
  clustered: boolean;
}

/** A point estimate with its standard error, normal-based interval and two-sided p-value. */
export interface Inference {
  estimate: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  /** estimate / se (0 when both are 0). */
  z: number;
  /** Two-sided p-value of estimate = 0 against the standard normal. */
  p: number;
}

/** A jump (eligible minus ineligible) with conventional and robust bias-corrected inference. */
export interface JumpResult {
  /** Conventional estimate at h. */
  jump: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  p: number;
  /** Bias-corrected estimate (order p + 1 fit at b) with the robust standard error. */
  robust: Inference;
}

/** The take-up jump and its strength as an instrument. */
export interface FirstStageResult extends JumpResult {
  /** Squared robust t of the take-up jump: (jump / se)². */
  f: number;
  /** F below the Staiger–Stock rule of thumb of 10. */
  belowRuleOfThumb: boolean;
  /** F below Stock–Yogo's 10%-maximal-size critical value for one instrument (16.38). */
  belowStockYogo: boolean;
}

/** The effect on participants at the cutoff (complier effect) — the jump itself in a sharp design. */
export interface EffectResult {
  estimate: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  p: number;
  robust: Inference;
}

/** Bandwidths used on each side, in score units. */
export interface SideBandwidths {
  /** Main bandwidth h (order p fit). */
  h: number;
  /** Bias bandwidth b (order p + 1 fit). */
  b: number;
}

export interface BandwidthResult {
  /** `given` when the caller fixed h. */
  rule: BandwidthRule | 'given';
  /**
   * The common h and b in score units. With `mse-per-side` the sides differ; h and b are then
   * the smaller side's values (the narrowest window used) and `sides` has both.
   */
  h: number;
  b: number;
  sides: { ineligible: SideBandwidths; eligible: SideBandwidths };
  /** Pilot quantities of a data-driven rule (null when h was given). */
  pilot: BandwidthPilot | null;
}

/** What a data-driven bandwidth rule started from (for the annex). */
export interface BandwidthPilot {
  /** Pilot bandwidth 1.84·sd(score)·n^(−1/5), widened when a side had too few observations. */
  h: number;
  /** Fuzzy designs: the ratio at the pilot bandwidth used to combine outcome and take-up. */
  ratio: number | null;
}

/** Observation counts. */
export interface SampleSizes {
  /** All observations on the ineligible / eligible side. */
  ineligible: number;
  eligible: number;
  /** Observations with positive kernel weight at h on each side. */
  usedIneligible: number;
  usedEligible: number;
  /** Observations with positive kernel weight at b on each side. */
  usedBiasIneligible: number;
  usedBiasEligible: number;
  /** Clusters with an observation inside max(h, b); null without a cluster column. */
  clusters: number | null;
}

/** Fitted limits at the cutoff from each side (conventional, order p at h). */
export interface SideLimits {
  ineligible: { outcome: number; takeUp: number | null };
  eligible: { outcome: number; takeUp: number | null };
}

/** The result of `estimateDiscontinuity`. JSON-serialisable. */
export interface DiscontinuityEstimate {
  engineVersion: string;
  design: 'sharp' | 'fuzzy';
  options: ResolvedOptions;
  n: SampleSizes;
  bandwidth: BandwidthResult;
  limits: SideLimits;
  /** Fuzzy designs only. */
  firstStage: FirstStageResult | null;
  /** Jump in the outcome (reduced form). */
  itt: JumpResult;
  /** ITT / first stage in a fuzzy design; the ITT itself in a sharp design. */
  effect: EffectResult;
  /** Conventional covariance of the ITT and first-stage jumps (fuzzy; 0 in a sharp design). */
  ittFirstStageCovariance: number;
}

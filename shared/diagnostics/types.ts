/**
 * Public types of the diagnostics. `DiagnosticsReport` is what `runDiagnostics` returns and what the
 * monthly recompute job stores, the dashboards read and the annex prints: keep it stable (add
 * fields, never rename or change a meaning). Every value is JSON-serialisable: no typed arrays, no
 * NaN, no Infinity (unbounded interval ends are null).
 *
 * Conventions: "estimate" columns are the engine's conventional point estimate, intervals are its
 * robust bias-corrected ones (Calonico, Cattaneo & Titiunik 2014) and p the robust p-value, unless a
 * field says otherwise. Jumps are eligible minus ineligible. Score positions are in score units.
 */
import type { Caveat } from '../caveats/types';
import type { DiscontinuityData, DiscontinuityOptions, KernelName } from '../estimation';
import type { BinnedSeries } from './bins';
import type { HeapingResult } from './heaping';
import type { LocalRandomizationResult } from './local-randomization';
import type { LocalPolynomialDensityResult } from './density-local-polynomial';
import type { McCraryResult } from './density-mccrary';
import type { PowerResult } from './power';
import type { TfBasis } from './tf-adjustment';

/** A pre-determined covariate (measured before eligibility could change it). */
export interface NamedColumn {
  /** Machine key or column name, used in results and caveats. */
  name: string;
  /** Plain label for caveat messages, e.g. "household size". Default: the name. */
  label?: string;
  values: Float64Array;
}

export interface DiagnosticsData extends DiscontinuityData {
  covariates?: readonly NamedColumn[];
}

export interface DiagnosticsOptions extends DiscontinuityOptions {
  /** Word for the people in messages, plural, e.g. "households". Default "applicants". */
  population?: string;
  /** Outcomes analysed for this program in the same run (for the multiple-testing caveat). Default 1. */
  outcomesTested?: number;
  /** Effect on participants (outcome units) the power calculation should find the sample for. */
  targetEffect?: number;
  /** Permutations of the local-randomization analysis. Default 2,000. */
  permutations?: number;
  /** Start value of its random stream. Default 1. */
  start?: number;
  /**
   * Set when the scores given are distances from the cutoff (score − cutoff) and `cutoff` is 0: the
   * cutoff in the agency's units (one cohort) or null (cohorts with different cutoffs pooled). The
   * round-value check then runs on the agency's scores and caveats name them; every position in
   * the report stays a distance, as given.
   */
  centredFrom?: number | null;
}

/** One point of a density curve for plotting. */
export interface DensityPoint {
  score: number;
  density: number;
}

export interface DensityPlot {
  /** McCrary histogram cells: bin midpoint, height (density per score unit), count. */
  histogram: { score: number; height: number; count: number; side: 'ineligible' | 'eligible' }[];
  binWidth: number;
  /** Local-linear smooth of the histogram on each side (McCrary's curve), from the cutoff outward. */
  ineligible: DensityPoint[];
  eligible: DensityPoint[];
}

export interface DensityDiagnostics {
  mccrary: McCraryResult;
  localPolynomial: LocalPolynomialDensityResult;
  plot: DensityPlot;
}

export interface BalanceRow {
  covariate: string;
  /** Jump in the covariate at the cutoff (covariate units). */
  jump: number;
  ciLow: number;
  ciHigh: number;
  /** Robust t = bias-corrected jump / robust SE. */
  t: number;
  p: number;
  /** Holm-adjusted p over all covariates (the joint summary: any below 0.05 is a joint failure). */
  pAdjusted: number;
  /** The covariate's own bandwidth from the same rule, score units. */
  h: number;
}

export interface PlaceboRow {
  /** The false cutoff, score units. */
  cutoff: number;
  /** Which side of the real cutoff it lies on (only that side's data are used). */
  side: 'ineligible' | 'eligible';
  /** Jump in the outcome at the false cutoff (expected to be null). */
  estimate: number;
  ciLow: number;
  ciHigh: number;
  p: number;
  /** Holm-adjusted p over all placebo cutoffs. */
  pAdjusted: number;
  h: number;
}

export interface SensitivityRow {
  /** Bandwidth, score units. */
  h: number;
  /** h as a multiple of the main bandwidth; null for the coverage-error-optimal row. */
  multiple: number | null;
  /** `grid` rows scale the main h and b together; `coverage` is the coverage-error-optimal rule. */
  rule: 'grid' | 'coverage';
  /** Effect on participants (fuzzy) or jump in the outcome (sharp). */
  estimate: number;
  ciLow: number;
  ciHigh: number;
  p: number;
}

export interface DonutRow {
  /** Observations with |score − cutoff| < radius are dropped, score units. */
  radius: number;
  dropped: number;
  estimate: number;
  ciLow: number;
  ciHigh: number;
  p: number;
  h: number;
}

export interface WeakFirstStageResult {
  /** First-stage F (the engine's): (take-up jump / se)². */
  f: number;
  /** Take-up jump. */
  firstStage: number;
  /** tF 95% interval for the effect on participants (Lee, McCrary, Moreira & Porter 2022); null ends when unbounded. */
  tfCiLow: number | null;
  tfCiHigh: number | null;
  /** c(F) replacing 1.96, and c(F)/1.96; null when unbounded. */
  tfCritical: number | null;
  tfFactor: number | null;
  /** Which kind of c(F) value this is (verified point, interpolation, from memory …). */
  tfBasis: TfBasis;
  /**
   * Anderson–Rubin set at the analysis level (valid at any F): the interval [arCiLow, arCiHigh]
   * when `arShape` is `interval`; everything outside (arCiLow, arCiHigh) when `two-rays`; nulls
   * when `everything`.
   */
  arCiLow: number | null;
  arCiHigh: number | null;
  /** `interval`, or for a weak take-up jump `two-rays` (everything outside a gap) or `everything`. */
  arShape: 'interval' | 'two-rays' | 'everything';
  /** F below 10 (Staiger–Stock rule of thumb). */
  belowRuleOfThumb: boolean;
  /** F below 16.38 (Stock & Yogo 2005, Table 5.2, one instrument, 10% maximal size; from memory). */
  belowStockYogo: boolean;
}

export interface ChartSeries {
  evenlySpaced: BinnedSeries;
  quantileSpaced: BinnedSeries;
  /** The estimate's own local polynomial on each side, within the bandwidth. */
  fit: { ineligible: { score: number; value: number }[]; eligible: { score: number; value: number }[] };
}

export interface BinsDiagnostics {
  outcome: ChartSeries;
  /** Fuzzy designs only. */
  takeUp: ChartSeries | null;
}

export interface PowerDiagnostics extends PowerResult {
  /** Where the design effect came from. */
  designEffectBasis: string;
  kernel: KernelName;
  /** The requested target effect on participants (or of eligibility when sharp), and the observations near the cutoff it needs. */
  targetEffect: number | null;
  nForTarget: number | null;
}

/** What `runDiagnostics` returns. Diagnostics that could not be computed are null (or empty) and named in a `check_not_run` caveat. */
export interface DiagnosticsReport {
  density: DensityDiagnostics | null;
  heaping: HeapingResult | null;
  balance: BalanceRow[];
  placebo: PlaceboRow[];
  sensitivity: SensitivityRow[];
  donut: DonutRow[];
  /** Fuzzy designs only (null when sharp). */
  weakFirstStage: WeakFirstStageResult | null;
  localRandomization: LocalRandomizationResult | null;
  bins: BinsDiagnostics | null;
  power: PowerDiagnostics | null;
  caveats: Caveat[];
}

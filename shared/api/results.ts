/**
 * The results contract: what recompute stores and what the dashboards, the Excel annex and the
 * director's e-mail read. Keep these shapes stable; add optional fields rather than change them.
 * Documented in DEVELOPERS.md, "Results contract".
 *
 * Sign convention: every jump is the eligible side's limit minus the ineligible side's.
 * Headline figures (dashboards, e-mail) are the conventional point estimate with the robust
 * bias-corrected interval (Calonico, Cattaneo & Titiunik 2014); both are stored.
 */
import type { DeviationDto } from './designs';
import type { RunDto } from './runs';
import type { GoodDirection, VariableKind } from '../schemas/program';

/** A point estimate with its standard error, interval at the design's level and two-sided p-value. */
export interface InferenceDto {
  estimate: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  p: number;
}

/** Conventional inference at bandwidth h and robust bias-corrected inference. */
export interface EstimateDto {
  conventional: InferenceDto;
  robust: InferenceDto;
}

/** The take-up jump, with its strength as an instrument. */
export interface FirstStageDto extends EstimateDto {
  /** First-stage F = (jump / robust se)². */
  f: number;
  /** F below 10 (Staiger–Stock rule of thumb). */
  weak: boolean;
}

/** What a result covers: one monthly cohort, or a pooled window of recent cohorts. */
export interface ResultScopeDto {
  kind: 'cohort' | 'window';
  /**
   * Stable key: `cohort:YYYY-MM`, `window:last-N` (the N latest cohorts) or `window:previous-N`
   * (the N cohorts before the latest, the baseline of change alerts).
   */
  key: string;
  firstPeriod: string;
  lastPeriod: string;
  /** Cohorts in the scope (1 for a cohort). */
  cohortCount: number;
  /** Each cohort's period and the cutoff in force for it. */
  periods: Array<{ period: string; cutoff: number }>;
}

/**
 * How a pooled window was estimated. Each cohort's score is centred on its own cutoff and the
 * pooled jump at 0 is read as a weighted average of the cutoff-specific effects (Cattaneo, Keele,
 * Titiunik & Vazquez-Bare 2016, "Interpreting regression discontinuity designs with multiple cutoffs").
 */
export interface PoolingDto {
  method: 'normalised-score';
  /** Plain statement of the interpretation, for screens, annex and e-mail. */
  statement: string;
  /**
   * Per distinct cutoff: the share of the window's observations within the bandwidth around it
   * (an estimate of the density weights). With one cutoff the share is 1.
   */
  weights: Array<{ cutoff: number; periods: string[]; share: number }>;
}

/** Bandwidths used, score units. */
export interface BandwidthDto {
  rule: string;
  h: number;
  b: number;
  hIneligible: number;
  hEligible: number;
}

export interface SampleSizeDto {
  ineligible: number;
  eligible: number;
  /** With positive kernel weight at h. */
  usedIneligible: number;
  usedEligible: number;
  clusters: number | null;
  /** Left out by the donut (|score − cutoff| < radius). */
  droppedByDonut: number;
}

/** Fitted limits at the cutoff from each side (conventional, at h): outcome and take-up just below and just above. */
export interface SideLimitsDto {
  ineligible: { outcome: number; takeUp: number | null };
  eligible: { outcome: number; takeUp: number | null };
}

/** A warning drawn from the diagnostics, in plain words (the rules live in `shared/caveats/`). */
export interface CaveatDto {
  code: string;
  severity: CaveatSeverity;
  /** One or two plain sentences for managers and directors. */
  message: string;
  /** The figures behind it, e.g. `{ f: 4.2 }`. */
  values: Record<string, number | string | boolean | null>;
}
/** Severities as in the caveat rule table (shared/caveats/), least to most serious. */
export type CaveatSeverity = 'info' | 'caution' | 'serious';

/** A manager's acknowledgement of a caveat (kept across recomputes that keep the caveat). */
export interface CaveatAcknowledgementDto {
  id: number;
  caveatCode: string;
  comment: string;
  acknowledgedBy: string;
  acknowledgedAt: string;
}

/** Where a result came from: enough to reproduce it. */
export interface ProvenanceDto {
  runId: number;
  computedAt: string;
  designId: number;
  designVersion: number;
  designVersionId: number;
  engineVersion: string;
  diagnosticsVersion: string | null;
  appVersion: string;
  /** The accepted extract of every cohort used, with its SHA-256. */
  extracts: Array<{ period: string; extractId: number; sha256: string }>;
}

export interface OutcomeRefDto {
  key: string;
  label: string;
  unit: string;
  kind: VariableKind;
  goodDirection: GoodDirection;
}

/** One stored result: one outcome in one cohort or window under one design version. */
export interface OutcomeResultDto {
  id: number;
  programId: number;
  outcome: OutcomeRefDto;
  scope: ResultScopeDto;
  /** `not-estimable`: the data admit no estimate (see `problem`); figures are null. */
  status: 'ok' | 'not-estimable';
  problem: { code: string; message: string } | null;
  /** Confidence level of every interval, e.g. 0.95. */
  level: number;
  firstStage: FirstStageDto | null;
  /** Effect of being eligible (jump in the outcome). */
  itt: EstimateDto | null;
  /** Effect on participants at the cutoff (complier effect) = ITT / first stage. */
  effect: EstimateDto | null;
  bandwidth: BandwidthDto | null;
  n: SampleSizeDto | null;
  /** Windows only. */
  pooling: PoolingDto | null;
  /** Fitted limits either side of the cutoff (take-up of those just eligible and just not); absent in results stored before it was kept. */
  limits?: SideLimitsDto | null;
  caveats: CaveatDto[];
  /**
   * True when the inputs changed since (a newer extract, design version or engine) and the
   * recompute has not yet replaced this result, or the last recompute failed.
   */
  stale: boolean;
  staleReason: string | null;
  /** Deviations from the locked plan that apply to this result's design version. */
  deviationCount: number;
  /** Acknowledgements of this result's caveats (same scope, outcome and caveat code). */
  acknowledgements?: CaveatAcknowledgementDto[];
  /** The cohort's extract was accepted after the design was locked (a pre-registered analysis). */
  preRegistered: boolean;
  provenance: ProvenanceDto;
}

/** A bin of the RD plot: mean outcome and take-up of the observations in a score interval. */
export interface BinDto {
  side: 'ineligible' | 'eligible';
  /** Score interval, centred on the cutoff (score − cutoff), score units. */
  low: number;
  high: number;
  n: number;
  outcomeMean: number | null;
  takeUpMean: number | null;
}

/** One result with everything behind it (cohort detail, annex). */
export interface OutcomeResultDetailDto extends OutcomeResultDto {
  /** The diagnostics object as `shared/diagnostics` returns it (JSON), or null when not run. */
  diagnostics: Record<string, unknown> | null;
  bins: BinDto[];
  deviations: DeviationDto[];
}

/**
 * A change alert: the latest cohort differs from the previous window by more than the joint
 * uncertainty allows, or a new serious caveat appeared.
 */
export type ChangeAlertDto =
  | {
      kind: 'difference';
      outcomeKey: string;
      quantity: 'effect' | 'firstStage';
      period: string;
      /** Scope key of the baseline, e.g. `window:previous-3`. */
      baselineKey: string;
      cohortEstimate: number;
      baselineEstimate: number;
      difference: number;
      /** √(se_cohort² + se_baseline²) with the robust standard errors. */
      seDifference: number;
      z: number;
      p: number;
      /** Significance level of the test (1 − design level). */
      alpha: number;
      /** The test in plain words, with its assumption. */
      test: string;
    }
  | {
      kind: 'new-caveat';
      outcomeKey: string;
      period: string;
      caveat: CaveatDto;
    };

/** Per outcome in the overview: the latest cohort, the one before, and the pooled windows. */
export interface OutcomeOverviewDto {
  outcome: OutcomeRefDto;
  latest: OutcomeResultDto | null;
  previous: OutcomeResultDto | null;
  windows: OutcomeResultDto[];
  /** Latest minus previous cohort (conventional estimates); null when either is missing. */
  changeFromPrevious: { effect: number | null; firstStage: number | null; itt: number | null } | null;
}

/** `GET /api/programs/:programId/results`: the latest results of the program's primary design. */
export interface ResultsOverviewDto {
  programId: number;
  programName: string;
  design: { id: number; name: string; version: number; locked: boolean; deviationCount: number } | null;
  latestPeriod: string | null;
  outcomes: OutcomeOverviewDto[];
  alerts: ChangeAlertDto[];
  /** Any shown result is stale. */
  stale: boolean;
  lastRun: RunDto | null;
  /** The standing cautions every results screen and message shows. */
  cautions: string[];
}

/** One cohort's point of a trend (compact). */
export interface TrendPointDto {
  period: string;
  cutoff: number;
  resultId: number;
  status: 'ok' | 'not-estimable';
  firstStage: InferenceDto | null;
  itt: InferenceDto | null;
  /** Conventional point estimate with the robust interval (the headline). */
  effect: InferenceDto | null;
  /** Take-up just below and just above the cutoff (fitted limits, shares 0–1); null when not stored. */
  takeUp?: { ineligible: number | null; eligible: number | null } | null;
  nUsed: number | null;
  worstCaveat: CaveatSeverity | null;
  stale: boolean;
}

/** `GET /api/programs/:programId/results/trend?outcome=KEY` */
export interface CohortTrendDto {
  programId: number;
  outcome: OutcomeRefDto;
  designVersion: number | null;
  points: TrendPointDto[];
  windows: OutcomeResultDto[];
}

/** `GET /api/programs/:programId/results/cohorts/:period` */
export interface CohortDetailDto {
  programId: number;
  period: string;
  cutoff: number | null;
  outcomes: OutcomeResultDetailDto[];
}

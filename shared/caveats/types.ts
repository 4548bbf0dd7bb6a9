import type { DiagnosticsReport } from '../diagnostics/types';
import type { EligibleSide } from '../schemas/program';

export const CAVEAT_SEVERITIES = ['info', 'caution', 'serious'] as const;
export type CaveatSeverity = (typeof CAVEAT_SEVERITIES)[number];

/** The numbers (and names) that made a caveat fire; shown in the message and stored beside it. */
export type CaveatValues = Record<string, number | string>;

/** One caveat attached to a result. `code` is stable: screens, acknowledgements and the annex key on it. */
export interface Caveat {
  code: string;
  severity: CaveatSeverity;
  message: string;
  values: CaveatValues;
}

/** The main estimate as the caveats need it (null when it could not be computed). */
export interface EstimateSummary {
  /** Effect of being eligible (jump in the outcome). */
  itt: number;
  /** Effect on participants (fuzzy) or the jump itself (sharp), with its robust interval and p. */
  effect: number;
  effectCiLow: number;
  effectCiHigh: number;
  effectP: number;
  /** Take-up jump (fuzzy), else null. */
  firstStage: number | null;
}

/** A diagnostic that could not be computed, and why (plain sentence). */
export interface CheckNotRun {
  check: string;
  code: string;
  reason: string;
}

/** Everything the rules look at. */
export interface CaveatInput {
  design: 'sharp' | 'fuzzy';
  cutoff: number;
  /**
   * Set when the scores are distances from the cutoff (score − cutoff, `cutoff` 0), as the
   * recompute passes them: the cutoff in the agency's units for one cohort, or null when several
   * cutoffs are pooled. Messages then speak in the agency's units or of distances.
   */
  centredFrom?: number | null;
  eligibleSide: EligibleSide;
  /** Plural noun for the people, e.g. "households". */
  population: string;
  /** Outcomes analysed in the same run. */
  outcomesTested: number;
  /** Plain labels of covariates by name (falls back to the name). */
  covariateLabels: Record<string, string>;
  estimate: EstimateSummary | null;
  findings: Omit<DiagnosticsReport, 'caveats'>;
  notRun: readonly CheckNotRun[];
}

/** A row of the rule table (`rules.ts`). */
export interface CaveatRule {
  code: string;
  severity: CaveatSeverity;
  /** Shown whatever the data say (the standing cautions). */
  standing: boolean;
  /** When the rule fires, in plain words, for reviewers of the table. */
  trigger: string;
  /** One entry per caveat to show (usually zero or one); each holds the numbers that triggered it. */
  find(input: CaveatInput): CaveatValues[];
  /** The message, in one or two plain sentences, from those numbers. */
  message(values: CaveatValues, input: CaveatInput): string;
}

import type { BinDto, CaveatDto } from '@shared/api/results';
import type { DesignSettings } from '@shared/schemas/design';
import type { EligibleSide } from '@shared/schemas/program';
import type { StoredFigures } from '../../entities/estimate-result.entity';
import type { PlannedScope } from './scope-plan';

/** The observations of one scope, ready for the engine (one entry per applicant). */
export interface ScopeData {
  n: number;
  /** score − the cutoff of the applicant's own cohort, score units (the pooled cutoff is 0). */
  centred: Float64Array;
  /** Cutoff of the applicant's cohort (pooling weights). */
  cutoffOf: Float64Array;
  /** 0/1, NaN where missing; null when no extract mapped take-up. */
  takeUp: Float64Array | null;
  /** By outcome key; NaN where missing. */
  outcomes: Record<string, Float64Array>;
  /** By covariate key; NaN where missing. */
  covariates: Record<string, Float64Array>;
  /** Cluster codes ≥ 1, −1 where missing; null when no extract mapped a cluster. */
  cluster: Int32Array | null;
}

/** One outcome's result in one scope, as stored. */
export interface AnalyzedOutcome {
  outcomeKey: string;
  status: 'ok' | 'not-estimable';
  figures: StoredFigures;
  caveats: CaveatDto[];
  diagnostics: Record<string, unknown> | null;
  bins: BinDto[];
}

export interface AnalyzeInput {
  scope: PlannedScope;
  data: ScopeData;
  settings: DesignSettings;
  eligibleSide: EligibleSide;
  /** Words for caveat messages: the program's people and covariate labels. */
  labels?: { population: string; covariates: Record<string, string> };
}

/** The estimation engine, diagnostics and caveats behind one interface, with their versions. */
export interface Analyzer {
  engineVersion: string;
  diagnosticsVersion: string | null;
  /** Scopes it can analyse at once (worker threads); 1 when absent. */
  parallelism?: number;
  analyze(input: AnalyzeInput): AnalyzedOutcome[] | Promise<AnalyzedOutcome[]>;
}

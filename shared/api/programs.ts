import type { CovariateDefinitionInput, CutoffChange, EligibleSide, OutcomeDefinitionInput, Period } from '../schemas/program';

export interface CutoffChangeDto extends CutoffChange {
  id: number;
}

export interface OutcomeDefinitionDto extends OutcomeDefinitionInput {
  id: number;
}

export interface CovariateDefinitionDto extends CovariateDefinitionInput {
  id: number;
}

/** One row of `GET /api/programs`. */
export interface ProgramSummaryDto {
  id: number;
  slug: string;
  name: string;
  description: string;
  scoreLabel: string;
  scoreUnit: string;
  eligibleSide: EligibleSide;
  /** The cutoff in force for the latest cohort on record, or the latest scheduled one. */
  currentCutoff: number | null;
  cohortCount: number;
  /** Latest cohort period on record, `YYYY-MM`. */
  latestPeriod: Period | null;
  /** Plural noun for the people the program serves, e.g. "households" (summary sentences). */
  populationLabel?: string;
  /** What taking part is called, as a verb phrase, e.g. "take the credit". */
  takeUpPhrase?: string;
}

/** `GET /api/programs/:programId` */
export interface ProgramDetailDto extends ProgramSummaryDto {
  scoreMin: number;
  scoreMax: number;
  timeZone: string;
  cutoffSchedule: CutoffChangeDto[];
  outcomes: OutcomeDefinitionDto[];
  covariates: CovariateDefinitionDto[];
}

/** A page of a longer list; `page` counts from 1. */
export interface ListDto<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

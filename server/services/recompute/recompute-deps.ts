import type { DataSource } from 'typeorm';
import type { Config } from '../../config/env';
import type { Logger } from '../../lib/logger';
import type { Analyzer, ScopeData } from './analyzer';
import type { CohortInput } from './scope-plan';

/** Cohorts loaded together: one set of arrays, each cohort a contiguous segment of it. */
export interface LoadedCohorts {
  data: ScopeData;
  segments: Array<{ period: string; offset: number; length: number }>;
}

/** Loads the accepted observations of some cohorts of a program (scores centred on each cohort's cutoff). */
export type CohortLoader = (ds: DataSource, programId: number, cohorts: readonly CohortInput[]) => Promise<LoadedCohorts>;

/** What a recompute needs; jobs, routes and tests build it once. */
export interface RecomputeDeps {
  dataSource: DataSource;
  config: Config;
  logger: Logger;
  analyzer: Analyzer;
  loadCohorts: CohortLoader;
  now: () => Date;
  /** First retry delay; later ones grow ×4 (`backoff.ts`). */
  retryBaseMs: number;
  /** Called after each scope is computed (progress already recorded): a seam for tests and the benchmark. */
  afterScope?: (info: { runId: number; done: number; total: number; scopeKey: string }) => Promise<void> | void;
}

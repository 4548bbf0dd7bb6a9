import type { DataSource } from 'typeorm';
import type { Config } from '../../config/env';
import type { Logger } from '../../lib/logger';
import { observationCohortLoader } from '../observations.service';
import { pooledEngineAnalyzer } from './analyzer-pool';
import type { RecomputeDeps } from './recompute-deps';

/** First retry 30 s after a failure, then 2 min, 8 min (`backoff.ts`). */
export const DEFAULT_RETRY_BASE_MS = 30_000;

/** One pool of analysis workers per process, shared by every recompute it runs. */
let sharedAnalyzer: ReturnType<typeof pooledEngineAnalyzer> | null = null;

/** The recompute as the app runs it: the engine analyzer on worker threads, over observations loaded from MariaDB. */
export function defaultRecomputeDeps(base: { dataSource: DataSource; config: Config; logger: Logger; now?: () => Date }): RecomputeDeps {
  return {
    dataSource: base.dataSource,
    config: base.config,
    logger: base.logger,
    now: base.now ?? (() => new Date()),
    analyzer: (sharedAnalyzer ??= pooledEngineAnalyzer()),
    loadCohorts: observationCohortLoader,
    retryBaseMs: DEFAULT_RETRY_BASE_MS,
  };
}

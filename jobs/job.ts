import type { DataSource } from 'typeorm';
import type { Config } from '@server/config/env';
import type { Logger } from '@server/lib/logger';

export interface JobContext {
  config: Config;
  dataSource: DataSource;
  logger: Logger;
  /** Injected clock so schedules and "is it due?" checks can be tested with a fixed time. */
  now: () => Date;
}

/**
 * A scheduled job declares its own schedule next to its code. `run` must be idempotent (running it
 * twice does no harm), bounded (batched with a cap) and must guard against overlapping runs.
 */
export interface JobDefinition {
  name: string;
  /** node-cron expression, e.g. '0 3 * * *'. */
  schedule: string;
  /** IANA zone the schedule is read in. */
  timeZone: string;
  run: (ctx: JobContext) => Promise<void>;
}

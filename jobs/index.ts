import cron from 'node-cron';
import { directorSummaryJob } from './director-summary.job';
import type { JobContext, JobDefinition } from './job';
import { purgeObservationsJob } from './purge-observations.job';
import { recomputeNightlyJob } from './recompute-nightly.job';
import { recomputeQueueJob } from './recompute-queue.job';

/** Every scheduled job. Each file `<name>.job.ts` exports one definition; list it here, one a line. */
export const JOBS: JobDefinition[] = [
  directorSummaryJob,
  purgeObservationsJob,
  recomputeNightlyJob,
  recomputeQueueJob,
];

/** Registers every job with node-cron; a failing run is logged and the schedule keeps going. */
export function startScheduler(ctx: JobContext, jobs: readonly JobDefinition[] = JOBS): { stop: () => Promise<void> } {
  const tasks = jobs.map((job) =>
    cron.schedule(
      job.schedule,
      async () => {
        const started = Date.now();
        try {
          await job.run(ctx);
          ctx.logger.info({ job: job.name, ms: Date.now() - started }, 'job finished');
        } catch (err) {
          ctx.logger.error({ job: job.name, err }, 'job failed');
        }
      },
      { timezone: job.timeZone, name: job.name, noOverlap: true },
    ),
  );
  return {
    stop: async () => {
      await Promise.all(tasks.map((t) => t.stop()));
    },
  };
}

export function findJob(name: string): JobDefinition | undefined {
  return JOBS.find((j) => j.name === name);
}

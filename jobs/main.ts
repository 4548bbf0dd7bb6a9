import 'reflect-metadata';
import { loadConfig } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { startLocalMailIfConfigured } from '@server/dev/local-smtp/start-local-mail';
import { createLogger } from '@server/lib/logger';
import { defaultRecomputeDeps } from '@server/services/recompute/default-deps';
import { recomputeWorker } from '@server/services/recompute/recompute-worker';
import { setRecomputeWaker } from '@server/services/recompute/wake';
import { findJob, JOBS, startScheduler } from './index';

/**
 * `npm run jobs`: the scheduler alone, against the configured database (`npm start` also runs it
 * inside the app process). `npm run jobs -- --once NAME` runs one job now and exits.
 */
async function main(args: string[]): Promise<void> {
  if (process.env.CUTLINE_DB_PASSWORD === undefined) {
    const { prepareLocalEnv } = await import('@server/setup/local-env');
    prepareLocalEnv();
  }
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  const ctx = { config, dataSource, logger, now: () => new Date() };
  if (args[0] === '--once') {
    const job = findJob(args[1] ?? '');
    if (!job) throw new Error(`No job named "${args[1] ?? ''}". Jobs: ${JOBS.map((j) => j.name).join(', ') || '(none yet)'}.`);
    await job.run(ctx);
    await dataSource.destroy();
    return;
  }
  const localMail = await startLocalMailIfConfigured(config, (line) => logger.info(line));
  const recompute = recomputeWorker(defaultRecomputeDeps(ctx));
  setRecomputeWaker(dataSource, () => recompute.wake());
  recompute.wake();
  const scheduler = startScheduler(ctx);
  logger.info({ jobs: JOBS.map((j) => j.name) }, 'scheduler running');
  const stop = async () => {
    await scheduler.stop();
    await recompute.stop();
    await localMail?.close();
    await dataSource.destroy();
    process.exit(0);
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}

main(process.argv.slice(2)).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});

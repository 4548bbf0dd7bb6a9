import 'reflect-metadata';
import { loadConfig } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { createLogger } from '@server/lib/logger';
import { pooledEngineAnalyzer } from '@server/services/recompute/analyzer-pool';
import { defaultRecomputeDeps } from '@server/services/recompute/default-deps';
import { executeRun } from '@server/services/recompute/run-recompute';

/**
 * A second process that runs one recompute and stops after its first scope, holding the program's
 * named lock, so a test can kill it mid-way (`tests/api/recompute.test.ts`). Prints `HOLDING` when
 * it got there. Usage: tsx tests/support/recompute-child.ts RUN_ID (database from the environment).
 */
async function main(): Promise<void> {
  const runId = Number(process.argv[2]);
  const config = loadConfig();
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  const deps = {
    ...defaultRecomputeDeps({ dataSource, config, logger: createLogger('silent') }),
    // One worker, so nothing else progresses while the first scope's hook holds.
    analyzer: pooledEngineAnalyzer(1),
    afterScope: async () => {
      process.stdout.write('HOLDING\n');
      await new Promise(() => undefined); // until killed
    },
  };
  await executeRun(deps, runId);
  process.stdout.write('FINISHED\n');
  await dataSource.destroy();
}

main().catch((err: unknown) => {
  process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});

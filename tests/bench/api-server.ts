import 'reflect-metadata';
import http from 'node:http';
import { loadConfig } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { serveInProcesses } from '@server/http-server';
import { buildTestApp } from '../support/test-app';

/**
 * The app for `npm run bench:api`, in processes of its own so the load generator does not share
 * their event loops: the real app over the bench database, trusting the tests' local identity
 * provider, in as many processes as `tsx server/main.ts` would start (`CUTLINE_WEB_PROCESSES`,
 * default one per core). Prints `listening PORT` when every process listens; stops on SIGTERM.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  await serveInProcesses({
    count: config.app.processes,
    prepare: async () => undefined,
    serve: async () => {
      const dataSource = createDataSource(config.db);
      await dataSource.initialize();
      const { app } = buildTestApp({ dataSource, config, drop: async () => undefined });
      const server = http.createServer(app);
      await new Promise<void>((resolve) => server.listen(config.app.port, '127.0.0.1', resolve));
      process.once('SIGTERM', () => {
        server.closeAllConnections();
        server.close(() => void dataSource.destroy().then(() => process.exit(0)));
      });
    },
    ready: () => console.log(`listening ${config.app.port}`),
  });
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});

import 'reflect-metadata';
import http from 'node:http';
import { loadConfig } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { buildTestApp } from '../support/test-app';

/**
 * The app for `npm run bench:api`, in its own process so the load generator does not share its
 * event loop: the real app over the bench database, trusting the tests' local identity provider.
 * Prints `listening PORT` when ready; stops on SIGTERM.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  const { app } = buildTestApp({ dataSource, config, drop: async () => undefined });
  const server = http.createServer(app);
  server.listen(config.app.port, '127.0.0.1', () => console.log(`listening ${config.app.port}`));
  process.once('SIGTERM', () => {
    server.closeAllConnections();
    server.close(() => void dataSource.destroy().then(() => process.exit(0)));
  });
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});

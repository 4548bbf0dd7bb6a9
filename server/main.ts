import 'reflect-metadata';
import { visibleProgramsOf } from './auth/access-enforcer';
import { resolveExternalIdentityProvider } from './auth/identity-provider';
import { loadConfig } from './config/env';
import { createDataSource } from './db/data-source';
import { createApp } from './app';
import { listen, serveInProcesses } from './http-server';
import { createLogger } from './lib/logger';
import { ingestWorker } from './services/ingest/ingest-worker';

/**
 * Production entry (`tsx server/main.ts`): connects to the database named by the environment,
 * applies pending migrations and serves in `CUTLINE_WEB_PROCESSES` processes. `npm start` is the all-in-one local variant.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  const idpSource = config.auth.identityProvider;
  if (idpSource.kind !== 'external') {
    throw new Error('tsx server/main.ts serves production: set CUTLINE_SAML_IDP_METADATA_URL (see README, "Signing in"). `npm start` runs a local identity provider instead.');
  }
  await serveInProcesses({
    count: config.app.processes,
    prepare: async () => {
      const dataSource = createDataSource(config.db);
      await dataSource.initialize();
      await dataSource.runMigrations({ transaction: 'each' });
      await dataSource.destroy();
    },
    serve: async () => {
      const identityProvider = await resolveExternalIdentityProvider(idpSource);
      const dataSource = createDataSource(config.db);
      await dataSource.initialize();
      const app = createApp({ config, dataSource, logger, identityProvider, visiblePrograms: visibleProgramsOf });
      const http = await listen(app, config.app.port, process.env.CUTLINE_LISTEN_HOST ?? '127.0.0.1');
      // Extract work interrupted by a crash or restart resumes from its last durable step (named
      // locks keep two processes off the same extract).
      const ingest = ingestWorker({ config, dataSource, logger });
      await ingest.recover();
      const shutdown = async () => {
        await http.close();
        await ingest.stop();
        await dataSource.destroy();
        process.exit(0);
      };
      process.once('SIGINT', shutdown);
      process.once('SIGTERM', shutdown);
    },
    ready: () => logger.info({ port: config.app.port, processes: config.app.processes }, 'Cutline is serving'),
    lost: (exitCode) => logger.error({ exitCode }, 'a server process stopped; starting another in a second'),
  });
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});

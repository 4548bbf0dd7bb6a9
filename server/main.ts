import 'reflect-metadata';
import { visibleProgramsOf } from './auth/access-enforcer';
import { resolveExternalIdentityProvider } from './auth/identity-provider';
import { loadConfig } from './config/env';
import { createDataSource } from './db/data-source';
import { createApp } from './app';
import { listen } from './http-server';
import { createLogger } from './lib/logger';
import { ingestWorker } from './services/ingest/ingest-worker';

/**
 * Production entry (`tsx server/main.ts`): connects to the database named by the environment,
 * applies pending migrations and serves. `npm start` is the all-in-one local variant.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  const idpSource = config.auth.identityProvider;
  if (idpSource.kind !== 'external') {
    throw new Error('tsx server/main.ts serves production: set CUTLINE_SAML_IDP_METADATA_URL (see README, "Signing in"). `npm start` runs a local identity provider instead.');
  }
  const identityProvider = await resolveExternalIdentityProvider(idpSource);
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  const app = createApp({ config, dataSource, logger, identityProvider, visiblePrograms: visibleProgramsOf });
  const http = await listen(app, config.app.port, process.env.CUTLINE_LISTEN_HOST ?? '127.0.0.1');
  logger.info({ port: http.port }, 'Cutline is serving');
  // Extract work interrupted by a crash or restart resumes from its last durable step.
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
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});

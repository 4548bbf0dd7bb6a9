import 'reflect-metadata';
import { startScheduler } from '@jobs/index';
import { createApp } from '../app';
import { visibleProgramsOf } from '../auth/access-enforcer';
import { resolveExternalIdentityProvider } from '../auth/identity-provider';
import { loadConfig } from '../config/env';
import { startLocalIdp } from '../dev/local-idp/server';
import { ensureDemoDesign } from '../demo/demo-design';
import { installDemoScenario } from '../demo/install-demo';
import { listen } from '../http-server';
import { createLogger } from '../lib/logger';
import { startLocalMailIfConfigured } from '../dev/local-smtp/start-local-mail';
import { ingestWorker } from '../services/ingest/ingest-worker';
import { defaultRecomputeDeps } from '../services/recompute/default-deps';
import { recomputeWorker } from '../services/recompute/recompute-worker';
import { setRecomputeWaker } from '../services/recompute/wake';
import { ensureClientBuilt } from './client-build';
import { openDevDatabase } from './database';
import { prepareLocalEnv } from './local-env';

/**
 * `npm start`: everything a fresh machine needs, then serve. Reuses the private database and the
 * client build when nothing changed, so a second start takes seconds. Ctrl-C stops the app; the
 * database keeps running (`npm run db:stop` stops it).
 */
async function main(): Promise<void> {
  const say = (line: string) => console.log(`[cutline] ${line}`);
  prepareLocalEnv();
  const config = loadConfig();
  const logger = createLogger(config.logLevel);

  ensureClientBuilt(say);
  const dataSource = await openDevDatabase(config, say);
  const demo = await installDemoScenario(dataSource, { config, logger, log: say });
  if (demo.installed) say('Installed the invented demo scenario (Winter Heating Credit).');
  if (await ensureDemoDesign(dataSource, demo.programId)) say('Created the demo evaluation design; the first recompute runs in the background.');

  const idpSource = config.auth.identityProvider;
  const localIdp = idpSource.kind === 'local' ? await startLocalIdp({ port: idpSource.port, varDir: config.varDir }) : null;
  const identityProvider = localIdp ? localIdp.idp.settings : await resolveExternalIdentityProvider(idpSource as Extract<typeof idpSource, { kind: 'external' }>);
  if (localIdp) say(`Local identity provider (demo sign-in, no passwords): ${localIdp.url}/`);

  const app = createApp({ config, dataSource, logger, identityProvider, visiblePrograms: visibleProgramsOf });
  const http = await listen(app, config.app.port);
  const localMail = await startLocalMailIfConfigured(config, say);
  // Recomputes start as soon as one is queued (extract accepted, design changed, on demand).
  const recompute = recomputeWorker(defaultRecomputeDeps({ config, dataSource, logger }));
  setRecomputeWaker(dataSource, () => recompute.wake());
  recompute.wake();
  const scheduler = startScheduler({ config, dataSource, logger, now: () => new Date() });
  const ingest = ingestWorker({ config, dataSource, logger });
  await ingest.recover();
  say(`Cutline is ready: ${config.app.publicUrl}/`);

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    say('Stopping…');
    await scheduler.stop();
    await recompute.stop();
    await localMail?.close();
    await http.close();
    await localIdp?.close();
    await ingest.stop();
    await dataSource.destroy();
    say('Stopped. The database is still running; `npm run db:stop` stops it.');
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(`[cutline] ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});

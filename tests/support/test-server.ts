import http from 'node:http';
import type { AppContext } from '@server/app-context';
import type { Config } from '@server/config/env';
import { buildTestApp, type TestApp } from './test-app';
import type { TestDatabase } from './test-database';

export interface TestServer extends TestApp {
  url: string;
  port: number;
  close: () => Promise<void>;
}

/**
 * The real app listening on 127.0.0.1 at a free port, configured with that address as its public
 * URL (the identity provider posts its answer back there). For browser tests.
 */
export async function startTestServer(db: TestDatabase, overrides: Partial<AppContext> = {}): Promise<TestServer> {
  const server = http.createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const port = (server.address() as { port: number }).port;
  const url = `http://127.0.0.1:${port}`;
  const base = overrides.config ?? db.config;
  const config: Config = {
    ...base,
    app: { ...base.app, port, publicUrl: url },
    auth: { ...base.auth, spEntityId: `${url}/auth/saml/metadata`, callbackUrl: `${url}/auth/saml/callback` },
  };
  const testApp = buildTestApp(db, { ...overrides, config });
  server.on('request', testApp.app);
  return {
    ...testApp,
    url,
    port,
    close: () =>
      new Promise<void>((done) => {
        server.close(() => done());
        server.closeAllConnections();
      }),
  };
}

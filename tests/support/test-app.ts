import type { Express } from 'express';
import { createApp } from '@server/app';
import type { AppContext } from '@server/app-context';
import { visibleProgramsOf } from '@server/auth/access-enforcer';
import type { Config } from '@server/config/env';
import { createLogger } from '@server/lib/logger';
import { testIdentityProvider } from './local-idp';
import type { TestDatabase } from './test-database';

export interface TestApp {
  app: Express;
  ctx: AppContext;
}

/**
 * The real app over a test database, as `npm start` builds it, trusting the tests' local identity
 * provider. `config` may override parts of the configuration (e.g. `{ auth: { ...db.config.auth, signInRateLimit: 3 } }`).
 */
export function buildTestApp(db: TestDatabase, overrides: Partial<AppContext> & { config?: Config } = {}): TestApp {
  const ctx: AppContext = {
    config: db.config,
    dataSource: db.dataSource,
    logger: createLogger(db.config.logLevel),
    identityProvider: testIdentityProvider().settings,
    visiblePrograms: visibleProgramsOf,
    ...overrides,
  };
  return { app: createApp(ctx), ctx };
}

import type { Express } from 'express';
import { createApp } from '@server/app';
import type { AppContext } from '@server/app-context';
import { createLogger } from '@server/lib/logger';
import type { TestDatabase } from './test-database';

/** The real app over a test database, as `npm start` builds it. */
export function buildTestApp(db: TestDatabase, overrides: Partial<AppContext> = {}): { app: Express; ctx: AppContext } {
  const ctx: AppContext = {
    config: db.config,
    dataSource: db.dataSource,
    logger: createLogger(db.config.logLevel),
    visiblePrograms: () => 'all',
    ...overrides,
  };
  return { app: createApp(ctx), ctx };
}

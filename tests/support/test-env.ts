import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { REPO_ROOT } from '@server/config/env';

/** Ports and names of the test run's private services: separate from `npm start`'s, never 3306. */
export function testPorts(base = Number(process.env.CUTLINE_PORT_BASE ?? 4600)) {
  return { db: base + 11, idp: base + 12, smtp: base + 13 };
}

export const TEST_VAR_DIR = path.join(REPO_ROOT, 'var', 'test');

/**
 * Environment for one `npm test` run. Secrets are random per run; nothing here is reused by
 * `npm start`. Set before any test module loads the configuration.
 */
export function testEnvironment(): Record<string, string> {
  const ports = testPorts();
  const secret = () => randomBytes(32).toString('base64url');
  return {
    NODE_ENV: 'test',
    CUTLINE_LOG_LEVEL: process.env.CUTLINE_LOG_LEVEL ?? 'silent',
    CUTLINE_VAR_DIR: TEST_VAR_DIR,
    CUTLINE_DB_HOST: '127.0.0.1',
    CUTLINE_DB_PORT: String(ports.db),
    CUTLINE_DB_NAME: 'cutline_test',
    CUTLINE_DB_USER: 'cutline_test',
    CUTLINE_DB_PASSWORD: secret(),
    CUTLINE_PSEUDONYM_KEY: secret(),
    CUTLINE_SESSION_SECRET: secret(),
    // The in-process local identity provider of the tests (tests/support/local-idp.ts).
    CUTLINE_LOCAL_IDP_PORT: String(ports.idp),
    // Every test file signs in many times from 127.0.0.1; the limit itself is tested with a low value.
    CUTLINE_SIGN_IN_RATE_LIMIT: '100000',
    CUTLINE_TEST_RUN: '1',
  };
}

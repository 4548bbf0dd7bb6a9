import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

/** Repository root, whatever the working directory. */
export const REPO_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

const port = z.coerce.number().int().min(1024).max(65535);

/**
 * Every setting Cutline reads, validated once at start-up. Ports default to offsets from
 * CUTLINE_PORT_BASE so that two checkouts on one machine can run side by side.
 * See `.env.example` for the meaning of each variable.
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  CUTLINE_PORT_BASE: port.default(4600),
  CUTLINE_APP_PORT: port.optional(),
  CUTLINE_PUBLIC_URL: z.url().optional(),
  CUTLINE_VAR_DIR: z.string().optional(),
  CUTLINE_LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  CUTLINE_DB_HOST: z.string().default('127.0.0.1'),
  CUTLINE_DB_PORT: port.optional(),
  CUTLINE_DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/).default('cutline'),
  CUTLINE_DB_USER: z.string().regex(/^[A-Za-z0-9_]+$/).default('cutline'),
  CUTLINE_DB_PASSWORD: z.string().min(12, 'CUTLINE_DB_PASSWORD must be at least 12 characters'),
  CUTLINE_PSEUDONYM_KEY: z.string().min(32, 'CUTLINE_PSEUDONYM_KEY must be at least 32 characters'),
  CUTLINE_SESSION_SECRET: z.string().min(32, 'CUTLINE_SESSION_SECRET must be at least 32 characters'),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  version: string;
  varDir: string;
  logLevel: z.infer<typeof EnvSchema>['CUTLINE_LOG_LEVEL'];
  app: { port: number; publicUrl: string };
  db: { host: string; port: number; database: string; user: string; password: string };
  /** Loopback ports of the local stand-ins (identity provider, SMTP) and the private database. */
  ports: { base: number; app: number; db: number; idp: number; smtp: number };
  secrets: { pseudonymKey: string; sessionSecret: string };
}

export class ConfigError extends Error {
  override name = 'ConfigError';
}

/** Reads and validates configuration. @throws ConfigError listing every bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Configuration is not valid:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const base = e.CUTLINE_PORT_BASE;
  const appPort = e.CUTLINE_APP_PORT ?? base;
  return {
    env: e.NODE_ENV,
    version: APP_VERSION,
    varDir: path.resolve(REPO_ROOT, e.CUTLINE_VAR_DIR ?? 'var'),
    logLevel: e.CUTLINE_LOG_LEVEL,
    app: { port: appPort, publicUrl: (e.CUTLINE_PUBLIC_URL ?? `http://127.0.0.1:${appPort}`).replace(/\/$/, '') },
    db: {
      host: e.CUTLINE_DB_HOST,
      port: e.CUTLINE_DB_PORT ?? base + 1,
      database: e.CUTLINE_DB_NAME,
      user: e.CUTLINE_DB_USER,
      password: e.CUTLINE_DB_PASSWORD,
    },
    ports: { base, app: appPort, db: e.CUTLINE_DB_PORT ?? base + 1, idp: base + 2, smtp: base + 3 },
    secrets: { pseudonymKey: e.CUTLINE_PSEUDONYM_KEY, sessionSecret: e.CUTLINE_SESSION_SECRET },
  };
}

/** Cutline's release version; stamped on results, annexes and the health endpoint. */
export const APP_VERSION = '0.1.0';

import os from 'node:os';
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
  CUTLINE_WEB_PROCESSES: z.coerce.number().int().min(1).max(16).optional(),
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
  CUTLINE_SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).max(24 * 60).default(30),
  CUTLINE_SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).max(7 * 24).default(12),
  CUTLINE_SIGN_IN_RATE_LIMIT: z.coerce.number().int().min(1).default(30),
  CUTLINE_LOCAL_IDP_PORT: port.optional(),
  CUTLINE_SAML_SP_ENTITY_ID: z.string().min(1).optional(),
  CUTLINE_SAML_IDP_METADATA_URL: z.url().optional(),
  CUTLINE_SAML_IDP_METADATA_FILE: z.string().min(1).optional(),
  CUTLINE_SAML_IDP_ENTITY_ID: z.string().min(1).optional(),
  CUTLINE_SAML_IDP_SSO_URL: z.url().optional(),
  CUTLINE_SAML_IDP_CERT: z.string().min(1).optional(),
  CUTLINE_SAML_WANT_RESPONSE_SIGNED: z.enum(['true', 'false']).default('true'),
  CUTLINE_SAML_ATTRIBUTE_EMAIL: z.string().min(1).default('email'),
  CUTLINE_SAML_ATTRIBUTE_NAME: z.string().min(1).default('displayName'),
  CUTLINE_SAML_ATTRIBUTE_GROUPS: z.string().min(1).default('groups'),
  CUTLINE_SAML_GROUP_ROLES: z.string().default(''),
  CUTLINE_LOCAL_SMTP_PORT: port.optional(),
  CUTLINE_SMTP_HOST: z.string().min(1).optional(),
  CUTLINE_SMTP_PORT: port.optional(),
  CUTLINE_SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  CUTLINE_SMTP_USER: z.string().min(1).optional(),
  CUTLINE_SMTP_PASSWORD: z.string().min(1).optional(),
  CUTLINE_MAIL_FROM: z.string().min(3).default('Cutline <cutline@localhost>'),
  CUTLINE_LOCALE: z.string().refine(isKnownLocale, 'CUTLINE_LOCALE must be a language tag such as en-US or de-DE').default('en-US'),
  CUTLINE_TIME_ZONE: z.string().refine(isKnownTimeZone, 'CUTLINE_TIME_ZONE must be an IANA time zone such as America/Chicago').default('UTC'),
});

function isKnownLocale(tag: string): boolean {
  try {
    return Intl.getCanonicalLocales(tag).length === 1;
  } catch {
    return false;
  }
}

function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** Where e-mail goes: the local fake SMTP server (development, tests) or the agency's server. */
export type MailTransportConfig =
  | { kind: 'local'; port: number }
  | { kind: 'smtp'; host: string; port: number; secure: boolean; user?: string; password?: string };

/** Where the identity provider's settings come from. */
export type IdentityProviderSource =
  /** The local stand-in of `server/dev/local-idp` (development, demos, tests). */
  | { kind: 'local'; port: number }
  /** The agency's identity provider: metadata (URL or file) and/or explicit values, explicit ones winning. */
  | {
      kind: 'external';
      metadataUrl?: string;
      metadataFile?: string;
      entityId?: string;
      ssoUrl?: string;
      /** PEM text, or the path of a PEM file. */
      certificate?: string;
    };

export interface Config {
  env: 'development' | 'production' | 'test';
  version: string;
  varDir: string;
  logLevel: z.infer<typeof EnvSchema>['CUTLINE_LOG_LEVEL'];
  /** `processes`: web server processes sharing the port (`tsx server/main.ts` only; `npm start` runs one). */
  app: { port: number; publicUrl: string; processes: number };
  /** How screens write numbers and dates: the agency's locale and time zone (programs may carry their own zone). */
  agency: { locale: string; timeZone: string };
  db: { host: string; port: number; database: string; user: string; password: string };
  /** Loopback ports of the local stand-ins (identity provider, SMTP) and the private database. */
  ports: { base: number; app: number; db: number; idp: number; smtp: number };
  secrets: { pseudonymKey: string; sessionSecret: string };
  mail: { transport: MailTransportConfig; from: string; mailDir: string };
  auth: {
    /** Cutline's SAML entity ID (the audience the identity provider must name). */
    spEntityId: string;
    /** Assertion consumer service: where the identity provider posts its answer. */
    callbackUrl: string;
    identityProvider: IdentityProviderSource;
    /** Also require the signature of the whole response (the assertion's is always required). */
    wantResponseSigned: boolean;
    /** SAML attribute names that carry the e-mail address, the display name and the groups. */
    attributes: { email: string; displayName: string; groups: string };
    /** Raw `CUTLINE_SAML_GROUP_ROLES`; parsed and checked by `server/auth/group-roles.ts`. */
    groupRoles: string;
    session: { idleMinutes: number; absoluteHours: number; cookieSecure: boolean };
    /** Sign-in requests allowed per network address per 5 minutes. */
    signInRateLimit: number;
  };
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
  const publicUrl = (e.CUTLINE_PUBLIC_URL ?? `http://127.0.0.1:${appPort}`).replace(/\/$/, '');
  return {
    env: e.NODE_ENV,
    version: APP_VERSION,
    varDir: path.resolve(REPO_ROOT, e.CUTLINE_VAR_DIR ?? 'var'),
    logLevel: e.CUTLINE_LOG_LEVEL,
    app: { port: appPort, publicUrl, processes: e.CUTLINE_WEB_PROCESSES ?? Math.min(os.availableParallelism(), 4) },
    agency: { locale: e.CUTLINE_LOCALE, timeZone: e.CUTLINE_TIME_ZONE },
    db: {
      host: e.CUTLINE_DB_HOST,
      port: e.CUTLINE_DB_PORT ?? base + 1,
      database: e.CUTLINE_DB_NAME,
      user: e.CUTLINE_DB_USER,
      password: e.CUTLINE_DB_PASSWORD,
    },
    ports: { base, app: appPort, db: e.CUTLINE_DB_PORT ?? base + 1, idp: e.CUTLINE_LOCAL_IDP_PORT ?? base + 2, smtp: e.CUTLINE_LOCAL_SMTP_PORT ?? base + 3 },
    secrets: { pseudonymKey: e.CUTLINE_PSEUDONYM_KEY, sessionSecret: e.CUTLINE_SESSION_SECRET },
    mail: mailConfig(e, base, path.resolve(REPO_ROOT, e.CUTLINE_VAR_DIR ?? 'var')),
    auth: authConfig(e, publicUrl, e.CUTLINE_LOCAL_IDP_PORT ?? base + 2),
  };
}

function mailConfig(e: z.infer<typeof EnvSchema>, base: number, varDir: string): Config['mail'] {
  const transport: MailTransportConfig = e.CUTLINE_SMTP_HOST
    ? {
        kind: 'smtp',
        host: e.CUTLINE_SMTP_HOST,
        port: e.CUTLINE_SMTP_PORT ?? (e.CUTLINE_SMTP_SECURE === 'true' ? 465 : 587),
        secure: e.CUTLINE_SMTP_SECURE === 'true',
        user: e.CUTLINE_SMTP_USER,
        password: e.CUTLINE_SMTP_PASSWORD,
      }
    : { kind: 'local', port: e.CUTLINE_LOCAL_SMTP_PORT ?? base + 3 };
  return { transport, from: e.CUTLINE_MAIL_FROM, mailDir: path.join(varDir, 'mail') };
}

function authConfig(e: z.infer<typeof EnvSchema>, publicUrl: string, localIdpPort: number): Config['auth'] {
  const external = {
    metadataUrl: e.CUTLINE_SAML_IDP_METADATA_URL,
    metadataFile: e.CUTLINE_SAML_IDP_METADATA_FILE,
    entityId: e.CUTLINE_SAML_IDP_ENTITY_ID,
    ssoUrl: e.CUTLINE_SAML_IDP_SSO_URL,
    certificate: e.CUTLINE_SAML_IDP_CERT,
  };
  const isExternal = Object.values(external).some((v) => v !== undefined);
  if (!isExternal && e.NODE_ENV === 'production') {
    throw new ConfigError(
      'Configuration is not valid:\n  CUTLINE_SAML_IDP_METADATA_URL (or _METADATA_FILE, or _ENTITY_ID + _SSO_URL + _CERT): production needs the agency\'s identity provider.',
    );
  }
  return {
    spEntityId: e.CUTLINE_SAML_SP_ENTITY_ID ?? `${publicUrl}/auth/saml/metadata`,
    callbackUrl: `${publicUrl}/auth/saml/callback`,
    identityProvider: isExternal ? { kind: 'external', ...external } : { kind: 'local', port: localIdpPort },
    wantResponseSigned: e.CUTLINE_SAML_WANT_RESPONSE_SIGNED === 'true',
    attributes: { email: e.CUTLINE_SAML_ATTRIBUTE_EMAIL, displayName: e.CUTLINE_SAML_ATTRIBUTE_NAME, groups: e.CUTLINE_SAML_ATTRIBUTE_GROUPS },
    groupRoles: e.CUTLINE_SAML_GROUP_ROLES,
    session: {
      idleMinutes: e.CUTLINE_SESSION_IDLE_MINUTES,
      absoluteHours: e.CUTLINE_SESSION_ABSOLUTE_HOURS,
      cookieSecure: publicUrl.startsWith('https://'),
    },
    signInRateLimit: e.CUTLINE_SIGN_IN_RATE_LIMIT,
  };
}

/** Cutline's release version; stamped on results, annexes and the health endpoint. */
export const APP_VERSION = '0.1.0';

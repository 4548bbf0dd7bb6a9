import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { REPO_ROOT } from '@server/config/env';
import type { Config } from '@server/config/env';
import { testIdentityProvider } from './local-idp';

/**
 * The environment that makes `server/main.ts` use a given configuration (database, secrets, var
 * folder) and trust the tests' local identity provider as if it were the agency's.
 */
export function serverEnv(config: Config, port: number): NodeJS.ProcessEnv {
  const idp = testIdentityProvider().settings;
  return {
    ...process.env,
    NODE_ENV: 'production',
    CUTLINE_APP_PORT: String(port),
    // One process, so the child's pid is the server's own (kill -9, resident memory).
    CUTLINE_WEB_PROCESSES: '1',
    CUTLINE_PUBLIC_URL: `http://127.0.0.1:${port}`,
    CUTLINE_SAML_IDP_ENTITY_ID: idp.entityId,
    CUTLINE_SAML_IDP_SSO_URL: idp.ssoUrl,
    CUTLINE_SAML_IDP_CERT: idp.certificates[0],
    CUTLINE_VAR_DIR: config.varDir,
    CUTLINE_DB_HOST: config.db.host,
    CUTLINE_DB_PORT: String(config.db.port),
    CUTLINE_DB_NAME: config.db.database,
    CUTLINE_DB_USER: config.db.user,
    CUTLINE_DB_PASSWORD: config.db.password,
    CUTLINE_PSEUDONYM_KEY: config.secrets.pseudonymKey,
    CUTLINE_SESSION_SECRET: config.secrets.sessionSecret,
    CUTLINE_LOG_LEVEL: process.env.CUTLINE_SERVER_LOG_LEVEL ?? 'warn',
  };
}

export interface ServerProcess {
  child: ChildProcess;
  url: string;
  /** Peak resident memory of the server process so far (VmHWM), in MiB. */
  peakRssMb: () => number;
  /** Resident memory now (VmRSS), in MiB. */
  rssMb: () => number;
  /** SIGKILL, as a crash would: no clean-up of any kind. */
  kill9: () => Promise<void>;
  stop: () => Promise<void>;
}

/**
 * Starts the production entry `server/main.ts` as its own Node process (no tsx wrapper process,
 * so the pid is the server's own) and waits until it answers /api/health. Sign in to it with
 * `signIn({ app: server.url, ctx: { dataSource } }, …)` (tests/support/sign-in.ts).
 */
export async function startServerProcess(config: Config): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, [...(process.env.SERVER_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.SERVER_PROFILE}`] : []), '--import', 'tsx', path.join(REPO_ROOT, 'server', 'main.ts')], {
    cwd: REPO_ROOT,
    env: serverEnv(config, port),
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server process exited with ${child.exitCode} before it was ready`);
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok).catch(() => false);
    if (ok) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    child,
    url,
    peakRssMb: () => procStatusMb(child.pid, 'VmHWM'),
    rssMb: () => procStatusMb(child.pid, 'VmRSS'),
    kill9: async () => {
      child.kill('SIGKILL');
      await exited;
    },
    stop: async () => {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
      await exited;
    },
  };
}

/** A memory figure of /proc/<pid>/status (Linux), in MiB. */
function procStatusMb(pid: number | undefined, field: 'VmHWM' | 'VmRSS'): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(new RegExp(`${field}:\\s+(\\d+) kB`).exec(status)?.[1] ?? 0) / 1024;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

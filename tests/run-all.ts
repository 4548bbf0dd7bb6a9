import { spawn } from 'node:child_process';
import path from 'node:path';
import { REPO_ROOT } from '@server/config/env';
import { PrivateMariaDb } from '@server/db/private-mariadb';
import { ensureClientBuilt } from '@server/setup/client-build';
import { ensureDebianPackages } from '@server/setup/debian-packages';
import { localIdpKeysDir } from '@server/dev/local-idp/server';
import { ensureSigningKeys } from '@server/dev/local-idp/signing-keys';
import { testEnvironment, testPorts, TEST_VAR_DIR } from './support/test-env';

/**
 * `npm test`: installs what the tests need (Debian's MariaDB, Chromium, R with AER and sandwich,
 * Python's statsmodels), starts a private MariaDB on a fresh data folder, then runs typecheck,
 * lint and every vitest project (unit, client, api, reference, e2e). Stops the database at the end.
 *
 * `npm run test:one -- <vitest args>` does the same set-up and runs only the given tests.
 */
const say = (line: string) => console.log(`[test] ${line}`);

async function main(): Promise<number> {
  const args = process.argv.slice(2);
  const only = args[0] === '--only';
  const vitestArgs = only ? args.slice(1) : args;

  Object.assign(process.env, testEnvironment());
  PrivateMariaDb.ensureInstalled();
  ensureDebianPackages(['chromium'], 'browser tests', { recommends: true });
  ensureDebianPackages(['r-base-core', 'r-cran-aer', 'r-cran-sandwich'], 'reference checks in R');
  ensureDebianPackages(['python3-statsmodels'], 'reference checks in Python');

  const db = new PrivateMariaDb({ baseDir: path.join(TEST_VAR_DIR, 'mariadb'), port: testPorts().db });
  const stopDb = async () => {
    await db.destroy().catch(() => undefined);
  };
  process.once('SIGINT', () => void stopDb().then(() => process.exit(130)));
  process.once('SIGTERM', () => void stopDb().then(() => process.exit(143)));

  try {
    await db.destroy();
    await db.start({ detached: false });
    await db.ensureAppDatabase({
      database: process.env.CUTLINE_DB_NAME!,
      user: process.env.CUTLINE_DB_USER!,
      password: process.env.CUTLINE_DB_PASSWORD!,
      extraDatabasePattern: 'cutline\\_test\\_%',
    });
    say(`private MariaDB on 127.0.0.1:${testPorts().db}`);
    // The tests' local identity provider and an impostor with another key (tests/support/local-idp.ts).
    ensureSigningKeys(localIdpKeysDir(TEST_VAR_DIR));
    ensureSigningKeys(`${localIdpKeysDir(TEST_VAR_DIR)}-impostor`, 'Impostor');

    // Typecheck and lint run beside vitest; their output is printed after vitest's so it stays readable.
    const checks = only
      ? []
      : [run('typecheck', 'npm', ['run', '--silent', 'typecheck'], true), run('lint', 'npm', ['run', '--silent', 'lint'], true)];
    ensureClientBuilt(say);
    const vitest = await run('vitest', path.join(REPO_ROOT, 'node_modules', '.bin', 'vitest'), ['run', ...vitestArgs]);
    const results = [vitest, ...(await Promise.all(checks))];
    for (const r of results) if (r.output) process.stdout.write(r.output);
    const failed = results.filter((r) => r.code !== 0);
    for (const r of results) say(`${r.name}: ${r.code === 0 ? 'passed' : `FAILED (exit ${r.code})`}`);
    return failed.length === 0 ? 0 : 1;
  } finally {
    await stopDb();
    say('private MariaDB stopped');
  }
}

interface StepResult {
  name: string;
  code: number;
  output: string;
}

function run(name: string, command: string, args: string[], capture = false): Promise<StepResult> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: REPO_ROOT, stdio: capture ? ['ignore', 'pipe', 'pipe'] : 'inherit', env: process.env });
    let output = '';
    child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code, signal) => resolve({ name, code: code ?? (signal ? 1 : 0), output }));
    child.on('error', (err) => resolve({ name, code: 127, output: `${name}: ${err.message}\n` }));
  });
}

main()
  .then((code) => process.exit(code))
  .catch((err: unknown) => {
    console.error(`[test] ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  });

import 'reflect-metadata';
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import readline from 'node:readline';
import zlib from 'node:zlib';
import { loadConfig, REPO_ROOT } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { PrivateMariaDb } from '@server/db/private-mariadb';
import { installDemoScenario } from '@server/demo/install-demo';
import { localIdpKeysDir } from '@server/dev/local-idp/server';
import { ensureSigningKeys } from '@server/dev/local-idp/signing-keys';
import { ensureClientBuilt } from '@server/setup/client-build';
import { ensureDebianPackages } from '@server/setup/debian-packages';
import type { TestApp } from '../support/test-app';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { installDemoResults } from '../support/demo-results';
import { startTestIdp } from '../support/local-idp';
import { signIn } from '../support/sign-in';
import { testEnvironment, TEST_VAR_DIR } from '../support/test-env';
import { runHttpLoad, type LoadRequest } from './http-load';
import { processTreeCpuSeconds } from './process-cpu';

/**
 * `npm run bench:api`: the demo scenario with its 24 months of results on a private MariaDB
 * (port base+14, data under var/bench, deleted afterwards); the app in a child process; then
 * 1. 50 keep-alive connections (wrk, `http-load.ts`) sending the dashboard requests a manager's
 *    screens make (overview, trend of each outcome, the latest month) as 50 signed-in managers,
 *    cycled: 3 s of warm-up, then 20 s measured (target p95 ≤ 50 ms);
 * 2. in headless Chromium, the bytes of every script and stylesheet the first route (`/`, the
 *    programs overview) loads, gzipped here at level 9 (target ≤ 350 KB; the chart library must
 *    not be among them), and the seconds from opening the trend dashboard to its charts drawn.
 */
const BENCH_DIR = path.join(REPO_ROOT, 'var', 'bench-api');
const CONNECTIONS = 50;
const DURATION_S = Number(process.env.BENCH_API_SECONDS ?? 20);
/**
 * Seconds of the same load before measuring, not counted: each server process compiles its hot
 * paths and fills its caches on the first requests (latencies of several hundred ms in the first
 * second), which a running server has long done. Measuring after a warm-up is common practice, no source.
 */
const WARMUP_S = Number(process.env.BENCH_API_WARMUP_SECONDS ?? 3);
const say = (line: string) => console.log(`[bench] ${line}`);

async function main(): Promise<void> {
  const base = Number(process.env.CUTLINE_PORT_BASE ?? 4600);
  Object.assign(process.env, testEnvironment(), {
    CUTLINE_DB_PORT: String(base + 14),
    CUTLINE_DB_NAME: 'cutline_bench',
    CUTLINE_VAR_DIR: BENCH_DIR,
    CUTLINE_APP_PORT: String(base + 16),
  });
  PrivateMariaDb.ensureInstalled();
  ensureDebianPackages(['chromium'], 'the first-render measurement', { recommends: true });
  ensureSigningKeys(localIdpKeysDir(TEST_VAR_DIR));
  ensureClientBuilt(say);
  const db = new PrivateMariaDb({ baseDir: path.join(BENCH_DIR, 'mariadb'), port: base + 14 });
  await db.destroy();
  await db.start({ detached: false });
  let child: ChildProcess | null = null;
  try {
    const config = loadConfig();
    await db.ensureAppDatabase({ database: config.db.database, user: config.db.user, password: config.db.password });
    const ds = createDataSource(config.db);
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    const { programId } = await installDemoScenario(ds);
    const t0 = performance.now();
    const { periods } = await installDemoResults(ds, programId);
    say(`demo scenario with results for ${periods.length} months in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    say(`app in ${config.app.processes} process${config.app.processes === 1 ? '' : 'es'} (CUTLINE_WEB_PROCESSES)`);
    const started = await startServer();
    child = started.child;
    const url = started.url;
    // One signed-in manager per connection, as 50 people reading their dashboards would be.
    const cookies: string[] = [];
    for (let i = 0; i < CONNECTIONS; i++) {
      cookies.push(sessionCookie(await signIn({ app: url, ctx: { dataSource: ds } } as unknown as TestApp, { role: 'manager', programId })));
    }
    const cookie = cookies[0]!;
    const paths = [
      `/api/programs/${programId}/results`,
      `/api/programs/${programId}/results/trend?outcome=shutoff_6m`,
      `/api/programs/${programId}/results/trend?outcome=arrears_months`,
      `/api/programs/${programId}/results/cohorts/${periods.at(-1)}`,
    ];
    const sequential: string[] = [];
    for (const p of [...paths, '/api/me']) {
      const times: number[] = [];
      let bytes = 0;
      for (let i = 0; i < 10; i++) {
        const t = performance.now();
        const res = await fetch(`${url}${p}`, { headers: { cookie } });
        bytes = (await res.arrayBuffer()).byteLength;
        times.push(performance.now() - t);
        if (res.status !== 200) throw new Error(`${p} answered ${res.status}`);
      }
      times.sort((a, b) => a - b);
      sequential.push(`${p.replace(`/api/programs/${programId}`, '…')} ${times[5]!.toFixed(1)} ms ${(bytes / 1024).toFixed(0)} KB`);
    }
    say(`one at a time (median of 10): ${sequential.join('; ')}`);
    // Each signed-in manager asks for each dashboard endpoint in turn.
    const requests: LoadRequest[] = cookies.flatMap((c, i) => paths.map((_, j) => ({ path: paths[(i + j) % paths.length]!, cookie: c })));
    await runHttpLoad(url, requests, { connections: CONNECTIONS, seconds: WARMUP_S });
    say(`warm-up: the same load for ${WARMUP_S} s, not counted`);
    const dbPid = Number(fs.readFileSync(db.pidFile, 'utf8'));
    const cpuBefore = { app: processTreeCpuSeconds(child.pid!), db: processTreeCpuSeconds(dbPid) };
    const load = await runHttpLoad(url, requests, { connections: CONNECTIONS, seconds: DURATION_S });
    say(`${load.total} requests in ${DURATION_S} s over ${paths.length} endpoints; ${load.notOk} error answers, failed connections or timeouts`);
    if (load.notOk > 0) throw new Error('Some requests failed under load; the figures would not mean anything.');
    const perRequestMs = (seconds: number) => ((seconds * 1000) / load.total).toFixed(2);
    say(
      `CPU per request (ms; steadier than latency on a shared machine): app ${perRequestMs(processTreeCpuSeconds(child.pid!) - cpuBefore.app)}, ` +
        `MariaDB ${perRequestMs(processTreeCpuSeconds(dbPid) - cpuBefore.db)}, load generator ${perRequestMs(load.generatorCpuS)}`,
    );
    const rps = load.total / DURATION_S;

    const browserFigures = await measureBrowser(url, programId);
    say(`first route: ${browserFigures.files} files, ${browserFigures.rawKb.toFixed(0)} KB raw, ${browserFigures.gzipKb.toFixed(1)} KB gzip (target ≤ 350 KB); chart library on the first route: ${browserFigures.chartsOnFirstRoute ? 'YES' : 'no'}`);
    say(`trend dashboard drawn in ${browserFigures.firstRenderS.toFixed(2)} s; p95 ${load.p95Ms.toFixed(1)} ms (target ≤ 50 ms)`);
    await ds.destroy();
    console.log(
      `bench api: connections=${CONNECTIONS} rps=${rps.toFixed(0)} p50_ms=${load.p50Ms.toFixed(1)} p95_ms=${load.p95Ms.toFixed(1)} p99_ms=${load.p99Ms.toFixed(1)} first_route_gzip_kb=${browserFigures.gzipKb.toFixed(1)} first_render_s=${browserFigures.firstRenderS.toFixed(2)}`,
    );
  } finally {
    if (child) await stopChild(child);
    await db.destroy();
    fs.rmSync(BENCH_DIR, { recursive: true, force: true });
  }
}

function sessionCookie(agent: unknown): string {
  const jar = (agent as { jar: { getCookies: (a: object) => Array<{ name: string; value: string }> } }).jar;
  const cookies = jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false });
  if (cookies.length === 0) throw new Error('The sign-in left no session cookie.');
  return cookies.map((c) => `${c.name}=${c.value}`).join('; ');
}

async function startServer(): Promise<{ child: ChildProcess; url: string }> {
  // BENCH_API_PROFILE=DIR writes a CPU profile of the server there (node --cpu-prof).
  const profile = process.env.BENCH_API_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_API_PROFILE}`] : [];
  const child = spawn(process.execPath, [...profile, '--import', 'tsx', path.join(REPO_ROOT, 'tests', 'bench', 'api-server.ts')], { cwd: REPO_ROOT, env: process.env, stdio: ['ignore', 'pipe', 'inherit'] });
  const lines = readline.createInterface({ input: child.stdout! });
  const port = await new Promise<number>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`The bench server stopped (exit ${code}).`)));
    lines.on('line', (line) => {
      const m = /^listening (\d+)$/.exec(line);
      if (m) resolve(Number(m[1]));
    });
  });
  return { child, url: `http://127.0.0.1:${port}` };
}

function stopChild(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
}

async function measureBrowser(url: string, programId: number) {
  // The tests' identity provider (port base+12): the app trusts its keys; run no `npm test` alongside.
  const idp = await startTestIdp();
  const browser = await launchBrowser();
  try {
    const page = await browser.context.newPage();
    await signInInBrowser(page, url, { role: 'manager' }).catch(async (err: unknown) => {
      await page.screenshot({ path: screenshotPath('bench-api-sign-in-failed') });
      throw err;
    });
    // The first route, fresh: a new page with the cache off, recording what it fetches.
    const cdp = await browser.context.newCDPSession(page);
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    const assets: string[] = [];
    page.on('response', (r) => {
      const u = new URL(r.url());
      if (u.origin === url && /\.(js|css)$/.test(u.pathname)) assets.push(u.pathname);
    });
    await page.goto(`${url}/`);
    await page.getByRole('link', { name: 'Open the trends' }).waitFor();
    let raw = 0;
    let gz = 0;
    let chartsOnFirstRoute = false;
    for (const a of [...new Set(assets)]) {
      const body = fs.readFileSync(path.join(REPO_ROOT, 'dist', 'client', a));
      raw += body.length;
      gz += zlib.gzipSync(body, { level: 9 }).length;
      if (/nivo|d3-|ResponsiveLine|ResponsiveScatterPlot/.test(body.toString('utf8', 0, Math.min(body.length, 2_000_000)))) chartsOnFirstRoute = true;
    }
    // Time to first dashboard render: from navigation to the four charts drawn.
    const start = performance.now();
    await page.goto(`${url}/programs/${programId}`);
    await page.getByTestId('summary-paragraph').waitFor();
    await page.locator('figure svg').nth(3).waitFor();
    const firstRenderS = (performance.now() - start) / 1000;
    return { files: new Set(assets).size, rawKb: raw / 1024, gzipKb: gz / 1024, chartsOnFirstRoute, firstRenderS };
  } finally {
    await browser.close();
    await idp.close();
  }
}

main().catch((err: unknown) => {
  console.error(`[bench] ${err instanceof Error ? err.stack : String(err)}`);
  process.exit(1);
});

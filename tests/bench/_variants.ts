import 'reflect-metadata';
import http from 'node:http';
import path from 'node:path';
import { Client } from 'undici';
import { loadConfig, REPO_ROOT } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { PrivateMariaDb } from '@server/db/private-mariadb';
import { installDemoScenario } from '@server/demo/install-demo';
import type { TestApp } from '../support/test-app';
import { buildTestApp } from '../support/test-app';
import { installDemoResults } from '../support/demo-results';
import { signIn } from '../support/sign-in';
import { testEnvironment } from '../support/test-env';

const variants = (process.env.VARIANTS ?? 'base').split(' ');
async function main() {
  const base = 4600;
  Object.assign(process.env, testEnvironment(), { CUTLINE_DB_PORT: String(base + 14), CUTLINE_DB_NAME: 'cutline_bench', CUTLINE_VAR_DIR: path.join(REPO_ROOT, 'var', 'bench-var'), CUTLINE_APP_PORT: String(base + 16) });
  const db = new PrivateMariaDb({ baseDir: path.join(REPO_ROOT, 'var', 'bench-var', 'mariadb'), port: base + 14 });
  await db.destroy(); await db.start({ detached: false });
  const config = loadConfig();
  await db.ensureAppDatabase({ database: config.db.database, user: config.db.user, password: config.db.password });
  const ds = createDataSource(config.db); await ds.initialize(); await ds.runMigrations({ transaction: 'each' });
  const { programId } = await installDemoScenario(ds);
  const { periods } = await installDemoResults(ds, programId);
  const servers: Array<{ name: string; url: string }> = [];
  for (const v of variants) {
    process.env.EXP = v;
    const { app } = buildTestApp({ dataSource: ds, config, drop: async () => undefined } as never);
    const server = http.createServer(app);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    servers.push({ name: v, url: `http://127.0.0.1:${(server.address() as { port: number }).port}` });
  }
  const paths = [`/api/programs/${programId}/results`, `/api/programs/${programId}/results/trend?outcome=shutoff_6m`, `/api/programs/${programId}/results/trend?outcome=arrears_months`, `/api/programs/${programId}/results/cohorts/${periods.at(-1)}`];
  process.env.EXP = '';
  const plain = http.createServer(buildTestApp({ dataSource: ds, config, drop: async () => undefined } as never).app);
  await new Promise<void>((r) => plain.listen(0, '127.0.0.1', r));
  const plainUrl = `http://127.0.0.1:${(plain.address() as { port: number }).port}`;
  const cookies = new Map<string, string[]>();
  let shared: string[] | undefined;
  for (const s of servers) {
    if (shared) { cookies.set(s.name, shared); continue; }
    const list: string[] = [];
    for (let i = 0; i < 10; i++) {
      const agent = await signIn({ app: plainUrl, ctx: { dataSource: ds } } as unknown as TestApp, { role: 'manager', programId });
      const jar = (agent as unknown as { jar: { getCookies: (a: object) => Array<{ name: string; value: string }> } }).jar;
      list.push(jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false }).map((c) => `${c.name}=${c.value}`).join('; '));
    }
    cookies.set(s.name, list);
    shared = list;
  }
  const totals = new Map<string, { cpu: number; n: number }>();
  for (let round = 0; round < Number(process.env.ROUNDS ?? 6); round++) {
    for (const s of servers) {
      const t0 = process.cpuUsage(); let n = 0;
      const deadline = performance.now() + 1500;
      await Promise.all(cookies.get(s.name)!.map(async (cookie, c) => {
        const client = new Client(s.url, { pipelining: 1 });
        for (let i = c; performance.now() < deadline; i++) {
          const res = await client.request({ method: 'GET', path: paths[i % 4]!, headers: { cookie, accept: 'application/json', 'accept-encoding': 'gzip' } });
          for await (const _ of res.body) void _;
          if (res.statusCode !== 200) throw new Error(`${res.statusCode}`);
          n++;
        }
        await client.close();
      }));
      const u = process.cpuUsage(t0);
      if (round > 0) { const t = totals.get(s.name) ?? { cpu: 0, n: 0 }; t.cpu += (u.user + u.system) / 1000; t.n += n; totals.set(s.name, t); }
    }
  }
  for (const [name, t] of totals) console.log(`${name.padEnd(30)} ${(t.cpu / t.n).toFixed(3)} ms/req (in-process, client included)  n=${t.n}`);
  await ds.destroy(); await db.destroy(); process.exit(0);
}
main().catch((e) => { console.error(e); process.exit(1); });

import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { loadConfig, REPO_ROOT } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { PrivateMariaDb } from '@server/db/private-mariadb';
import { EXTRACT_BUSY_STATUSES } from '@shared/schemas/extract';
import type { ExtractDetailDto, ExtractUploadResultDto } from '@shared/api/extracts';
import { createRng } from '@shared/random/rng';
import { createTestProgram } from '../fixtures/test-program';
import { startServerProcess } from '../support/server-process';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { testEnvironment } from '../support/test-env';

/**
 * `npm run bench:ingest`: generates a 1,000,000-row, 8-column CSV and times upload → mapping →
 * report → accept → visible through the real HTTP API of a separate server process and a private
 * MariaDB (port base+14, data under var/bench, deleted afterwards). Then loads the same file with a
 * bare `LOAD DATA LOCAL INFILE` into a plain table, as the physical reference. Targets (issue 5):
 * ≤ 30 s end to end and ≤ 400 MB peak server RSS on the 2-core machine.
 */
const ROWS = 1_000_000;
const BENCH_DIR = path.join(REPO_ROOT, 'var', 'bench');
const say = (line: string) => console.log(`[bench] ${line}`);

async function main(): Promise<void> {
  const base = Number(process.env.CUTLINE_PORT_BASE ?? 4600);
  Object.assign(process.env, testEnvironment(), { CUTLINE_DB_PORT: String(base + 14), CUTLINE_DB_NAME: 'cutline_bench', CUTLINE_VAR_DIR: BENCH_DIR });
  PrivateMariaDb.ensureInstalled();
  const db = new PrivateMariaDb({ baseDir: path.join(BENCH_DIR, 'mariadb'), port: base + 14 });
  await db.destroy();
  await db.start({ detached: false });
  try {
    const config = loadConfig();
    await db.ensureAppDatabase({ database: config.db.database, user: config.db.user, password: config.db.password });
    const ds = createDataSource(config.db);
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    const programId = await createTestProgram(ds, 'bench');

    const csv = path.join(BENCH_DIR, 'bench-1m.csv');
    const t0 = performance.now();
    await writeBenchCsv(csv, ROWS);
    const mb = fs.statSync(csv).size / 1024 / 1024;
    say(`generated ${ROWS.toLocaleString('en')} rows, 8 columns, ${mb.toFixed(1)} MB in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    const server = await startServerProcess(config);
    say(`server ready, resident ${server.rssMb().toFixed(0)} MB`);
    const analyst = await signIn({ app: server.url, ctx: { dataSource: ds } }, { role: 'analyst', programId });
    const phaseRss: Record<string, number> = {};
    let phase = 'upload';
    const sampler = setInterval(() => (phaseRss[phase] = Math.max(phaseRss[phase] ?? 0, server.rssMb())), 100);
    const run = await uploadToAccepted(analyst, programId, csv, (next) => (phase = next));
    clearInterval(sampler);
    const peak = server.peakRssMb();
    await server.stop();
    await ds.destroy();
    say(`resident memory by phase (MB, sampled every 0.1 s): ${Object.entries(phaseRss).map(([k, v]) => `${k}=${v.toFixed(0)}`).join(' ')}`);
    const { total, phases } = run;
    const raw = await rawLoadData(config, csv);
    const rowsPerS = ROWS / total;
    const loadRate = ROWS / raw;
    say(`phases (s): ${Object.entries(phases).map(([k, v]) => `${k}=${v.toFixed(2)}`).join(' ')}`);
    say(`end to end ${total.toFixed(2)} s (target ≤ 30 s), server peak RSS ${peak.toFixed(0)} MB (target ≤ 400 MB)`);
    say(`bare LOAD DATA of the same file: ${raw.toFixed(2)} s; end-to-end rate is ${((100 * rowsPerS) / loadRate).toFixed(0)}% of it (ratio ${(rowsPerS / loadRate).toFixed(2)})`);
    console.log(
      `bench ingest: rows=${ROWS} total_s=${total.toFixed(2)} rows_per_s=${Math.round(rowsPerS)} peak_rss_mb=${Math.round(peak)} load_data_rows_per_s=${Math.round(loadRate)}`,
    );
  } finally {
    await db.destroy();
    fs.rmSync(BENCH_DIR, { recursive: true, force: true });
  }
}

/** case_id, application_date, score, took_part, employed, earnings, age, prior_earnings: invented values. */
async function writeBenchCsv(file: string, rows: number): Promise<void> {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const out = fs.createWriteStream(file);
  const rng = createRng(2025);
  out.write('case_id,application_date,score,took_part,employed,earnings,age,prior_earnings\n');
  let buffer = '';
  for (let i = 0; i < rows; i++) {
    const score = Math.round(1000 * rng.uniform()) / 10;
    const took = rng.bernoulli(score >= 50 ? 0.7 : 0.1);
    buffer += `B-${1_000_000 + i},2025-04-${String(1 + rng.int(30)).padStart(2, '0')},${score},${took},${rng.bernoulli(0.45)},${Math.round(800 + 400 * rng.uniform())},${18 + rng.int(45)},${Math.round(500 + 500 * rng.uniform())}\n`;
    if (buffer.length > 1 << 20) {
      if (!out.write(buffer)) await new Promise<void>((r) => out.once('drain', () => r()));
      buffer = '';
    }
  }
  await new Promise<void>((resolve, reject) => out.end(buffer, () => resolve()).once('error', reject));
}

async function uploadToAccepted(
  analyst: SignedInAgent,
  programId: number,
  csv: string,
  onPhase: (phase: string) => void,
): Promise<{ total: number; phases: Record<string, number> }> {
  const api = `/api/programs/${programId}/extracts`;
  const start = performance.now();
  const mark = () => (performance.now() - start) / 1000;
  const up = await analyst.post(api).field('period', '2025-04').attach('file', csv, 'bench-1m.csv');
  if (up.status !== 201) throw new Error(`upload answered ${up.status}: ${JSON.stringify(up.body)}`);
  const id = (up.body as ExtractUploadResultDto).extract.id;
  const uploaded = mark();
  onPhase('validate');
  const mapping = {
    subjectId: 'case_id',
    score: 'score',
    takeUp: 'took_part',
    applicationDate: 'application_date',
    outcomes: { employed: 'employed', earnings: 'earnings' },
    covariates: { age: 'age', prior_earnings: 'prior_earnings' },
  };
  await analyst.put(`${api}/${id}/mapping`).send({ newSourceName: 'Bench export', mapping }).expect(200);
  const report = await settle(analyst, `${api}/${id}`);
  if (!report.canAccept) throw new Error(`not acceptable: ${JSON.stringify(report.problem)}`);
  const validated = mark();
  onPhase('load');
  await analyst.post(`${api}/${id}/accept`).send({}).expect(200);
  const done = await settle(analyst, `${api}/${id}`);
  if (done.status !== 'accepted') throw new Error(`ended ${done.status}: ${JSON.stringify(done.problem)}`);
  const total = mark();
  return { total, phases: { upload: uploaded, validate: validated - uploaded, load: total - validated } };
}

/** Polls as the client does (every 0.1 s here) until the background step has finished. */
async function settle(analyst: SignedInAgent, url: string): Promise<ExtractDetailDto> {
  for (;;) {
    const body = (await analyst.get(url).expect(200)).body as ExtractDetailDto;
    if (!EXTRACT_BUSY_STATUSES.includes(body.status)) return body;
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Seconds for a bare `LOAD DATA LOCAL INFILE` of the CSV into a plain 8-column table with a primary key. */
async function rawLoadData(config: ReturnType<typeof loadConfig>, csv: string): Promise<number> {
  const conn = await mysql.createConnection({
    host: config.db.host,
    port: config.db.port,
    user: config.db.user,
    password: config.db.password,
    database: config.db.database,
    infileStreamFactory: () => fs.createReadStream(csv),
  });
  try {
    await conn.query('CREATE TABLE bench_raw (case_id VARCHAR(20) PRIMARY KEY, application_date DATE, score DOUBLE, took_part TINYINT, employed TINYINT, earnings DOUBLE, age DOUBLE, prior_earnings DOUBLE) ENGINE=InnoDB');
    const start = performance.now();
    await conn.query({ sql: "LOAD DATA LOCAL INFILE 'bench-1m.csv' INTO TABLE bench_raw FIELDS TERMINATED BY ',' LINES TERMINATED BY '\\n' IGNORE 1 LINES" });
    return (performance.now() - start) / 1000;
  } finally {
    await conn.end();
  }
}

main().catch((err: unknown) => {
  console.error(`[bench] ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  process.exit(1);
});

import 'reflect-metadata';
import { PassThrough } from 'node:stream';
import path from 'node:path';
import { loadConfig, REPO_ROOT } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { PrivateMariaDb } from '@server/db/private-mariadb';
import { installDemoScenario } from '@server/demo/install-demo';
import { OutcomeDefinition } from '@server/entities/outcome-definition.entity';
import { gatherAnnexContent } from '@server/services/annex/annex-content';
import { writeAnnex } from '@server/services/annex/build-annex';
import { createDesign } from '@server/services/designs.service';
import { DEMO_COVARIATES, DEMO_OUTCOMES, demoPeriods } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import { demoCohortRows } from '../fixtures/demo-cohort-rows';
import { storeAnalyzedResults } from '../support/stored-results';
import { testEnvironment } from '../support/test-env';

/**
 * `npm run bench:annex`: the technical annex of 24 cohorts × 3 outcomes (the demo's two and "any
 * month in arrears", derived from each household) with every diagnostic the analyzer stores, read
 * from a private MariaDB (port base+15, data under var/bench-annex, deleted afterwards) through the
 * same services the download uses, and written as .xlsx into memory. Build time is gathering from
 * the database plus writing the workbook; the median of 3 builds after one warm-up. Target (issue 9): ≤ 3 s.
 */
const BENCH_DIR = path.join(REPO_ROOT, 'var', 'bench-annex');
const BUILDS = 3;
const say = (line: string) => console.log(`[bench] ${line}`);

async function main(): Promise<void> {
  const base = Number(process.env.CUTLINE_PORT_BASE ?? 4600);
  Object.assign(process.env, testEnvironment(), { CUTLINE_DB_PORT: String(base + 15), CUTLINE_DB_NAME: 'cutline_bench', CUTLINE_VAR_DIR: BENCH_DIR });
  PrivateMariaDb.ensureInstalled();
  const db = new PrivateMariaDb({ baseDir: path.join(BENCH_DIR, 'mariadb'), port: base + 15 });
  await db.destroy();
  await db.start({ detached: false });
  try {
    const config = loadConfig();
    await db.ensureAppDatabase({ database: config.db.database, user: config.db.user, password: config.db.password });
    const ds = createDataSource(config.db);
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });

    const { programId } = await installDemoScenario(ds);
    await ds.getRepository(OutcomeDefinition).insert({ programId, key: 'arrears_any', label: 'Any month in arrears (next 6 months)', unit: 'share', kind: 'binary', goodDirection: 'lower', position: 3 });
    const outcomes = [...DEMO_OUTCOMES.map((o) => o.key), 'arrears_any'];
    const settings = defaultDesignSettings(outcomes, DEMO_COVARIATES.map((c) => c.key));
    const design = await createDesign(ds, programId, { userId: null, label: 'Bench analyst' }, { name: 'Bench plan', settings, primary: true });
    const periods = demoPeriods();
    const t0 = performance.now();
    const stored = await storeAnalyzedResults(ds, {
      programId,
      designId: design.id,
      designVersionId: design.currentVersion.id,
      designVersion: 1,
      settings,
      cohorts: demoCohortRows(periods, { arrears_any: (h) => (h.arrears_months > 0 ? 1 : 0) }),
    });
    say(`set-up: ${stored.written} results (${periods.length} cohorts and 4 windows × ${outcomes.length} outcomes) analysed and stored in ${((performance.now() - t0) / 1000).toFixed(1)} s (not timed below)`);

    const build = async () => {
      const start = performance.now();
      const content = await gatherAnnexContent(ds, programId, { scope: { kind: 'program' }, generatedBy: 'Bench', generatedAt: new Date() });
      const gathered = performance.now();
      let bytes = 0;
      const sink = new PassThrough();
      sink.on('data', (c: Buffer) => (bytes += c.length));
      const ended = new Promise((resolve) => sink.on('end', resolve));
      await writeAnnex(content, sink);
      await ended;
      const done = performance.now();
      return { totalS: (done - start) / 1000, gatherS: (gathered - start) / 1000, writeS: (done - gathered) / 1000, bytes, content };
    };
    const warm = await build();
    const withDiagnostics = warm.content.results.filter((r) => r.diagnostics !== null).length;
    say(`results in the annex: ${warm.content.results.length}, with stored diagnostics: ${withDiagnostics} (windows have none stored)`);
    const runs = [];
    for (let i = 0; i < BUILDS; i++) runs.push(await build());
    for (const [i, r] of runs.entries()) say(`build ${i + 1}: gather ${r.gatherS.toFixed(3)} s + write ${r.writeS.toFixed(3)} s = ${r.totalS.toFixed(3)} s, ${(r.bytes / 1024).toFixed(0)} KB`);
    const median = [...runs].sort((a, b) => a.totalS - b.totalS)[Math.floor(BUILDS / 2)]!;
    await ds.destroy();
    console.log(`bench annex: cohorts=${periods.length} outcomes=${outcomes.length} build_s=${median.totalS.toFixed(2)} size_kb=${Math.round(median.bytes / 1024)}`);
  } finally {
    await db.destroy();
  }
}

void main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});

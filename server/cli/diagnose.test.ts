import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_HEAPING_PERIOD, generateDemoCohort } from '@shared/demo/heating-credit';
import { diagnoseCommand } from './diagnose';
import { UsageError } from './flags';

let dir = '';
let file = '';
let cutoff = 0;

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-diagnose-'));
  // The demo scenario's month with scores piled just above the cutoff.
  const cohort = generateDemoCohort(DEMO_HEAPING_PERIOD);
  cutoff = cohort.cutoff;
  const lines = ['score,took,shutoff,size,prior', ...cohort.households.map((h) => [h.score, h.takeUp, h.shutoff_6m, h.household_size, h.prior_arrears].join(','))];
  file = path.join(dir, 'cohort.csv');
  fs.writeFileSync(file, `${lines.join('\n')}\n`);
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const base = () => ['--input', file, '--score', 'score', '--outcome', 'shutoff', '--cutoff', String(cutoff), '--eligible', 'at-or-above'];

describe('diagnose command', () => {
  it('prints every diagnostic and the caveats as one JSON object', async () => {
    const r = JSON.parse(await diagnoseCommand([...base(), '--takeup', 'took', '--covariates', 'size,prior', '--population', 'households', '--permutations', '500', '--target-effect', '-0.1']));
    expect(Object.keys(r)).toEqual(['input', 'density', 'heaping', 'balance', 'placebo', 'sensitivity', 'donut', 'weakFirstStage', 'localRandomization', 'bins', 'power', 'caveats']);
    expect(r.input.columns.covariates).toEqual(['size', 'prior']);
    expect(r.balance.map((b: { covariate: string }) => b.covariate)).toEqual(['size', 'prior']);
    expect(r.weakFirstStage.f).toBeGreaterThan(10);
    expect(r.power.nForTarget).toBeGreaterThan(0);
    expect(r.localRandomization.permutations).toBe(500);
    const density = r.caveats.find((c: { code: string }) => c.code === 'score_density_jump');
    expect(density.message).toMatch(/^More households sit just above the cutoff than just below/);
  });

  it('rejects bad calls with one clear sentence', async () => {
    await expect(diagnoseCommand([...base(), '--covariates', 'size,size'])).rejects.toThrow(new UsageError('Option --covariates names a column twice.'));
    await expect(diagnoseCommand([...base(), '--permutations', '10'])).rejects.toThrow(/at least 100/);
    await expect(diagnoseCommand([...base(), '--covariates', 'age'])).rejects.toThrow(/Column "age" is not in cohort.csv/);
  });

  it('exits 0 with JSON on stdout, or 2 with the sentence on stderr', () => {
    const tsx = path.join(process.cwd(), 'node_modules', '.bin', 'tsx');
    const run = (...argv: string[]) => spawnSync(tsx, ['server/cli/diagnose.ts', ...argv], { encoding: 'utf8' });
    const usage = run('--input', file, '--score', 'score');
    expect(usage.status).toBe(2);
    expect(usage.stdout).toBe('');
    expect(usage.stderr.trim()).toBe('Option --outcome COL is required.');
    const good = run(...base(), '--permutations', '200');
    expect(good.status).toBe(0);
    expect(JSON.parse(good.stdout).weakFirstStage).toBeNull();
  });
});

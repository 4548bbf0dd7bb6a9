import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { estimateCommand } from './estimate';
import { UsageError } from './flags';
import { InputError } from './csv-columns';

let dir = '';
const write = (name: string, text: string) => {
  const file = path.join(dir, name);
  fs.writeFileSync(file, text);
  return file;
};

/** A small hand-made file: score, outcome, take-up and office, 24 households. */
function handMadeCsv(): string {
  const lines = ['household,score,shutoff,took,office'];
  for (let i = 0; i < 24; i++) {
    const score = 50 + i * 0.9;
    const took = score >= 60 ? (i % 4 === 0 ? 0 : 1) : i % 5 === 0 ? 1 : 0;
    const shutoff = (i * 7) % 3 === 0 ? 1 : 0;
    lines.push(`h${i},${score.toFixed(1)},${shutoff},${took},${i % 2 ? 'north' : 'river'}`);
  }
  return `${lines.join('\n')}\n`;
}

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-estimate-'));
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('estimate command', () => {
  it('prints one JSON object with the documented fields', async () => {
    const file = write('ok.csv', handMadeCsv());
    const out = await estimateCommand(['--input', file, '--score', 'score', '--outcome', 'shutoff', '--takeup', 'took', '--cutoff', '60', '--eligible', 'at-or-above', '--bandwidth', '12', '--variance', 'hc1']);
    const r = JSON.parse(out);
    expect(r.design).toBe('fuzzy');
    expect(Object.keys(r.n)).toEqual(expect.arrayContaining(['ineligible', 'eligible', 'usedIneligible', 'usedEligible']));
    expect(r.bandwidth).toMatchObject({ h: 12, b: 12, rule: 'given' });
    expect(Object.keys(r.firstStage)).toEqual(expect.arrayContaining(['jump', 'se', 'f']));
    expect(Object.keys(r.itt)).toEqual(expect.arrayContaining(['jump', 'se', 'ciLow', 'ciHigh']));
    expect(Object.keys(r.effect.robust)).toEqual(expect.arrayContaining(['estimate', 'se', 'ciLow', 'ciHigh', 'p']));
    expect(r.input).toMatchObject({ rows: 24, columns: { score: 'score', takeUp: 'took' } });
  });

  it('runs a sharp design with a rule and clusters', async () => {
    const file = write('ok2.csv', handMadeCsv());
    const r = JSON.parse(await estimateCommand(['--input', file, '--score', 'score', '--outcome', 'shutoff', '--cutoff=60', '--eligible=at-or-below', '--cluster', 'office', '--kernel', 'uniform', '--bandwidth', '8']));
    expect(r.design).toBe('sharp');
    expect(r.firstStage).toBeNull();
    expect(r.n.clusters).toBe(2);
    expect(r.effect.estimate).toBe(r.itt.jump);
    expect(r.options).toMatchObject({ variance: 'hc1', kernel: 'uniform', eligibleSide: 'at-or-below' });
  });

  it('rejects bad calls and bad files with one clear sentence', async () => {
    const ok = write('ok3.csv', handMadeCsv());
    const call = (...argv: string[]) => estimateCommand(argv);
    const common = ['--score', 'score', '--outcome', 'shutoff', '--cutoff', '60', '--eligible', 'at-or-above'];
    await expect(call('--input', ok, ...common, '--bandwidth', '5', '--bandwidth-rule', 'ik')).rejects.toThrow(UsageError);
    await expect(call('--input', ok, ...common, '--order', '3')).rejects.toThrow(/--order must be one of 0, 1, 2/);
    await expect(call('--input', ok, '--score', 'points', '--outcome', 'shutoff', '--cutoff', '60', '--eligible', 'at-or-above')).rejects.toThrow(/Column "points" is not in ok3.csv/);
    const bad = write('bad.csv', handMadeCsv().replace('h3,52.7', 'h3,fifty'));
    await expect(call('--input', bad, ...common)).rejects.toThrow(new InputError('Line 5 of bad.csv, column "score" is not a number.'));
    const badTake = write('bad-take.csv', handMadeCsv().replace(/^(h2,[^,]+,[^,]+),0,/m, '$1,2,'));
    await expect(call('--input', badTake, ...common, '--takeup', 'took')).rejects.toThrow(/Line 4 of bad-take.csv, column "took" is neither 0 nor 1/);
    await expect(call('--input', ok, ...common, '--bandwidth', '1')).rejects.toThrow(/fall inside the bandwidth h = 1; at least 4 are needed/);
    const flat = write('flat.csv', handMadeCsv().replace(/,(\d),(north|river)$/gm, ',1,$2'));
    await expect(call('--input', flat, ...common, '--takeup', 'took', '--bandwidth', '8')).rejects.toThrow(/same take-up/);
  });

  it('skips incomplete rows and leaves out a donut only when asked, as if those rows were not in the file', async () => {
    const full = handMadeCsv();
    const common = ['--score', 'score', '--outcome', 'shutoff', '--takeup', 'took', '--cutoff', '60', '--eligible', 'at-or-above', '--bandwidth', '12', '--variance', 'hc1'];
    const gap = write('gap.csv', full.replace(/^(h7,[^,]+),\d,/m, '$1,,'));
    await expect(estimateCommand(['--input', gap, ...common])).rejects.toThrow(/Line 9 of gap.csv, column "shutoff" is empty/);
    const without7 = write('without7.csv', full.replace(/^h7,.*\n/m, ''));
    const skipped = JSON.parse(await estimateCommand(['--input', gap, ...common, '--missing', 'skip']));
    const reference = JSON.parse(await estimateCommand(['--input', without7, ...common]));
    expect(skipped.input).toMatchObject({ rows: 23, skippedIncomplete: 1, droppedByDonut: 0 });
    // Identity: skipping a row is estimating on the file without it.
    expect(skipped.effect).toEqual(reference.effect);

    // Scores 59.9 and 60.8 (h11, h12) lie within 1 of the cutoff 60.
    const donut = JSON.parse(await estimateCommand(['--input', write('donut.csv', full), ...common, '--donut', '1']));
    const withoutCentre = write('without-centre.csv', full.replace(/^h1[12],.*\n/gm, ''));
    expect(donut.input).toMatchObject({ rows: 22, droppedByDonut: 2 });
    expect(donut.effect).toEqual(JSON.parse(await estimateCommand(['--input', withoutCentre, ...common])).effect);
    await expect(estimateCommand(['--input', gap, ...common, '--donut', '-1'])).rejects.toThrow(/--donut must be zero or a positive number/);
  });

  it('exits non-zero with the sentence on stderr and nothing on stdout', () => {
    const ok = write('ok4.csv', handMadeCsv());
    const tsx = path.join(process.cwd(), 'node_modules', '.bin', 'tsx');
    const run = (...argv: string[]) => spawnSync(tsx, ['server/cli/estimate.ts', ...argv], { encoding: 'utf8' });
    const usage = run('--input', ok, '--score', 'score');
    expect(usage.status).toBe(2);
    expect(usage.stdout).toBe('');
    expect(usage.stderr.trim()).toBe('Option --outcome COL is required.');
    const data = run('--input', ok, '--score', 'score', '--outcome', 'shutoff', '--cutoff', '60', '--eligible', 'at-or-above', '--bandwidth', '1');
    expect(data.status).toBe(1);
    expect(data.stderr.trim().split('\n')).toHaveLength(1);
    const good = run('--input', ok, '--score', 'score', '--outcome', 'shutoff', '--cutoff', '60', '--eligible', 'at-or-above', '--bandwidth', '9');
    expect(good.status).toBe(0);
    expect(JSON.parse(good.stdout).design).toBe('sharp');
  });
});

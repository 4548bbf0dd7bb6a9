import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { gridStep, scoreHeaping } from './heaping';

describe('gridStep', () => {
  it('finds the coarsest 1-2-5 step the values lie on', () => {
    expect(gridStep([0, 1, 2, 7, 12])).toBe(1);
    expect(gridStep([0.5, 1, 2.5])).toBe(0.5);
    expect(gridStep([58.1, 58.3, 60])).toBeCloseTo(0.1, 12);
    expect(gridStep([0, 10, 20, 40])).toBe(10);
    expect(gridStep([0.123456789, 0.5])).toBeNull();
  });
});

describe('scoreHeaping', () => {
  const rng = createRng(9);
  const smooth = Float64Array.from({ length: 20_000 }, () => Math.round(100 * rng.uniform()));

  it('stays quiet on smooth integer scores', () => {
    const r = scoreHeaping(smooth, 60, 'at-or-above', 10);
    expect(r.step).toBe(1);
    expect(r.discrete).toBe(false);
    for (const row of r.roundValues) expect(row.ratio!).toBeGreaterThan(0.8);
    expect(r.atCutoff!.ratio!).toBeGreaterThan(0.6);
    expect(r.nearCutoff.map((v) => v.score)).toEqual([57, 58, 59, 60, 61, 62, 63]);
  });

  it('finds scores piled on multiples of 5 and at the cutoff', () => {
    const heaped = Float64Array.from(smooth, (v, i) => (i % 4 === 0 ? 5 * Math.round(v / 5) : v));
    const r = scoreHeaping(heaped, 60, 'at-or-above', 10);
    const five = r.roundValues.find((row) => row.base === 5)!;
    expect(five.ratio!).toBeGreaterThan(1.5);
    expect(five.p).toBeLessThan(0.001);
    expect(r.atCutoff!.ratio!).toBeGreaterThan(1.5);
    expect(r.atCutoff!.p).toBeLessThan(0.001);
  });

  it('does not take the extremes of the range for round-number heaping', () => {
    const narrow = Float64Array.from({ length: 21_000 }, (_, i) => i % 21);
    const ten = scoreHeaping(narrow, 10, 'at-or-above', 5).roundValues.find((row) => row.base === 10)!;
    expect(ten.count).toBe(1000); // only the 10s: 0 and 20 are the ends of the range
    expect(ten.ratio).toBe(1);
  });

  it('calls a score with few values near the cutoff discrete and counts the cutoff as eligible', () => {
    const coarse = Float64Array.from({ length: 5000 }, () => 10 * Math.round(10 * rng.uniform()));
    const r = scoreHeaping(coarse, 60, 'at-or-below', 25);
    expect(r.discrete).toBe(true);
    // at-or-below: 40, 50, 60 are eligible, 70 and 80 not.
    expect(r.distinctNearCutoff).toEqual({ ineligible: 2, eligible: 3 });
  });
});

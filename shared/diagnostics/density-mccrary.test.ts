import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { densityHistogram, mccrarySe, mccraryTest } from './density-mccrary';

describe('mccraryTest', () => {
  // METHODS §4c: f̂₊ = f̂₋ = 1, n = 1000, h = 0.2 ⇒ √(4.8·2/200) = 0.21909 [derived].
  it('uses the SE formula of METHODS §4a', () => {
    expect(mccrarySe(1000, 0.2, 1, 1)).toBeCloseTo(0.21909, 5);
  });

  it('builds a histogram with the cutoff as a bin edge whose heights integrate to one (identity)', () => {
    const rng = createRng(3);
    const t = Float64Array.from({ length: 2000 }, () => rng.normal());
    const h = densityHistogram(t);
    expect(h.binWidth).toBeCloseTo((2 * sd(t)) / Math.sqrt(2000), 12);
    const all = [...h.ineligible, ...h.eligible];
    expect(all.reduce((s, b) => s + b.height * h.binWidth, 0)).toBeCloseTo(1, 12);
    expect(h.ineligible.every((b) => b.t + h.binWidth / 2 <= 1e-12)).toBe(true);
    expect(h.eligible.every((b) => b.t - h.binWidth / 2 >= -1e-12)).toBe(true);
  });

  // METHODS §4c: duplicating every unit just above the cutoff (bunching) gives θ̂ > 0 and a large z.
  it('detects bunching just above the cutoff', () => {
    const rng = createRng(5);
    const base = Array.from({ length: 20_000 }, () => 2 * rng.uniform() - 1);
    const bunched = Float64Array.from([...base, ...base.filter((v) => v >= 0 && v < 0.1)]);
    const r = mccraryTest(bunched);
    expect(r.theta).toBeGreaterThan(0);
    expect(r.z).toBeGreaterThan(3);
    // Uniform on (−1, 1): density 0.5 either side without bunching (bounds ≈ 4 standard errors).
    const clean = mccraryTest(Float64Array.from(base));
    expect(Math.abs(clean.z)).toBeLessThan(4);
    expect(Math.abs(clean.densityIneligible - 0.5)).toBeLessThan(0.1);
    expect(Math.abs(clean.densityEligible - 0.5)).toBeLessThan(0.1);
  });

  // Whole-point scores: with bins narrower than a point, the cutoff's own value sits alone in the
  // first eligible bin and the bin just below is empty, a spurious jump; one bin per value removes it.
  it('puts one score value in each bin when given the grid step', () => {
    const rng = createRng(3);
    const t = Float64Array.from({ length: 3000 }, () => rng.int(21) - 10);
    expect(mccraryTest(t).p).toBeLessThan(1e-6);
    const onGrid = mccraryTest(t, undefined, 1);
    expect(onGrid.binWidth).toBe(1);
    expect(Math.abs(onGrid.z)).toBeLessThan(3);
  });
});

function sd(x: Float64Array): number {
  const m = x.reduce((s, v) => s + v, 0) / x.length;
  return Math.sqrt(x.reduce((s, v) => s + (v - m) ** 2, 0) / (x.length - 1));
}

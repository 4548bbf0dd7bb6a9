import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { binnedMeans, optimalBinCounts } from './bins';

const placement = { cutoff: 0, eligibleSide: 'at-or-above' as const };

describe('binned means', () => {
  const rng = createRng(21);
  const t = Float64Array.from({ length: 3001 }, () => 2 * rng.uniform() - 1);
  const y = Float64Array.from(t, (v) => v + v * v + 0.3 * rng.normal());

  // METHODS §5b: quantile-spaced bins hold counts differing by at most one; evenly spaced bins have equal widths.
  it('makes equal-count and equal-width bins', () => {
    const qs = binnedMeans(t, y, 'quantile-spaced', placement);
    for (const side of ['ineligible', 'eligible'] as const) {
      const counts = qs.bins.filter((b) => b.side === side).map((b) => b.n);
      expect(Math.max(...counts) - Math.min(...counts)).toBeLessThanOrEqual(1);
    }
    const es = binnedMeans(t, y, 'evenly-spaced', placement, { ineligible: { count: 7, optimal: 7 }, eligible: { count: 5, optimal: 5 } });
    const widths = es.bins.filter((b) => b.side === 'eligible').map((b) => b.scoreHigh - b.scoreLow);
    for (const w of widths) expect(w).toBeCloseTo(widths[0]!, 12);
    expect(es.bins.reduce((s, b) => s + b.n, 0)).toBe(t.length);
  });

  // METHODS §5b: a flat mean has no bias term, so the count falls to the minimum (one bin).
  it('uses one bin for a flat mean', () => {
    const flat = Float64Array.from(t, () => 5);
    const counts = optimalBinCounts(t, flat, 'evenly-spaced');
    expect(counts.eligible.count).toBe(1);
  });
});

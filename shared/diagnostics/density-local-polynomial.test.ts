import { describe, expect, it } from 'vitest';
import { localPolynomialDensityTest } from './density-local-polynomial';

describe('localPolynomialDensityTest', () => {
  // METHODS §4b: on an exact uniform grid on [−1, 1] the density is 0.5 on both sides and T ≈ 0.
  it('recovers the density of an exact uniform grid', () => {
    const n = 4000;
    const t = Float64Array.from({ length: n }, (_, i) => -1 + (2 * (i + 0.5)) / n);
    const r = localPolynomialDensityTest(t, 0.4);
    expect(r.densityIneligible).toBeCloseTo(0.5, 3);
    expect(r.densityEligible).toBeCloseTo(0.5, 3);
    expect(Math.abs(r.statistic)).toBeLessThan(0.1);
  });

  it('finds a step in the density', () => {
    // Twice as many points per unit above the cutoff as below.
    const below = Array.from({ length: 2000 }, (_, i) => -1 + (i + 0.5) / 2000);
    const above = Array.from({ length: 4000 }, (_, i) => (i + 0.5) / 4000);
    const r = localPolynomialDensityTest(Float64Array.from([...below, ...above]), 0.3);
    expect(r.densityEligible / r.densityIneligible).toBeCloseTo(2, 2);
    expect(r.statistic).toBeGreaterThan(5);
  });
});

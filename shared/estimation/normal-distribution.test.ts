import { describe, expect, it } from 'vitest';
import { normalCdf, normalQuantile, normalUpperTail, twoSidedP } from './normal-distribution';

describe('normal distribution', () => {
  // Reference values from memory (standard tables, 16 digits); R's pnorm/qnorm are compared live
  // in tests/reference/r-identity.test.ts.
  it('matches well-known values', () => {
    expect(normalCdf(0)).toBe(0.5);
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 14);
    expect(normalQuantile(0.95)).toBeCloseTo(1.6448536269514722, 14);
    expect(normalCdf(-1.959963984540054)).toBeCloseTo(0.025, 15);
  });

  it('is symmetric and inverts itself to double precision (identity)', () => {
    // Round trips from the upper side stop at z ≈ 3: Φ(z) near 1 keeps few digits of 1 − Φ(z).
    for (const z of [-8, -5, -2.5, -1, -0.3, 0.01, 0.7, 1.5, 2, 2.0000001, 3.3]) {
      expect(normalCdf(z) + normalCdf(-z)).toBeCloseTo(1, 15);
      const p = normalCdf(z);
      expect(normalQuantile(p)).toBeCloseTo(z, z > 3 ? 8 : 10);
    }
    for (const p of [1e-12, 1e-6, 0.001, 0.025, 0.3, 0.5, 0.8, 0.999]) {
      const z = normalQuantile(p);
      expect(Math.abs(normalCdf(z) - p) / Math.min(p, 1 - p)).toBeLessThan(1e-13);
    }
  });

  it('is continuous where the series hands over to the continued fraction (x = 2, z = 2√2)', () => {
    const z = 2 * Math.SQRT2;
    const below = normalUpperTail(z * (1 - 1e-12));
    const above = normalUpperTail(z * (1 + 1e-12));
    expect(Math.abs(below - above) / above).toBeLessThan(1e-9);
  });

  it('keeps relative accuracy deep in the tail', () => {
    // Mills-ratio bound (identity): φ(z)/z·(1 − 1/z²) < 1 − Φ(z) < φ(z)/z.
    const z = 9;
    const phi = Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI);
    const tail = normalUpperTail(z);
    expect(tail).toBeLessThan(phi / z);
    expect(tail).toBeGreaterThan((phi / z) * (1 - 1 / (z * z)));
    expect(twoSidedP(0)).toBe(1);
    expect(twoSidedP(-1.959963984540054)).toBeCloseTo(0.05, 15);
  });

  it('rejects p outside (0, 1)', () => {
    expect(() => normalQuantile(1)).toThrow(RangeError);
  });
});

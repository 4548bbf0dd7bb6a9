import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { fitLocalPolynomial } from './local-polynomial';

describe('fitLocalPolynomial', () => {
  // A polynomial of the fit's order is reproduced exactly whatever the weights (identity).
  it('recovers the derivatives of a cubic at the point, in score units, on each side', () => {
    const rng = createRng(4);
    const n = 500;
    const x = Float64Array.from({ length: n }, () => 40 + 40 * rng.uniform());
    const cubic = (v: number) => 2 - 0.5 * (v - 60) + 0.03 * (v - 60) ** 2 - 0.001 * (v - 60) ** 3;
    const y = Float64Array.from(x, cubic);
    const want = [2, -0.5, 0.06, -0.006]; // m, m', m'', m''' at 60
    for (const side of ['at-or-above', 'above', 'at-or-below', 'below'] as const) {
      const fit = fitLocalPolynomial(x, [y], { at: 60, side, h: 15, kernel: 'epanechnikov', order: 3 });
      expect(fit.ok).toBe(true);
      fit.derivatives[0]!.forEach((d, j) => expect(d).toBeCloseTo(want[j]!, 8));
    }
  });

  it('uses only the chosen side and counts the weighted observations', () => {
    const x = Float64Array.from([58, 59, 60, 61, 62]);
    const y = Float64Array.from([1, 1, 5, 5, 5]);
    const above = fitLocalPolynomial(x, [y], { at: 60, side: 'at-or-above', h: 3, kernel: 'uniform', order: 0 });
    expect(above.used).toBe(3);
    expect(above.derivatives[0]![0]).toBeCloseTo(5, 14);
    const below = fitLocalPolynomial(x, [y], { at: 60, side: 'below', h: 3, kernel: 'uniform', order: 0 });
    expect(below.used).toBe(2);
    expect(below.derivatives[0]![0]).toBeCloseTo(1, 14);
    expect(() => fitLocalPolynomial(x, [y], { at: 60, side: 'below', h: 0, kernel: 'uniform', order: 0 })).toThrow(/fitLocalPolynomial/);
  });
});

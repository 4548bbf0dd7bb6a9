import { describe, expect, it } from 'vitest';
import { optimalBinCounts } from '@shared/diagnostics';
import { createRng } from '@shared/random/rng';

/**
 * The IMSE-optimal number of bins grows like n^(1/3) (Calonico, Cattaneo & Titiunik 2015; METHODS
 * §5b: "doubling n multiplies J* by about 1.26" [derived]). Fixed design of our own: X ~ U(−1, 1),
 * cutoff 0, y = sin(2X) + X² + N(0, 0.3²). From n = 1,000 to 64,000 the unrounded optimum J* must
 * grow by 64^(1/3) = 4 within 15% ([3.4, 4.6]), on each side and for both spacings; each J* is the
 * mean over 6 draws (the pilot fits are noisy at n = 1,000).
 */
function meanOptimum(n: number, spacing: 'evenly-spaced' | 'quantile-spaced', start: number) {
  const rng = createRng(start);
  const totals = { ineligible: 0, eligible: 0 };
  const draws = 6;
  for (let r = 0; r < draws; r++) {
    const t = Float64Array.from({ length: n }, () => 2 * rng.uniform() - 1);
    const y = Float64Array.from(t, (x) => Math.sin(2 * x) + x * x + 0.3 * rng.normal());
    const counts = optimalBinCounts(t, y, spacing);
    totals.ineligible += counts.ineligible.optimal / draws;
    totals.eligible += counts.eligible.optimal / draws;
  }
  return totals;
}

describe('IMSE-optimal bin count', () => {
  for (const spacing of ['evenly-spaced', 'quantile-spaced'] as const) {
    it(`scales like n^(1/3) (${spacing})`, () => {
      const small = meanOptimum(1000, spacing, 505);
      const large = meanOptimum(64_000, spacing, 606);
      for (const side of ['ineligible', 'eligible'] as const) {
        const ratio = large[side] / small[side];
        console.log(`bins ${spacing} ${side}: J*(1,000) = ${small[side].toFixed(2)}, J*(64,000) = ${large[side].toFixed(2)}, ratio ${ratio.toFixed(3)}`);
        expect(ratio).toBeGreaterThanOrEqual(4 * 0.85);
        expect(ratio).toBeLessThanOrEqual(4 * 1.15);
      }
    });
  }
});

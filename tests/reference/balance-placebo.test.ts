import { describe, expect, it } from 'vitest';
import { covariateBalance, placeboCutoffs } from '@shared/diagnostics';
import { createRng } from '@shared/random/rng';

/**
 * Monte Carlo checks of covariate balance and placebo cutoffs (issue 4; METHODS §7 "placebo
 * rejection rates ≈ 5%"). Our own designs, no published source: score X ~ U(−1, 1), cutoff 0,
 * eligible at or above, n = 2,000; the engine's defaults (MSE bandwidth, triangular kernel,
 * robust bias-corrected inference).
 * - Balance: a covariate smooth through the cutoff, W = 0.5X + X² + N(0, 0.5²), must be flagged
 *   (robust p < 0.05) in about 5% of 300 replications (accepted: [0.02, 0.09]; Monte Carlo SE 1.3%);
 *   the same covariate plus a jump of 0.5 at the cutoff must be flagged in at least 90%.
 * - Placebo: with a real jump of 0.5 at the cutoff only, Y = X + 0.5X² + 0.5Z + N(0, 0.5²), no false
 *   cutoff (quartiles of each side) may show a jump after Holm adjustment in at least 90% of 150
 *   replications; the real jump is found meanwhile (checked on the same data).
 */
const N = 2000;
const options = { cutoff: 0, eligibleSide: 'at-or-above' as const };

describe('covariate balance (Monte Carlo)', () => {
  it('flags a smooth covariate at about the nominal 5% and a jumping one almost always', () => {
    const rng = createRng(303);
    const replications = 300;
    let smoothFlagged = 0;
    let jumpFlagged = 0;
    for (let r = 0; r < replications; r++) {
      const score = Float64Array.from({ length: N }, () => 2 * rng.uniform() - 1);
      const smooth = Float64Array.from(score, (x) => 0.5 * x + x * x + 0.5 * rng.normal());
      const jumped = Float64Array.from(score, (x, i) => smooth[i]! + (x >= 0 ? 0.5 : 0));
      const { rows } = covariateBalance(score, [{ name: 'smooth', values: smooth }, { name: 'jumped', values: jumped }], options);
      smoothFlagged += +(rows.find((b) => b.covariate === 'smooth')!.p < 0.05);
      jumpFlagged += +(rows.find((b) => b.covariate === 'jumped')!.p < 0.05);
    }
    console.log(`balance: smooth flagged ${smoothFlagged / replications}, jumped flagged ${jumpFlagged / replications}`);
    expect(smoothFlagged / replications).toBeGreaterThanOrEqual(0.02);
    expect(smoothFlagged / replications).toBeLessThanOrEqual(0.09);
    expect(jumpFlagged / replications).toBeGreaterThanOrEqual(0.9);
  });
});

describe('placebo cutoffs (Monte Carlo)', () => {
  it('find nothing at false cutoffs when the only jump is at the real one', () => {
    const rng = createRng(404);
    const replications = 150;
    let quiet = 0;
    for (let r = 0; r < replications; r++) {
      const score = Float64Array.from({ length: N }, () => 2 * rng.uniform() - 1);
      const outcome = Float64Array.from(score, (x) => x + 0.5 * x * x + (x >= 0 ? 0.5 : 0) + 0.5 * rng.normal());
      const rows = placeboCutoffs({ score, outcome }, options);
      expect(rows).toHaveLength(6);
      quiet += +rows.every((row) => row.pAdjusted >= 0.05);
    }
    console.log(`placebo: no false jump in ${quiet / replications} of replications`);
    expect(quiet / replications).toBeGreaterThanOrEqual(0.9);
  });
});

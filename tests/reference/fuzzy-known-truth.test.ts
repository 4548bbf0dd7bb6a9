import { describe, expect, it } from 'vitest';
import { estimateDiscontinuity } from '@shared/estimation';
import { createRng } from '@shared/random/rng';
import { FUZZY_DESIGN, fuzzyDesign } from '@tests/support/rd-designs';

/**
 * Check 3 of issue 3: a known-truth fuzzy design of our own (tests/support/rd-designs.ts: always-
 * takers 10%, never-takers 30%, compliers 60%, a constant effect τ = 0.25, selection on levels,
 * heteroskedastic noise, curvature from the Lee design's left polynomial on both sides). Truth by
 * construction: complier effect τ, take-up jump 0.6, ITT 0.6·τ.
 */
const REPLICATIONS = 500;
const N = 20_000;

describe('known-truth fuzzy design, n = 20,000, 500 replications', () => {
  it('the robust interval for the complier effect covers the truth in [0.92, 0.97]', () => {
    const rng = createRng(31);
    const truth = { effect: FUZZY_DESIGN.effect, firstStage: FUZZY_DESIGN.firstStage, itt: FUZZY_DESIGN.firstStage * FUZZY_DESIGN.effect };
    const hits = { effect: 0, conventional: 0, firstStage: 0, itt: 0 };
    let meanEffect = 0;
    for (let r = 0; r < REPLICATIONS; r++) {
      const e = estimateDiscontinuity(fuzzyDesign(rng, N), { cutoff: 0, eligibleSide: 'at-or-above' });
      const covers = (low: number, high: number, value: number) => (low <= value && value <= high ? 1 : 0);
      hits.effect += covers(e.effect.robust.ciLow, e.effect.robust.ciHigh, truth.effect);
      hits.conventional += covers(e.effect.ciLow, e.effect.ciHigh, truth.effect);
      hits.firstStage += covers(e.firstStage!.robust.ciLow, e.firstStage!.robust.ciHigh, truth.firstStage);
      hits.itt += covers(e.itt.robust.ciLow, e.itt.robust.ciHigh, truth.itt);
      meanEffect += e.effect.robust.estimate / REPLICATIONS;
    }
    const rate = (k: number) => (k / REPLICATIONS).toFixed(3);
    console.log(
      `fuzzy design n=${N}: robust coverage effect ${rate(hits.effect)}, first stage ${rate(hits.firstStage)}, ITT ${rate(hits.itt)}; ` +
        `conventional effect ${rate(hits.conventional)}; mean robust estimate ${meanEffect.toFixed(4)} (truth ${truth.effect})`,
    );
    expect(hits.effect / REPLICATIONS).toBeGreaterThanOrEqual(0.92);
    expect(hits.effect / REPLICATIONS).toBeLessThanOrEqual(0.97);
    // Monte Carlo SE of the mean estimate is well under 0.005 here.
    expect(Math.abs(meanEffect - truth.effect)).toBeLessThan(0.01);
  });
});

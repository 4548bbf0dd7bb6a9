import { describe, expect, it } from 'vitest';
import { estimateDiscontinuity, type VarianceKind } from '@shared/estimation';
import { createRng } from '@shared/random/rng';
import { LEE_DESIGN, leeDesign } from '@tests/support/rd-designs';

/**
 * Check 2 of issue 3: the published simulation design — Model 1 of Imbens & Kalyanaraman (2012) and
 * Calonico, Cattaneo & Titiunik (2014), the fit to Lee (2008). Its coefficients, σ = 0.1295 and the
 * 2·Beta(2, 4) − 1 score are FROM MEMORY (METHODS §8 marks them so; the jump 0.52 − 0.48 = 0.04 is
 * internally consistent). The published coverage figures are not verified, so none is hard-coded:
 * we assert the robust 95% interval covers in [0.92, 0.97] (the band) and that the
 * conventional interval at the same MSE-optimal bandwidth covers less (CCT's point: the bias is
 * first order at h_MSE).
 */
const REPLICATIONS = 2000;
const N = 500;

function coverage(variance: VarianceKind, start: number) {
  const rng = createRng(start);
  let robust = 0;
  let conventional = 0;
  let meanH = 0;
  for (let r = 0; r < REPLICATIONS; r++) {
    const e = estimateDiscontinuity(leeDesign(rng, N), { cutoff: 0, eligibleSide: 'at-or-above', bandwidth: { rule: 'mse' }, variance });
    if (e.effect.robust.ciLow <= LEE_DESIGN.jump && LEE_DESIGN.jump <= e.effect.robust.ciHigh) robust++;
    if (e.effect.ciLow <= LEE_DESIGN.jump && LEE_DESIGN.jump <= e.effect.ciHigh) conventional++;
    meanH += e.bandwidth.h / REPLICATIONS;
  }
  return { robust: robust / REPLICATIONS, conventional: conventional / REPLICATIONS, meanH };
}

describe('Lee-based design (IK 2012 / CCT 2014 Model 1), n = 500, 2,000 replications', () => {
  it('robust bias-corrected 95% intervals cover in [0.92, 0.97]; conventional ones at h_MSE cover less', () => {
    // Default variance (HC3). Monte Carlo SE of a coverage near 0.94 with 2,000 replications ≈ 0.005.
    const hc3 = coverage('hc3', 2014);
    // Nearest-neighbour residuals (J = 3), reported beside it: in our runs about one point lower,
    // because σ̂² from three neighbours is noisy with ~50 observations per side inside h.
    const nn = coverage('nearest-neighbour', 2014);
    console.log(
      `Lee design n=${N}: robust coverage ${hc3.robust.toFixed(3)} (hc3), ${nn.robust.toFixed(3)} (nearest-neighbour); ` +
        `conventional at h_MSE ${hc3.conventional.toFixed(3)} (hc3), ${nn.conventional.toFixed(3)} (nearest-neighbour); mean h ${hc3.meanH.toFixed(4)}`,
    );
    expect(hc3.robust).toBeGreaterThanOrEqual(0.92);
    expect(hc3.robust).toBeLessThanOrEqual(0.97);
    expect(hc3.conventional).toBeLessThan(hc3.robust);
    expect(nn.conventional).toBeLessThan(nn.robust);
  });
});

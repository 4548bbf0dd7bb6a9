import { describe, expect, it } from 'vitest';
import { estimateDiscontinuity, selectBandwidth, type DiscontinuityEstimate, type DiscontinuityOptions } from '@shared/estimation';
import { createRng } from '@shared/random/rng';
import { fuzzyDesign, leeDesign } from '@tests/support/rd-designs';

/**
 * Check 4 of issue 3: invariances (identities of the estimator, derived) and the n^(−1/5) rate of the
 * MSE bandwidth for p = 1 (METHODS §3a/§3c: h_MSE ∝ n^(−1/(2p+3)), derived).
 */
const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
const options: DiscontinuityOptions = { cutoff: 0, eligibleSide: 'at-or-above' };
const data = fuzzyDesign(createRng(404), 8000);

/** The numbers that must not move, with a scale for outcome-unit quantities. */
function figures(e: DiscontinuityEstimate, k = 1) {
  return [
    [e.bandwidth.h, 1],
    [e.bandwidth.b, 1],
    [e.firstStage!.jump, 1],
    [e.firstStage!.se, 1],
    [e.firstStage!.robust.se, 1],
    [e.itt.jump, k],
    [e.itt.robust.estimate, k],
    [e.effect.estimate, k],
    [e.effect.se, Math.abs(k)],
    [e.effect.robust.estimate, k],
    [e.effect.robust.se, Math.abs(k)],
  ] as const;
}

describe('invariances of the estimate (derived)', () => {
  const reference = estimateDiscontinuity(data, options);

  it('shifting score and cutoff together changes nothing (to rounding)', () => {
    for (const shift of [1000, -37.25]) {
      const shifted = estimateDiscontinuity({ ...data, score: Float64Array.from(data.score, (x) => x + shift) }, { ...options, cutoff: shift });
      figures(shifted).forEach(([value], i) => expect(relative(value, figures(reference)[i]![0])).toBeLessThan(1e-7));
    }
  });

  it('scaling the outcome by k scales estimates by k and standard errors by |k|', () => {
    const k = -3.7;
    const scaled = estimateDiscontinuity({ ...data, outcome: Float64Array.from(data.outcome, (y) => k * y) }, options);
    figures(scaled).forEach(([value], i) => {
      const [base, factor] = figures(reference, k)[i]!;
      expect(relative(value, base * factor)).toBeLessThan(1e-9);
    });
  });

  it('mirroring the score (x → −x, eligible side flipped) changes nothing, bit for bit', () => {
    const mirrored = estimateDiscontinuity({ ...data, score: Float64Array.from(data.score, (x) => -x) }, { cutoff: 0, eligibleSide: 'at-or-below' });
    expect({ ...mirrored, options: null }).toEqual({ ...reference, options: null });
  });

  it('a fuzzy design whose take-up equals eligibility gives the sharp result', () => {
    const takeUp = Float64Array.from(data.score, (x) => (x >= 0 ? 1 : 0));
    const fuzzy = estimateDiscontinuity({ ...data, takeUp }, options);
    const sharp = estimateDiscontinuity({ score: data.score, outcome: data.outcome }, options);
    expect(relative(fuzzy.firstStage!.jump, 1)).toBeLessThan(1e-12);
    for (const [a, b] of [
      [fuzzy.bandwidth.h, sharp.bandwidth.h],
      [fuzzy.effect.estimate, sharp.effect.estimate],
      [fuzzy.effect.se, sharp.effect.se],
      [fuzzy.effect.robust.estimate, sharp.effect.robust.estimate],
      [fuzzy.effect.robust.se, sharp.effect.robust.se],
    ] as const) {
      expect(relative(a, b)).toBeLessThan(1e-9);
    }
  });
});

describe('the MSE bandwidth shrinks like n^(−1/5) for p = 1', () => {
  // Averages over replications of the Lee-based design (coefficients from memory, METHODS §8). The
  // rule's regularisation (Imbens & Kalyanaraman's) fades only slowly, so the rate is checked where
  // it has faded: n = 64,000 → 256,000, expected ratio 4^(−1/5) = 0.758.
  it('mean h(256,000) / mean h(64,000) is within 10% of 4^(−1/5)', () => {
    const rng = createRng(77);
    const mean = (n: number, reps: number) => {
      let s = 0;
      for (let r = 0; r < reps; r++) s += selectBandwidth(leeDesign(rng, n), options).h / reps;
      return s;
    };
    const small = mean(64_000, 20);
    const large = mean(256_000, 20);
    const expected = Math.pow(4, -1 / 5);
    console.log(`Lee design: mean h ${small.toFixed(4)} (n=64,000), ${large.toFixed(4)} (n=256,000); ratio ${(large / small).toFixed(3)}, expected ${expected.toFixed(3)}`);
    expect(relative(large / small, expected)).toBeLessThan(0.1);
  });

  // A design where the asymptotic constant is known in closed form (METHODS §3a, derived):
  // X ~ U(−1, 1) (f(0) = 1/2), m₋ = 0.3 + 0.8x + 1.5x², m₊ = 0.55 + 0.4x − x², σ = 0.3, triangular
  // kernel: h = 3.4375·[(2σ²)/(f·(m₊'' − m₋'')²)]^(1/5)·n^(−1/5) with m₊'' − m₋'' = −5.
  it('at n = 256,000 the mean h is within 10% of the asymptotic MSE-optimal bandwidth', () => {
    const rng = createRng(78);
    const n = 256_000;
    const reps = 10;
    let mean = 0;
    for (let r = 0; r < reps; r++) {
      const score = new Float64Array(n);
      const outcome = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const x = 2 * rng.uniform() - 1;
        score[i] = x;
        outcome[i] = (x >= 0 ? 0.55 + 0.4 * x - x * x : 0.3 + 0.8 * x + 1.5 * x * x) + 0.3 * rng.normal();
      }
      mean += selectBandwidth({ score, outcome }, options).h / reps;
    }
    const asymptotic = 3.4375 * Math.pow((2 * 0.09) / (0.5 * 25), 0.2) * Math.pow(n, -0.2);
    console.log(`quadratic design n=${n}: mean h ${mean.toFixed(4)}, asymptotic ${asymptotic.toFixed(4)}`);
    expect(relative(mean, asymptotic)).toBeLessThan(0.1);
  });
});

import type { DiscontinuityData } from '@shared/estimation';
import type { Rng } from '@shared/random/rng';

/**
 * Simulation designs for the engine's checks and benchmark. Every design says where it comes from.
 */

/**
 * Model 1 of Imbens & Kalyanaraman (2012) and Calonico, Cattaneo & Titiunik (2014): a fit to Lee's
 * (2008) vote-share data (METHODS §8). Score X = 2·Beta(2, 4) − 1, cutoff 0, eligible at or above,
 * ε ~ N(0, 0.1295²), true jump 0.04. The coefficients, σ and the score distribution are FROM MEMORY
 * (METHODS marks them so); they are internally consistent: μ₊(0) − μ₋(0) = 0.52 − 0.48 = 0.04.
 */
export const LEE_DESIGN = {
  cutoff: 0,
  jump: 0.04,
  sigma: 0.1295,
  below: [0.48, 1.27, 7.18, 20.21, 21.54, 7.33],
  above: [0.52, 0.84, -3.0, 7.99, -9.01, 3.56],
} as const;

function polynomial(coefficients: readonly number[], x: number): number {
  let v = 0;
  for (let j = coefficients.length - 1; j >= 0; j--) v = v * x + coefficients[j]!;
  return v;
}

/** The Lee-based sharp design: n draws. */
export function leeDesign(rng: Rng, n: number): DiscontinuityData {
  const score = new Float64Array(n);
  const outcome = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = 2 * rng.beta(2, 4) - 1;
    const mean = x >= 0 ? polynomial(LEE_DESIGN.above, x) : polynomial(LEE_DESIGN.below, x);
    score[i] = x;
    outcome[i] = mean + LEE_DESIGN.sigma * rng.normal();
  }
  return { score, outcome };
}

/**
 * Our own known-truth fuzzy design (no published source; the construction METHODS §8 suggests):
 * score X = 2·Beta(2, 4) − 1 as in the Lee design, cutoff 0, eligible at or above. Each unit is an
 * always-taker (10%), a never-taker (30%) or a complier (60%), independently of X, so the take-up
 * jump is 0.6. Y = μ₋(X) + level(type) + τ·D + ε with the Lee design's left polynomial μ₋ on both
 * sides (smooth, curved, no jump of its own), type levels +0.3 / −0.2 / 0 (selection on levels) and
 * heteroskedastic ε ~ N(0, (0.1295·(1 + |X|))²). The effect of taking part is τ = `FUZZY_DESIGN.effect`
 * for everyone, so the complier effect at the cutoff is τ and the ITT is 0.6·τ.
 */
export const FUZZY_DESIGN = {
  cutoff: 0,
  effect: 0.25,
  firstStage: 0.6,
  shares: { always: 0.1, never: 0.3 },
  levels: { always: 0.3, never: -0.2 },
} as const;

export function fuzzyDesign(rng: Rng, n: number): DiscontinuityData & { takeUp: Float64Array } {
  const score = new Float64Array(n);
  const outcome = new Float64Array(n);
  const takeUp = new Float64Array(n);
  const { shares, levels, effect } = FUZZY_DESIGN;
  for (let i = 0; i < n; i++) {
    const x = 2 * rng.beta(2, 4) - 1;
    const eligible = x >= 0 ? 1 : 0;
    const u = rng.uniform();
    const type = u < shares.always ? 'always' : u < shares.always + shares.never ? 'never' : 'complier';
    const d = type === 'always' ? 1 : type === 'never' ? 0 : eligible;
    const level = type === 'always' ? levels.always : type === 'never' ? levels.never : 0;
    score[i] = x;
    takeUp[i] = d;
    outcome[i] = polynomial(LEE_DESIGN.below, x) + level + effect * d + 0.1295 * (1 + Math.abs(x)) * rng.normal();
  }
  return { score, outcome, takeUp };
}

/**
 * A plain fuzzy design on a 0–100 score with cutoff 60 (at or above), for identities and the
 * benchmark: take-up 0.1 below and 0.7 at or above, Y = 2 + 0.03x + 0.0004x² + 1.5·D + ε with
 * heteroskedastic noise, and an office label 0–19 for clustering.
 */
export function plainFuzzyDesign(rng: Rng, n: number): DiscontinuityData & { takeUp: Float64Array; cluster: Int32Array } {
  const score = new Float64Array(n);
  const outcome = new Float64Array(n);
  const takeUp = new Float64Array(n);
  const cluster = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const x = 100 * rng.uniform();
    const office = rng.int(20);
    const d = rng.bernoulli(x >= 60 ? 0.7 : 0.1);
    score[i] = x;
    takeUp[i] = d;
    cluster[i] = office;
    outcome[i] = 2 + 0.03 * x + 0.0004 * x * x + 1.5 * d + 0.05 * office + (1 + 0.01 * x) * rng.normal();
  }
  return { score, outcome, takeUp, cluster };
}

import { Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { fuzzyDesign, leeDesign, plainFuzzyDesign } from '../../tests/support/rd-designs';
import { createRng } from '../random/rng';
import { coverageShrink } from './bandwidth';
import { EstimationError } from './errors';
import { estimateDiscontinuity, selectBandwidth } from './estimate';
import type { DiscontinuityData, DiscontinuityOptions } from './types';

const base: DiscontinuityOptions = { cutoff: 60, eligibleSide: 'at-or-above' };
const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

/** Weighted least squares of y on columns of X with weights w, by ml-matrix (general-purpose). */
function wls(x: number[][], y: number[], w: number[]) {
  const X = new Matrix(x);
  const WX = new Matrix(x.map((row, i) => row.map((v) => v * w[i]!)));
  const bread = inverse(X.transpose().mmul(WX));
  const beta = bread.mmul(WX.transpose().mmul(Matrix.columnVector(y))).getColumn(0);
  return { beta, bread };
}

/** Side-by-side local-linear pieces computed independently of the engine (triangular, order 1). */
function sideByHand(data: DiscontinuityData, cutoff: number, h: number, side: 1 | -1) {
  const rows: number[][] = [];
  const ys: number[] = [];
  const ds: number[] = [];
  const ws: number[] = [];
  for (let i = 0; i < data.score.length; i++) {
    const x = data.score[i]! - cutoff;
    if ((side === 1 ? x < 0 : x >= 0) || Math.abs(x) >= h) continue;
    rows.push([1, x]);
    ys.push(data.outcome[i]!);
    ds.push(data.takeUp ? data.takeUp[i]! : 0);
    ws.push(1 - Math.abs(x) / h);
  }
  const fy = wls(rows, ys, ws);
  const fd = wls(rows, ds, ws);
  // Equivalent-kernel weights ℓᵢ = wᵢ·e₀ᵀ(XᵀWX)⁻¹xᵢ.
  const ell = rows.map((r, i) => ws[i]! * (fy.bread.get(0, 0) * r[0]! + fy.bread.get(0, 1) * r[1]!));
  const ey = rows.map((r, i) => ys[i]! - fy.beta[0]! - fy.beta[1]! * r[1]!);
  const ed = rows.map((r, i) => ds[i]! - fd.beta[0]! - fd.beta[1]! * r[1]!);
  return { rows, ys, ws, ell, ey, ed, muY: fy.beta[0]!, muD: fd.beta[0]! };
}

describe('estimateDiscontinuity: identities', () => {
  const { cluster: offices, ...data } = plainFuzzyDesign(createRng(101), 4000);

  it('the local-linear limit equals the closed form (S₂T₀ − S₁T₁)/(S₀S₂ − S₁²) (METHODS §1a, derived)', () => {
    const r = estimateDiscontinuity({ score: data.score, outcome: data.outcome }, { ...base, bandwidth: 12, variance: 'hc0' });
    const S = [0, 0, 0];
    const T = [0, 0];
    for (let i = 0; i < data.score.length; i++) {
      const x = data.score[i]! - 60;
      if (x < 0 || x >= 12) continue;
      const w = 1 - x / 12;
      for (let k = 0; k < 3; k++) S[k]! += w * x ** k;
      for (let k = 0; k < 2; k++) T[k]! += w * x ** k * data.outcome[i]!;
    }
    const closed = (S[2]! * T[0]! - S[1]! * T[1]!) / (S[0]! * S[2]! - S[1]! ** 2);
    expect(relative(r.limits.eligible.outcome, closed)).toBeLessThan(1e-11);
  });

  it('with the uniform kernel and every point inside, the jump is the OLS coefficient on Z in y ~ 1 + Z + x + Z·x (METHODS §1b)', () => {
    const r = estimateDiscontinuity({ score: data.score, outcome: data.outcome }, { ...base, bandwidth: 100, kernel: 'uniform', variance: 'hc0' });
    const rows: number[][] = [];
    for (let i = 0; i < data.score.length; i++) {
      const x = data.score[i]! - 60;
      const z = x >= 0 ? 1 : 0;
      rows.push([1, z, x, z * x]);
    }
    const { beta } = wls(rows, Array.from(data.outcome), rows.map(() => 1));
    expect(relative(r.itt.jump, beta[1]!)).toBeLessThan(1e-10);
  });

  it('the delta-method variance equals the structural-residual variance (METHODS §2b, derived)', () => {
    const h = 15;
    const r = estimateDiscontinuity(data, { ...base, bandwidth: h, variance: 'hc0' });
    const above = sideByHand(data, 60, h, 1);
    const below = sideByHand(data, 60, h, -1);
    const a = above.muY - below.muY;
    const b = above.muD - below.muD;
    const tau = a / b;
    let v = 0;
    for (const s of [above, below]) s.ell.forEach((l, i) => (v += l * l * (s.ey[i]! - tau * s.ed[i]!) ** 2));
    v /= b * b;
    expect(relative(r.effect.estimate, tau)).toBeLessThan(1e-11);
    expect(relative(r.effect.se ** 2, v)).toBeLessThan(1e-10);
  });

  // ρ = 1: the bias-corrected order p limit is the order p + 1 limit at h and its robust variance is
  // that fit's own sandwich (Frisch–Waugh, METHODS §3c, derived).
  it.each([
    ['hc0', 1],
    ['hc3', 1],
    ['nearest-neighbour', 1],
    ['hc1', 0],
    ['hc2', 0],
  ] as const)('b = h makes the robust %s result the order p + 1 fit (p = %i)', (variance, order) => {
    const robust = estimateDiscontinuity(data, { ...base, bandwidth: 14, order, variance });
    const higher = estimateDiscontinuity(data, { ...base, bandwidth: 14, order: (order + 1) as 1 | 2, variance });
    for (const [got, want] of [
      [robust.itt.robust.estimate, higher.itt.jump],
      [robust.itt.robust.se, higher.itt.se],
      [robust.firstStage!.robust.estimate, higher.firstStage!.jump],
      [robust.effect.robust.estimate, higher.effect.estimate],
      [robust.effect.robust.se, higher.effect.se],
    ] as const) {
      expect(relative(got, want)).toBeLessThan(1e-10);
    }
  });

  it('one cluster per observation gives HC0 × G/(G − 1) (METHODS §2e, derived)', () => {
    const cluster = Int32Array.from(data.score, (_, i) => i);
    const plain = estimateDiscontinuity(data, { ...base, bandwidth: 10, variance: 'hc0' });
    const clustered = estimateDiscontinuity({ ...data, cluster }, { ...base, bandwidth: 10, variance: 'hc0' });
    const g = plain.n.usedIneligible + plain.n.usedEligible;
    expect(clustered.n.clusters).toBe(g);
    expect(relative(clustered.itt.se ** 2, (plain.itt.se ** 2 * g) / (g - 1))).toBeLessThan(1e-10);
    expect(relative(clustered.effect.se ** 2, (plain.effect.se ** 2 * g) / (g - 1))).toBeLessThan(1e-10);
  });

  it('HC1 scales each side by nₛ/(nₛ − (p + 1)) (METHODS §2a)', () => {
    const sharp = { score: data.score, outcome: data.outcome };
    const hc0 = estimateDiscontinuity(sharp, { ...base, bandwidth: 10, variance: 'hc0' });
    const hc1 = estimateDiscontinuity(sharp, { ...base, bandwidth: 10, variance: 'hc1' });
    const below = sideByHand(sharp, 60, 10, -1);
    const above = sideByHand(sharp, 60, 10, 1);
    const side = (s: typeof below) => s.ell.reduce((acc, l, i) => acc + l * l * s.ey[i]! ** 2, 0);
    const nb = below.rows.length;
    const na = above.rows.length;
    expect(relative(hc0.itt.se ** 2, side(below) + side(above))).toBeLessThan(1e-10);
    expect(relative(hc1.itt.se ** 2, (side(below) * nb) / (nb - 2) + (side(above) * na) / (na - 2))).toBeLessThan(1e-10);
  });

  it('a fuzzy design whose take-up is eligibility gives the sharp result (METHODS §1b, derived)', () => {
    const takeUp = Float64Array.from(data.score, (x) => (x >= 60 ? 1 : 0));
    const sharp = estimateDiscontinuity({ score: data.score, outcome: data.outcome }, base);
    const fuzzy = estimateDiscontinuity({ score: data.score, outcome: data.outcome, takeUp }, base);
    expect(fuzzy.firstStage!.jump).toBeCloseTo(1, 12);
    expect(relative(fuzzy.bandwidth.h, sharp.bandwidth.h)).toBeLessThan(1e-9);
    expect(relative(fuzzy.effect.estimate, sharp.effect.estimate)).toBeLessThan(1e-9);
    expect(relative(fuzzy.effect.se, sharp.effect.se)).toBeLessThan(1e-9);
    expect(relative(fuzzy.effect.robust.se, sharp.effect.robust.se)).toBeLessThan(1e-9);
  });

  it('mirroring the score and flipping the eligible side changes nothing, bit for bit', () => {
    const mirrored = { ...data, score: Float64Array.from(data.score, (x) => -x) };
    const a = estimateDiscontinuity(data, base);
    const b = estimateDiscontinuity(mirrored, { cutoff: -60, eligibleSide: 'at-or-below' });
    expect({ ...b, options: null }).toEqual({ ...a, options: null });
  });

  it('a score exactly at the cutoff is eligible, on either side convention', () => {
    const score = Float64Array.from([50, 55, 58, 59, 60, 60, 61, 62, 65, 70, 52, 57, 63, 68]);
    const outcome = Float64Array.from(score, (x, i) => x / 10 + (i % 3) * 0.1);
    const up = estimateDiscontinuity({ score, outcome }, { ...base, bandwidth: 20, variance: 'hc0' });
    expect(up.n).toMatchObject({ ineligible: 6, eligible: 8 });
    const down = estimateDiscontinuity({ score, outcome }, { cutoff: 60, eligibleSide: 'at-or-below', bandwidth: 20, variance: 'hc0' });
    expect(down.n).toMatchObject({ ineligible: 6, eligible: 8 });
  });

  it('returns a plain JSON-serialisable object', () => {
    const r = estimateDiscontinuity({ ...data, cluster: offices }, base);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(r.options).toMatchObject({ kernel: 'triangular', order: 1, variance: 'hc1', level: 0.95, clustered: true });
    expect(r.n.clusters).toBe(20);
  });
});

describe('estimateDiscontinuity: bandwidth rules', () => {
  const data = leeDesign(createRng(7), 3000);
  const lee: DiscontinuityOptions = { cutoff: 0, eligibleSide: 'at-or-above' };

  it('CER shrink n^(−p/((3+p)(3+2p))): 0.7329 for n = 500, p = 1; exponent 2/35 for p = 2 (METHODS §3d)', () => {
    expect(coverageShrink(500, 1)).toBeCloseTo(0.732911, 6);
    expect(Math.log(coverageShrink(1000, 2)) / Math.log(1000)).toBeCloseTo(-2 / 35, 12);
    const mse = selectBandwidth(data, { ...lee, bandwidth: { rule: 'mse' } });
    const cer = selectBandwidth(data, { ...lee, bandwidth: { rule: 'coverage' } });
    expect(relative(cer.h, mse.h * coverageShrink(3000, 1))).toBeLessThan(1e-12);
    expect(cer.b).toBe(mse.b);
  });

  // METHODS §3f [derived]: every rule is scale-equivariant in the score and invariant to the outcome's
  // location and scale.
  it.each(['mse', 'mse-per-side', 'coverage', 'ik'] as const)('%s: ×10 score ⇒ ×10 bandwidth; outcome shift/scale ⇒ same', (rule) => {
    const options = { ...lee, bandwidth: { rule } };
    const h = selectBandwidth(data, options);
    const scaled = selectBandwidth({ ...data, score: Float64Array.from(data.score, (x) => 10 * x) }, options);
    const moved = selectBandwidth({ ...data, outcome: Float64Array.from(data.outcome, (y) => 3 * y + 7) }, options);
    for (const [got, want] of [
      [scaled.sides.ineligible.h, 10 * h.sides.ineligible.h],
      [scaled.sides.eligible.h, 10 * h.sides.eligible.h],
      [scaled.sides.eligible.b, 10 * h.sides.eligible.b],
      [moved.sides.ineligible.h, h.sides.ineligible.h],
      [moved.sides.eligible.b, h.sides.eligible.b],
    ] as const) {
      expect(relative(got, want)).toBeLessThan(1e-8);
    }
    expect(h.h).toBeGreaterThan(0.02);
    expect(h.h).toBeLessThan(1);
  });

  it('a fuzzy rule gives a usable (h, b) and records its pilot', () => {
    const fuzzy = fuzzyDesign(createRng(8), 5000);
    const r = estimateDiscontinuity(fuzzy, lee);
    expect(r.bandwidth.rule).toBe('mse');
    expect(r.bandwidth.pilot!.ratio).not.toBeNull();
    expect(r.bandwidth.b).toBeGreaterThan(r.bandwidth.h * 0.5);
    expect(r.effect.robust.ciLow).toBeLessThan(r.effect.robust.ciHigh);
  });
});

describe('estimateDiscontinuity: errors', () => {
  const { cluster: offices, ...data } = plainFuzzyDesign(createRng(5), 600);

  it('throws typed argument errors that name the function', () => {
    const call = (d: unknown, o: unknown) => () => estimateDiscontinuity(d as DiscontinuityData, o as DiscontinuityOptions);
    expect(call({ score: [1, 2], outcome: data.outcome }, base)).toThrow(TypeError);
    expect(call({ ...data, score: data.score.slice(1) }, base)).toThrow(/estimateDiscontinuity: data.outcome has 600 entries/);
    const nan = data.score.slice();
    nan[17] = Number.NaN;
    expect(call({ ...data, score: nan }, base)).toThrow(/estimateDiscontinuity: data.score\[17\] is not a finite number/);
    const half = data.takeUp.slice();
    half[3] = 0.5;
    expect(call({ ...data, takeUp: half }, base)).toThrow(/data.takeUp\[3\] is 0.5; take-up must be 0 or 1/);
    expect(call(data, { ...base, order: 3 })).toThrow(/options.order/);
    expect(call(data, { ...base, level: 1.5 })).toThrow(/options.level/);
    expect(call(data, { ...base, bandwidth: -2 })).toThrow(/options.bandwidth/);
    expect(call(data, { ...base, bandwidth: { rule: 'ik' }, order: 2 })).toThrow(/Imbens–Kalyanaraman/);
    expect(call(data, { ...base, kernel: 'gaussian' })).toThrow(RangeError);
    expect(call(data, { ...base, variance: 'nearest-neighbour' })).not.toThrow();
    expect(call({ ...data, cluster: offices }, { ...base, variance: 'nearest-neighbour' })).toThrow(/hc0 or hc1/);
  });

  const codeOf = (f: () => unknown) => {
    try {
      f();
    } catch (err) {
      return err instanceof EstimationError ? err.code : String(err);
    }
    return 'no error';
  };

  it('reports too few observations inside h', () => {
    expect(codeOf(() => estimateDiscontinuity(data, { ...base, bandwidth: 0.5 }))).toBe('too_few_observations');
  });

  it('reports a singular fit when a side has one distinct score', () => {
    const score = Float64Array.from(data.score, (x) => (x >= 60 ? 70 : x));
    expect(codeOf(() => estimateDiscontinuity({ score, outcome: data.outcome }, { ...base, bandwidth: 20 }))).toBe('singular_fit');
  });

  it('reports take-up without variation, and take-up without a jump', () => {
    const ones = new Float64Array(600).fill(1);
    expect(codeOf(() => estimateDiscontinuity({ ...data, takeUp: ones }, { ...base, bandwidth: 20 }))).toBe('no_take_up_variation');
    // Scores and take-up mirror each other around the cutoff: both fitted limits coincide.
    const score = new Float64Array(400);
    const takeUp = new Float64Array(400);
    for (let i = 0; i < 200; i++) {
      score[i] = 60 + (i + 1) * 0.1;
      score[200 + i] = 60 - (i + 1) * 0.1;
      takeUp[i] = takeUp[200 + i] = i % 3 === 0 ? 1 : 0;
    }
    const outcome = Float64Array.from(score, (x) => x / 100);
    expect(codeOf(() => estimateDiscontinuity({ score, outcome, takeUp }, { ...base, bandwidth: 15, variance: 'hc0' }))).toBe('no_first_stage');
  });

  it('reports an undefined bandwidth when the outcome does not vary', () => {
    const flat = new Float64Array(600).fill(3);
    expect(codeOf(() => estimateDiscontinuity({ score: data.score, outcome: flat }, base))).toBe('bandwidth_undefined');
  });

  it('reports an empty side', () => {
    const score = Float64Array.from(data.score, (x) => x / 2);
    expect(codeOf(() => estimateDiscontinuity({ score, outcome: data.outcome }, { ...base, bandwidth: 5 }))).toBe('too_few_observations');
  });
});

import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { localRandomization } from './local-randomization';

describe('localRandomization', () => {
  // METHODS §10: with every assignment enumerated, the p-value is the count of assignments at
  // least as extreme divided by C(n, n₁). Here 10 per side, C(20, 10) = 184,756, counted by brute
  // force over all 2²⁰ subsets.
  it('equals the exact enumeration count when all assignments are used', () => {
    const rng = createRng(4);
    const t = Float64Array.from({ length: 20 }, (_, i) => (i < 10 ? -1 - i : i - 10));
    const y = Float64Array.from(t, (v) => (v >= 0 ? 0.6 : 0) + rng.normal());
    const r = localRandomization({ t, outcome: y }, { permutations: 200_000 });
    expect(r.exact).toBe(true);
    expect(r.permutations).toBe(184_756);
    const observed = mean(y.slice(10)) - mean(y.slice(0, 10));
    let extreme = 0;
    let total = 0;
    for (let mask = 0; mask < 1 << 20; mask++) {
      if (popcount(mask) !== 10) continue;
      total++;
      let s1 = 0;
      let s0 = 0;
      for (let j = 0; j < 20; j++) {
        if ((mask >> j) & 1) s1 += y[j]!;
        else s0 += y[j]!;
      }
      extreme += +(Math.abs(s1 / 10 - s0 / 10) >= Math.abs(observed) * (1 - 1e-12) - 1e-15);
    }
    expect(total).toBe(184_756);
    expect(r.ittP).toBeCloseTo(extreme / total, 12);
    expect(r.itt).toBeCloseTo(observed, 12);
  });

  it('gives a Wald ratio with an interval that contains it, in the largest window whose nested windows all balance', () => {
    const rng = createRng(8);
    const n = 3000;
    const t = Float64Array.from({ length: n }, () => 2 * rng.uniform() - 1);
    const d = Float64Array.from(t, (v) => rng.bernoulli(v >= 0 ? 0.7 : 0.1));
    const y = Float64Array.from(t, (v, i) => 0.5 * d[i]! + 0.2 * v + rng.normal());
    const x = Float64Array.from(t, () => rng.normal());
    const r = localRandomization({ t, outcome: y, takeUp: d, covariates: [x] }, { maxWindow: 0.3, permutations: 1000 });
    expect(r.window).toBeLessThanOrEqual(0.3);
    // The rule of Cattaneo, Frandsen & Titiunik (2015): windows are nested, smallest first; the
    // chosen one and all smaller ones pass (p > 0.15), the next one checked does not.
    const passing = r.windows.findIndex((w) => !(w.minBalanceP! > 0.15));
    const lastPassing = passing < 0 ? r.windows.length - 1 : passing - 1;
    if (lastPassing >= 0) {
      expect(r.windowRule).toBe('covariate-balance');
      expect(r.window).toBe(r.windows[lastPassing]!.window);
    } else {
      expect(r.windowRule).toBe('smallest-usable');
      expect(r.window).toBe(r.windows[0]!.window);
    }
    expect(r.effect).toBeCloseTo(r.itt / r.firstStage!, 12);
    expect(r.ciLow!).toBeLessThan(r.effect!);
    expect(r.ciHigh!).toBeGreaterThan(r.effect!);
    expect(r.windows[0]!.nIneligible).toBeGreaterThanOrEqual(10);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
});

function mean(x: Float64Array): number {
  return x.reduce((s, v) => s + v, 0) / x.length;
}

function popcount(v: number): number {
  let c = 0;
  for (let m = v; m; m &= m - 1) c++;
  return c;
}

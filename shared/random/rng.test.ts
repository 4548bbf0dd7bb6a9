import { describe, expect, it } from 'vitest';
import { createRng } from './rng';

describe('createRng', () => {
  it('repeats the same stream for the same start value', () => {
    const a = createRng(42);
    const b = createRng(42);
    for (let i = 0; i < 100; i++) expect(a.uniform()).toBe(b.uniform());
    expect(createRng(43).uniform()).not.toBe(createRng(42).uniform());
  });

  // Moments of textbook distributions (identities: E[Beta(a,b)] = a/(a+b), E[Poisson] = Var = λ,
  // E[Gamma(k)] = k, standard normal mean 0 and variance 1). Tolerances are ~5 Monte Carlo SEs.
  it('draws with the right first two moments', () => {
    const rng = createRng(7);
    const n = 200_000;
    const moments = (draw: () => number) => {
      let s = 0;
      let s2 = 0;
      for (let i = 0; i < n; i++) {
        const v = draw();
        s += v;
        s2 += v * v;
      }
      const mean = s / n;
      return { mean, variance: s2 / n - mean * mean };
    };
    const u = moments(rng.uniform);
    expect(u.mean).toBeCloseTo(0.5, 2);
    expect(u.variance).toBeCloseTo(1 / 12, 2);
    const z = moments(rng.normal);
    expect(Math.abs(z.mean)).toBeLessThan(0.012);
    expect(Math.abs(z.variance - 1)).toBeLessThan(0.016);
    const beta = moments(() => rng.beta(2, 4));
    expect(Math.abs(beta.mean - 1 / 3)).toBeLessThan(0.002);
    // Var Beta(a,b) = ab / ((a+b)^2 (a+b+1)) = 8/252
    expect(Math.abs(beta.variance - 8 / 252)).toBeLessThan(0.001);
    const pois = moments(() => rng.poisson(2.5));
    expect(Math.abs(pois.mean - 2.5)).toBeLessThan(0.02);
    expect(Math.abs(pois.variance - 2.5)).toBeLessThan(0.05);
    const gamma = moments(() => rng.gamma(0.5));
    expect(Math.abs(gamma.mean - 0.5)).toBeLessThan(0.01);
  });
});

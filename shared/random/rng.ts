/**
 * A small deterministic pseudo-random generator for simulations, demo data and tests, so every
 * run with the same start value draws the same numbers on every platform.
 *
 * sfc32 (Chris Doty-Humphrey's "small fast chaotic" generator, from PractRand), seeded through
 * splitmix32 so that nearby start values give unrelated streams. Not for cryptography.
 */
export interface Rng {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal, Box–Muller (both variates used). */
  normal(): number;
  /** Integer in [0, n). */
  int(n: number): number;
  /** Bernoulli(p) as 0 or 1. */
  bernoulli(p: number): 0 | 1;
  /** Gamma(shape, 1), Marsaglia & Tsang (2000), "A simple method for generating gamma variables". */
  gamma(shape: number): number;
  /** Beta(a, b) as X/(X+Y) with X ~ Gamma(a), Y ~ Gamma(b). */
  beta(a: number, b: number): number;
  /** Poisson(lambda): inversion by sequential search, fine for lambda below ~30. */
  poisson(lambda: number): number;
}

/** @example createRng(7).uniform() // same value on every run */
export function createRng(start: number): Rng {
  let s = start >>> 0;
  const splitmix = (): number => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  let a = splitmix();
  let b = splitmix();
  let c = splitmix();
  let d = splitmix();
  const next = (): number => {
    const t = (((a + b) >>> 0) + d) >>> 0;
    d = (d + 1) >>> 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) >>> 0;
    c = ((c << 21) | (c >>> 11)) >>> 0;
    c = (c + t) >>> 0;
    return t;
  };
  for (let i = 0; i < 12; i++) next();

  const uniform = (): number => next() / 4294967296;
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    const theta = 2 * Math.PI * uniform();
    spare = r * Math.sin(theta);
    return r * Math.cos(theta);
  };
  const gamma = (shape: number): number => {
    if (!(shape > 0)) throw new RangeError('gamma: shape must be positive');
    if (shape < 1) return gamma(shape + 1) * Math.pow(uniform() || Number.MIN_VALUE, 1 / shape);
    const dd = shape - 1 / 3;
    const cc = 1 / Math.sqrt(9 * dd);
    for (;;) {
      let x: number;
      let v: number;
      do {
        x = normal();
        v = 1 + cc * x;
      } while (v <= 0);
      v = v * v * v;
      const u = uniform();
      if (u < 1 - 0.0331 * x ** 4) return dd * v;
      if (Math.log(u) < 0.5 * x * x + dd * (1 - v + Math.log(v))) return dd * v;
    }
  };
  return {
    uniform,
    normal,
    int: (n) => Math.floor(uniform() * n),
    bernoulli: (p) => (uniform() < p ? 1 : 0),
    gamma,
    beta: (x, y) => {
      const g1 = gamma(x);
      return g1 / (g1 + gamma(y));
    },
    poisson: (lambda) => {
      if (!(lambda >= 0)) throw new RangeError('poisson: lambda must be non-negative');
      let k = 0;
      let p = Math.exp(-lambda);
      let cdf = p;
      const u = uniform();
      while (u > cdf && k < 1000) {
        k += 1;
        p *= lambda / k;
        cdf += p;
      }
      return k;
    },
  };
}

/**
 * Standard normal CDF and quantile for p-values and critical values.
 *
 * Stand-in until the estimation engine's `normalCdf` / `normalQuantile` are on main; then this file
 * goes and the imports point at `../estimation`. Φ uses erf's power series below |x| = 3
 * (Abramowitz & Stegun 7.1.5) and the Laplace continued fraction for the upper tail above
 * (A&S 26.2.14), both accurate to ~1e-14 here; Φ⁻¹ is Newton's method on Φ.
 */
const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

export function normalDensity(z: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}

/** Upper tail 1 − Φ(z) for z ≥ 0. */
function upperTail(z: number): number {
  if (z < 3) {
    // Φ(z) − 1/2 = φ(z)·Σ z^(2k+1)/(1·3·…·(2k+1)) (A&S 26.2.11), no cancellation for z ≥ 0.
    let term = z;
    let sum = z;
    for (let k = 1; k < 300 && term > 1e-17 * sum; k++) {
      term *= (z * z) / (2 * k + 1);
      sum += term;
    }
    return 0.5 - normalDensity(z) * sum;
  }
  if (z > 38) return 0;
  // 1 − Φ(z) = φ(z) / (z + 1/(z + 2/(z + 3/(z + …)))), evaluated from the tail.
  let f = z;
  for (let k = 60; k >= 1; k--) f = z + k / f;
  return normalDensity(z) / f;
}

/** Φ(z). */
export function normalCdf(z: number): number {
  return z >= 0 ? 1 - upperTail(z) : upperTail(-z);
}

/** Two-sided p-value 2·(1 − Φ(|z|)). */
export function twoSidedP(z: number): number {
  return Math.min(1, 2 * upperTail(Math.abs(z)));
}

/** Φ⁻¹(p) for p in (0, 1). @example normalQuantile(0.975) // 1.959963984540054 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile: p must be in (0, 1), got ${p}`);
  if (p < 0.5) return -normalQuantile(1 - p);
  const q = 1 - p;
  let z = Math.sqrt(-2 * Math.log(q)); // start above the root; Newton on a convex tail converges
  z -= (2.515517 + 0.802853 * z + 0.010328 * z * z) / (1 + 1.432788 * z + 0.189269 * z * z + 0.001308 * z * z * z);
  for (let i = 0; i < 60; i++) {
    const step = (upperTail(z) - q) / normalDensity(z);
    z += step;
    if (Math.abs(step) < 1e-15 * Math.max(1, z)) break;
  }
  return z;
}

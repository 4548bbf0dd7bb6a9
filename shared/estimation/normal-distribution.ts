/**
 * Standard normal distribution to double precision, for p-values and interval half-widths.
 * (simple-statistics' normal CDF is a two-decimal table lookup: too coarse for p-values.)
 */

const SQRT_PI = Math.sqrt(Math.PI);
const SQRT_2 = Math.SQRT2;
const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/**
 * erfc(x) for x ≥ 0. Below 2: 1 − erf(x) with the all-positive series
 * erf(x) = (2/√π)·e^(−x²)·Σₙ 2ⁿx^(2n+1)/(1·3·…·(2n+1)) (Abramowitz & Stegun 7.1.6), which has no
 * cancellation. From 2 up: the continued fraction
 * erfc(x) = (e^(−x²)/√π)·1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))) (A&S 7.1.14),
 * evaluated by the modified Lentz method.
 */
function erfcNonNegative(x: number): number {
  if (x < 2) {
    let term = x;
    let sum = x;
    for (let n = 1; n < 200; n++) {
      term *= (2 * x * x) / (2 * n + 1);
      sum += term;
      if (term < sum * 1e-17) break;
    }
    return 1 - (2 / SQRT_PI) * Math.exp(-x * x) * sum;
  }
  if (x > 27) return 0; // e^(−729) underflows
  // f = x + a₁/(x + a₂/(x + …)) with aₖ = k/2.
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    const a = k / 2;
    d = x + a * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = x + a / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / (SQRT_PI * f);
}

/** Standard normal density φ(z). */
export function normalDensity(z: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}

/** Standard normal CDF Φ(z), accurate in both tails. */
export function normalCdf(z: number): number {
  if (Number.isNaN(z)) return Number.NaN;
  return z < 0 ? 0.5 * erfcNonNegative(-z / SQRT_2) : 1 - 0.5 * erfcNonNegative(z / SQRT_2);
}

/** Upper tail 1 − Φ(z), without cancellation for large z. */
export function normalUpperTail(z: number): number {
  return normalCdf(-z);
}

/** Two-sided p-value 2·(1 − Φ(|z|)). */
export function twoSidedP(z: number): number {
  return Math.min(1, 2 * normalUpperTail(Math.abs(z)));
}

/**
 * Φ⁻¹(p): a starting value from Abramowitz & Stegun 26.2.23 (|error| < 4.5e-4), then Halley steps
 * on the accurate CDF until the step is below 1e-15 (so the result does not depend on the starting
 * formula's constants).
 * @example normalQuantile(0.975) // 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile: p must be in (0, 1), got ${p}`);
  const lower = p < 0.5;
  const q = lower ? p : 1 - p;
  const t = Math.sqrt(-2 * Math.log(q));
  let z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  // Work on the upper tail of size q: solve 1 − Φ(z) = q for z > 0.
  for (let i = 0; i < 50; i++) {
    const e = (normalUpperTail(z) - q) / normalDensity(z); // = −(f(z))/f'(z) with f = Φ̄ − q
    const step = e / (1 - (z * e) / 2);
    z += step;
    if (Math.abs(step) < 1e-15 * Math.max(1, Math.abs(z))) break;
  }
  return lower ? -z : z;
}

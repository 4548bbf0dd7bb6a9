/**
 * Small single passes over Float64Arrays, each its own function so V8 optimises it whole (a loop
 * inside a long orchestrating function is compiled on the stack and deoptimised by the code after
 * it on every call).
 */

/** Sample standard deviation (n − 1 denominator), two passes for accuracy. */
export function standardDeviation(values: Float64Array): number {
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i]!;
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i]! - mean;
    ss += d * d;
  }
  return Math.sqrt(ss / Math.max(1, n - 1));
}

/** out[i] = a[i] − k·b[i]. */
export function subtractScaled(a: Float64Array, b: Float64Array, k: number, out: Float64Array): Float64Array {
  for (let i = 0; i < out.length; i++) out[i] = a[i]! - k * b[i]!;
  return out;
}

/** Σ values[i]² over [lo, hi). */
export function sumOfSquares(values: Float64Array, lo: number, hi: number): number {
  let s = 0;
  for (let i = lo; i < hi; i++) s += values[i]! * values[i]!;
  return s;
}

/** Whether every value equals the first. */
export function isConstant(values: Float64Array): boolean {
  const first = values[0];
  for (let i = 1; i < values.length; i++) if (values[i] !== first) return false;
  return true;
}

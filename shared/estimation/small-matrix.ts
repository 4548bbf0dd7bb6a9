/**
 * Tiny dense symmetric matrices (at most 5×5 here) stored row-major in Float64Arrays. Hand-written
 * because the engine inverts thousands of 2×2–5×5 moment matrices per analysis and a general
 * matrix library's allocations would dominate.
 */

/** Relative pivot below which a moment matrix counts as singular (collinear or too few distinct scores). */
export const SINGULAR_PIVOT = 1e-12;

/**
 * Inverse of a symmetric positive-definite k×k matrix by Cholesky factorisation A = LLᵀ.
 * @returns the inverse, or null when a pivot falls below `SINGULAR_PIVOT` times the largest
 *   diagonal entry (the matrix is singular to working precision).
 */
export function invertSymmetric(a: Float64Array, k: number): Float64Array | null {
  if (a.length !== k * k) throw new RangeError(`invertSymmetric: expected ${k * k} entries, got ${a.length}`);
  let scale = 0;
  for (let i = 0; i < k; i++) scale = Math.max(scale, Math.abs(a[i * k + i]!));
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  const l = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    let d = a[j * k + j]!;
    for (let m = 0; m < j; m++) d -= l[j * k + m]! * l[j * k + m]!;
    if (!(d > SINGULAR_PIVOT * scale)) return null;
    const ljj = Math.sqrt(d);
    l[j * k + j] = ljj;
    for (let i = j + 1; i < k; i++) {
      let s = a[i * k + j]!;
      for (let m = 0; m < j; m++) s -= l[i * k + m]! * l[j * k + m]!;
      l[i * k + j] = s / ljj;
    }
  }
  // inv(L) by forward substitution, then A⁻¹ = inv(L)ᵀ inv(L).
  const li = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    li[j * k + j] = 1 / l[j * k + j]!;
    for (let i = j + 1; i < k; i++) {
      let s = 0;
      for (let m = j; m < i; m++) s -= l[i * k + m]! * li[m * k + j]!;
      li[i * k + j] = s / l[i * k + i]!;
    }
  }
  const inv = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let m = i; m < k; m++) s += li[m * k + i]! * li[m * k + j]!;
      inv[i * k + j] = s;
      inv[j * k + i] = s;
    }
  }
  return inv;
}

/** y = A x for a k×k matrix. */
export function multiplyVector(a: Float64Array, x: ArrayLike<number>, k: number): Float64Array {
  const y = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let s = 0;
    for (let j = 0; j < k; j++) s += a[i * k + j]! * x[j]!;
    y[i] = s;
  }
  return y;
}

/** Row i of a k×k matrix, times a factor. */
export function matrixRow(a: Float64Array, i: number, k: number, factor = 1): Float64Array {
  const row = new Float64Array(k);
  for (let j = 0; j < k; j++) row[j] = factor * a[i * k + j]!;
  return row;
}

/** Σ x_j y_j. */
export function dot(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += x[j]! * y[j]!;
  return s;
}

/**
 * Weighted least squares of y on (1, u, u², …, uᵖ) with u = x/scale — the building block of the
 * density tests, the bin-count rule and the chart's fitted lines. Sums only, no allocation per
 * row. Working on u = x/scale keeps the moment matrix well conditioned (scale ≈ the window's width).
 */
export interface PolynomialFit {
  order: number;
  /** x is divided by this before the powers are taken. */
  scale: number;
  /** Coefficients on (1, u, …, uᵖ). */
  coefficients: Float64Array;
  /** (Σ wᵢ rᵢrᵢᵀ)⁻¹, (order+1)² row-major, in u units. */
  inverseGram: Float64Array;
  /** Observations with positive weight. */
  used: number;
  /** Σ wᵢ. */
  weightSum: number;
}

/**
 * Fits the polynomial; `weights` null means every weight is 1. Entries with weight 0 are ignored.
 * @returns null when fewer than order + 1 entries have positive weight or the fit is singular.
 */
export function fitPolynomial(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  weights: ArrayLike<number> | null,
  order: number,
  scale = 1,
): PolynomialFit | null {
  if (!Number.isInteger(order) || order < 0 || order > 6) throw new RangeError(`fitPolynomial: order must be 0…6, got ${order}`);
  if (!(scale > 0)) throw new RangeError(`fitPolynomial: scale must be positive, got ${scale}`);
  const k = order + 1;
  const moments = new Float64Array(2 * k - 1);
  const cross = new Float64Array(k);
  let used = 0;
  let weightSum = 0;
  for (let i = 0; i < x.length; i++) {
    const w = weights ? weights[i]! : 1;
    if (!(w > 0)) continue;
    used += 1;
    weightSum += w;
    const u = x[i]! / scale;
    let pw = w;
    for (let j = 0; j < 2 * k - 1; j++) {
      moments[j]! += pw;
      if (j < k) cross[j]! += pw * y[i]!;
      pw *= u;
    }
  }
  if (used < k) return null;
  const gram = new Float64Array(k * k);
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) gram[a * k + b] = moments[a + b]!;
  const inverseGram = invertPositiveDefinite(gram, k);
  if (!inverseGram) return null;
  const coefficients = new Float64Array(k);
  for (let a = 0; a < k; a++) {
    let s = 0;
    for (let b = 0; b < k; b++) s += inverseGram[a * k + b]! * cross[b]!;
    coefficients[a] = s;
  }
  return { order, scale, coefficients, inverseGram, used, weightSum };
}

/** Fitted value at x. */
export function polynomialValue(fit: PolynomialFit, x: number): number {
  const u = x / fit.scale;
  let v = 0;
  for (let j = fit.order; j >= 0; j--) v = v * u + fit.coefficients[j]!;
  return v;
}

/** d-th derivative with respect to x at x. */
export function polynomialDerivative(fit: PolynomialFit, x: number, d: number): number {
  const u = x / fit.scale;
  let v = 0;
  for (let j = fit.order; j >= d; j--) {
    let falling = 1;
    for (let m = 0; m < d; m++) falling *= j - m;
    v += falling * fit.coefficients[j]! * Math.pow(u, j - d);
  }
  return v / Math.pow(fit.scale, d);
}

/**
 * Inverse of a small symmetric positive-definite matrix by Cholesky; null when a pivot falls
 * below 1e-12 of the largest diagonal entry (singular to working precision).
 */
export function invertPositiveDefinite(a: Float64Array, k: number): Float64Array | null {
  let scale = 0;
  for (let i = 0; i < k; i++) scale = Math.max(scale, a[i * k + i]!);
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  const l = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    let d = a[j * k + j]!;
    for (let m = 0; m < j; m++) d -= l[j * k + m]! ** 2;
    if (!(d > 1e-12 * scale)) return null;
    const ljj = Math.sqrt(d);
    l[j * k + j] = ljj;
    for (let i = j + 1; i < k; i++) {
      let s = a[i * k + j]!;
      for (let m = 0; m < j; m++) s -= l[i * k + m]! * l[j * k + m]!;
      l[i * k + j] = s / ljj;
    }
  }
  // A⁻¹ column by column: solve L z = e_c, then Lᵀ x = z.
  const inv = new Float64Array(k * k);
  const z = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    for (let i = 0; i < k; i++) {
      let s = i === c ? 1 : 0;
      for (let m = 0; m < i; m++) s -= l[i * k + m]! * z[m]!;
      z[i] = s / l[i * k + i]!;
    }
    for (let i = k - 1; i >= 0; i--) {
      let s = z[i]!;
      for (let m = i + 1; m < k; m++) s -= l[m * k + i]! * inv[m * k + c]!;
      inv[i * k + c] = s / l[i * k + i]!;
    }
  }
  return inv;
}

import { kernelCode } from './kernels';
import { accumulateMoments } from './moment-sums';
import { ELIGIBLE, INELIGIBLE, prepareData, sideRange, type OrientedData, type SideIndex } from './oriented-data';
import { invertSymmetric } from './small-matrix';
import type { KernelName } from './types';

/**
 * A weighted local polynomial fit of order p on one side of the cutoff (METHODS §1a):
 * β̂ = (Σ wᵢ rᵢrᵢᵀ)⁻¹ Σ wᵢ rᵢ yᵢ with wᵢ = K(tᵢ/h), rᵢ = (1, uᵢ, …, uᵢᵖ) on the scaled variable
 * uᵢ = tᵢ/h (scaling keeps the moment matrix well conditioned; Fan & Gijbels 1996 for the method).
 * Coefficient k is therefore m⁽ᵏ⁾(c)·hᵏ/k!; the intercept is the limit at the cutoff.
 */
export interface SideFit {
  side: SideIndex;
  order: number;
  kernel: KernelName;
  kernelCode: number;
  /** Bandwidth, score units. */
  h: number;
  /** Observations with positive weight. */
  used: number;
  /** Σ wᵢ rᵢrᵢᵀ, (order+1)² row-major, scaled units. */
  gram: Float64Array;
  /** Its inverse, or null when singular. */
  inverse: Float64Array | null;
  /** Per column, coefficients on (1, u, …, uᵖ); all zero when the fit is singular. */
  coefficients: Float64Array[];
  /** ϑ = Σ wᵢ rᵢ uᵢ^(p+1): with the inverse gives the leading bias of each coefficient. */
  biasMoments: Float64Array;
  /** Per column, Σ wᵢyᵢ (with gram[0] = Σ wᵢ, e.g. to see whether a 0/1 column varies). */
  weightedTotals: Float64Array;
}

/**
 * Fits both sides in one pass over the data: the ineligible side (t < 0) with bandwidth h[0], the
 * eligible side (t ≥ 0) with h[1]. Sums only; no sorting, no per-row allocation.
 */
export function fitSides(data: OrientedData, order: number, kernel: KernelName, h: readonly [number, number]): [SideFit, SideFit] {
  const { t, columns } = data;
  const code = kernelCode(kernel);
  const m = order;
  const k = m + 1;
  const powers = 2 * m + 2; // u⁰ … u^(2m+1): Gram entries and bias moments
  const cols = columns.length;
  const sums = new Float64Array(2 * powers);
  const cross = new Float64Array(2 * cols * k);
  const used = [0, 0];
  for (const side of [INELIGIBLE, ELIGIBLE]) {
    const hs = h[side];
    if (!(hs > 0)) continue; // no window: the side's fit comes out unusable
    const [lo, hi] = sideRange(data, side, hs);
    used[side] = accumulateMoments(
      t,
      lo,
      hi,
      hs,
      code,
      m,
      columns,
      sums.subarray(side * powers, (side + 1) * powers),
      cross.subarray(side * cols * k, (side + 1) * cols * k),
    );
  }
  const build = (side: SideIndex): SideFit => {
    const base = side * powers;
    const gram = new Float64Array(k * k);
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) gram[a * k + b] = sums[base + a + b]!;
    const biasMoments = new Float64Array(k);
    for (let a = 0; a < k; a++) biasMoments[a] = sums[base + a + m + 1]!;
    const inverse = used[side]! >= k ? invertSymmetric(gram, k) : null;
    const coefficients: Float64Array[] = [];
    for (let c = 0; c < cols; c++) {
      const coef = new Float64Array(k);
      if (inverse) {
        const cb = (side * cols + c) * k;
        for (let a = 0; a < k; a++) {
          let v = 0;
          for (let b = 0; b < k; b++) v += inverse[a * k + b]! * cross[cb + b]!;
          coef[a] = v;
        }
      }
      coefficients.push(coef);
    }
    const weightedTotals = new Float64Array(cols);
    for (let c = 0; c < cols; c++) weightedTotals[c] = cross[(side * cols + c) * k]!;
    return { side, order, kernel, kernelCode: code, h: h[side], used: used[side]!, gram, inverse, coefficients, biasMoments, weightedTotals };
  };
  return [build(INELIGIBLE), build(ELIGIBLE)];
}

/** Value of a fitted polynomial at scaled position u (Horner). */
export function polynomialAt(coefficients: Float64Array, u: number): number {
  let v = 0;
  for (let j = coefficients.length - 1; j >= 0; j--) v = v * u + coefficients[j]!;
  return v;
}

/** Which observations a one-sided fit at a point uses. */
export type FitSide = 'at-or-above' | 'above' | 'at-or-below' | 'below';

export interface LocalPolynomialFit {
  /** Observations with positive kernel weight. */
  used: number;
  /** Per outcome: derivatives at the point, m̂(at), m̂'(at), …, m̂⁽ᵖ⁾(at), in outcome units per score unitᵏ. */
  derivatives: number[][];
  /** False when the moment matrix was singular (derivatives are then zeros). */
  ok: boolean;
}

/**
 * A one-sided weighted local polynomial fit at a point, for building blocks outside the jump
 * estimate (e.g. density smoothing at a cutoff): kernel weights K((x − at)/h) on the chosen side.
 * Same algebra as `fitSides`; derivatives are returned in score units.
 * @throws RangeError for a non-positive bandwidth or an order outside 0…4.
 */
export function fitLocalPolynomial(
  x: Float64Array,
  outcomes: readonly Float64Array[],
  options: { at: number; side: FitSide; h: number; kernel: KernelName; order: number },
): LocalPolynomialFit {
  const { at, side, h, kernel, order } = options;
  if (!(h > 0)) throw new RangeError(`fitLocalPolynomial: h must be positive, got ${h}`);
  if (!Number.isInteger(order) || order < 0 || order > 4) throw new RangeError(`fitLocalPolynomial: order must be 0…4, got ${order}`);
  for (const y of outcomes) {
    if (y.length !== x.length) throw new RangeError('fitLocalPolynomial: every outcome must have the length of x');
  }
  // Orientation: "at-or-above"/"below" use t = x − at; "at-or-below"/"above" use t = at − x.
  const flipped = side === 'at-or-below' || side === 'above';
  const data = prepareData('fitLocalPolynomial', { score: x, columns: outcomes, cluster: null }, at, flipped ? 'at-or-below' : 'at-or-above', null, h);
  const fits = fitSides(data, order, kernel, [h, h]);
  const fit = side === 'at-or-above' || side === 'at-or-below' ? fits[ELIGIBLE] : fits[INELIGIBLE];
  const derivatives = fit.coefficients.map((coef) => {
    const out: number[] = [];
    let factorial = 1;
    for (let j = 0; j <= order; j++) {
      if (j > 0) factorial *= j;
      const sign = flipped && j % 2 === 1 ? -1 : 1;
      out.push((sign * coef[j]! * factorial) / Math.pow(h, j));
    }
    return out;
  });
  return { used: fit.used, derivatives, ok: fit.inverse !== null };
}

import { kernelCoefficients } from './kernels';

/**
 * The one pass behind every fit: over t[lo..hi) with u = t/h and w = K(u),
 *   sums[j]  += w·uʲ          for j = 0 … 2m+1 (Gram entries and bias moments),
 *   cross[c·(m+1) + j] += w·uʲ·y_c   for j = 0 … m,
 * and the count of positive weights. Orders up to 3 with one or two columns are written out with
 * scalar accumulators (about three times faster than the general loop, which V8 cannot keep in
 * registers); everything else takes the general loop. Both give the same sums up to rounding order.
 */
export function accumulateMoments(
  t: Float64Array,
  lo: number,
  hi: number,
  h: number,
  code: number,
  order: number,
  columns: readonly Float64Array[],
  sums: Float64Array,
  cross: Float64Array,
): number {
  const cols = columns.length;
  if (cols <= 2 && order <= 3) {
    const y0 = columns[0] ?? null;
    const y1 = columns[1] ?? null;
    if (order <= 1) return unrolled1(t, lo, hi, h, code, order, y0, y1, sums, cross);
    return unrolled3(t, lo, hi, h, code, order, y0, y1, sums, cross);
  }
  return general(t, lo, hi, h, code, order, columns, sums, cross);
}

function general(
  t: Float64Array,
  lo: number,
  hi: number,
  h: number,
  code: number,
  order: number,
  columns: readonly Float64Array[],
  sums: Float64Array,
  cross: Float64Array,
): number {
  const k = order + 1;
  const powers = 2 * order + 2;
  const cols = columns.length;
  let count = 0;
  const [c0, c1, c2] = kernelCoefficients(code);
  for (let i = lo; i < hi; i++) {
    const u = t[i]! / h;
    const w = localWeight(c0, c1, c2, u);
    count += +(w > 0);
    let pw = w;
    for (let j = 0; j < powers; j++) {
      sums[j]! += pw;
      pw *= u;
    }
    for (let c = 0; c < cols; c++) {
      let py = w * columns[c]![i]!;
      for (let j = 0; j < k; j++) {
        cross[c * k + j]! += py;
        py *= u;
      }
    }
  }
  return count;
}

/** Orders 0 and 1: powers u⁰…u³, cross terms u⁰, u¹ (an order 0 fit reads the first two and the first cross term). */
function unrolled1(
  t: Float64Array,
  lo: number,
  hi: number,
  h: number,
  code: number,
  order: number,
  y0: Float64Array | null,
  y1: Float64Array | null,
  sums: Float64Array,
  cross: Float64Array,
): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let a0 = 0;
  let a1 = 0;
  let b0 = 0;
  let b1 = 0;
  let count = 0;
  const inv = 1 / h;
  const ya = y0 ?? t;
  const yb = y1 ?? t;
  const [c0, c1, c2] = kernelCoefficients(code);
  for (let i = lo; i < hi; i++) {
    const u = t[i]! * inv;
    const w = localWeight(c0, c1, c2, u);
    count += +(w > 0);
    const wu = w * u;
    const wu2 = wu * u;
    s0 += w;
    s1 += wu;
    s2 += wu2;
    s3 += wu2 * u;
    const wy = w * ya[i]!;
    const wd = w * yb[i]!;
    a0 += wy;
    a1 += wy * u;
    b0 += wd;
    b1 += wd * u;
  }
  const k = order + 1;
  const s = [s0, s1, s2, s3];
  for (let j = 0; j < 2 * order + 2; j++) sums[j]! += s[j]!;
  if (y0) {
    cross[0]! += a0;
    if (k > 1) cross[1]! += a1;
  }
  if (y1) {
    cross[k]! += b0;
    if (k > 1) cross[k + 1]! += b1;
  }
  return count;
}

/** Orders 2 and 3: powers u⁰…u⁷, cross terms u⁰…u³. */
function unrolled3(
  t: Float64Array,
  lo: number,
  hi: number,
  h: number,
  code: number,
  order: number,
  y0: Float64Array | null,
  y1: Float64Array | null,
  sums: Float64Array,
  cross: Float64Array,
): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let s5 = 0;
  let s6 = 0;
  let s7 = 0;
  let a0 = 0;
  let a1 = 0;
  let a2 = 0;
  let a3 = 0;
  let b0 = 0;
  let b1 = 0;
  let b2 = 0;
  let b3 = 0;
  let count = 0;
  const inv = 1 / h;
  const ya = y0 ?? t;
  const yb = y1 ?? t;
  const [c0, c1, c2] = kernelCoefficients(code);
  for (let i = lo; i < hi; i++) {
    const u = t[i]! * inv;
    const w = localWeight(c0, c1, c2, u);
    count += +(w > 0);
    const u2 = u * u;
    const w1 = w * u;
    const w2 = w * u2;
    const w3 = w1 * u2;
    const w4 = w2 * u2;
    s0 += w;
    s1 += w1;
    s2 += w2;
    s3 += w3;
    s4 += w4;
    s5 += w3 * u2;
    s6 += w4 * u2;
    s7 += w4 * u2 * u;
    const y = ya[i]!;
    const d = yb[i]!;
    a0 += w * y;
    a1 += w1 * y;
    a2 += w2 * y;
    a3 += w3 * y;
    b0 += w * d;
    b1 += w1 * d;
    b2 += w2 * d;
    b3 += w3 * d;
  }
  const k = order + 1;
  const s = [s0, s1, s2, s3, s4, s5, s6, s7];
  for (let j = 0; j < 2 * order + 2; j++) sums[j]! += s[j]!;
  const a = [a0, a1, a2, a3];
  const b = [b0, b1, b2, b3];
  for (let j = 0; j < k; j++) {
    if (y0) cross[j]! += a[j]!;
    if (y1) cross[k + j]! += b[j]!;
  }
  return count;
}

/**
 * K(u) from `kernelCoefficients`, the same formula as `weightOf` in kernels.ts, kept in this module
 * on purpose: V8 stops inlining an imported function into loops this large when the code runs under
 * tsx (measured: three to four times slower), and an un-inlined call per row dominates the pass.
 */
function localWeight(c0: number, c1: number, c2: number, u: number): number {
  const a = Math.abs(u);
  const v1 = 1 - a;
  const v2 = 1 - a * a;
  return c0 * (v1 + Math.abs(v1)) + c1 * (v2 + Math.abs(v2)) + c2 * +(a <= 1);
}

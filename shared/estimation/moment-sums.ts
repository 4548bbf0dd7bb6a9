import { kernelCoefficients } from './kernels';

/**
 * The one pass behind every fit: over t[lo..hi) with u = t/h and w = K(u),
 *   sums[j]  += w·uʲ          for j = 0 … 2m+1 (Gram entries and bias moments),
 *   cross[c·(m+1) + j] += w·uʲ·y_c   for j = 0 … m,
 * and the count of positive weights. Orders up to 3 with one or two columns, and orders 4–5 with
 * one column, are written out with scalar accumulators (about three times faster than the general loop, whose typed-array
 * accumulators V8 cannot keep in registers); everything else takes the general loop. Both give the
 * same sums up to rounding order.
 *
 * The loops are small functions of numbers and typed arrays that write their totals to an output
 * array, with no branch on the configuration inside: V8 then optimises each once, whatever call
 * comes first, instead of deoptimising when a new configuration appears.
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
  if (cols <= 1 && order > 3 && order <= 5) return oneColumnUpToOrder5(t, lo, hi, h, code, order, columns[0] ?? t, cols, sums, cross);
  if (cols > 2 || order > 3) return general(t, lo, hi, h, code, order, columns, sums, cross);
  const [c0, c1, c2] = kernelCoefficients(code);
  const y0 = columns[0] ?? t;
  const y1 = columns[1] ?? t;
  const k = order + 1;
  const out = new Float64Array(17);
  let powers: number;
  let crossTerms: number;
  if (order <= 1) {
    sumsUpToOrder1(t, lo, hi, 1 / h, c0, c1, c2, y0, y1, out);
    powers = 4;
    crossTerms = 2;
  } else {
    sumsUpToOrder3(t, lo, hi, 1 / h, c0, c1, c2, y0, y1, out);
    powers = 8;
    crossTerms = 4;
  }
  for (let j = 0; j < 2 * order + 2; j++) sums[j]! += out[j]!;
  for (let c = 0; c < cols; c++) for (let j = 0; j < k; j++) cross[c * k + j]! += out[powers + c * crossTerms + j]!;
  return out[16]!;
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
  const [c0, c1, c2] = kernelCoefficients(code);
  let count = 0;
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

/** out[0..3] = Σw·u⁰…³, out[4..5] = Σw·u⁰…¹·y₀, out[6..7] = the same for y₁, out[16] = count. */
function sumsUpToOrder1(
  t: Float64Array,
  lo: number,
  hi: number,
  inv: number,
  c0: number,
  c1: number,
  c2: number,
  ya: Float64Array,
  yb: Float64Array,
  out: Float64Array,
): void {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let a0 = 0;
  let a1 = 0;
  let b0 = 0;
  let b1 = 0;
  let count = 0;
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
  out[0] = s0;
  out[1] = s1;
  out[2] = s2;
  out[3] = s3;
  out[4] = a0;
  out[5] = a1;
  out[6] = b0;
  out[7] = b1;
  out[16] = count;
}

/** out[0..7] = Σw·u⁰…⁷, out[8..11] = Σw·u⁰…³·y₀, out[12..15] = the same for y₁, out[16] = count. */
function sumsUpToOrder3(
  t: Float64Array,
  lo: number,
  hi: number,
  inv: number,
  c0: number,
  c1: number,
  c2: number,
  ya: Float64Array,
  yb: Float64Array,
  out: Float64Array,
): void {
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
  out[0] = s0;
  out[1] = s1;
  out[2] = s2;
  out[3] = s3;
  out[4] = s4;
  out[5] = s5;
  out[6] = s6;
  out[7] = s7;
  out[8] = a0;
  out[9] = a1;
  out[10] = a2;
  out[11] = a3;
  out[12] = b0;
  out[13] = b1;
  out[14] = b2;
  out[15] = b3;
  out[16] = count;
}

/** Orders 4 and 5 with one column (the bandwidth rules' deeper stages): 12 powers, 6 cross terms. */
function oneColumnUpToOrder5(
  t: Float64Array,
  lo: number,
  hi: number,
  h: number,
  code: number,
  order: number,
  y: Float64Array,
  cols: number,
  sums: Float64Array,
  cross: Float64Array,
): number {
  const [c0, c1, c2] = kernelCoefficients(code);
  const out = new Float64Array(19);
  sumsUpToOrder5(t, lo, hi, 1 / h, c0, c1, c2, y, out);
  for (let j = 0; j < 2 * order + 2; j++) sums[j]! += out[j]!;
  if (cols === 1) for (let j = 0; j <= order; j++) cross[j]! += out[12 + j]!;
  return out[18]!;
}

/** out[0..11] = Σw·u⁰…¹¹, out[12..17] = Σw·u⁰…⁵·y, out[18] = count. */
function sumsUpToOrder5(t: Float64Array, lo: number, hi: number, inv: number, c0: number, c1: number, c2: number, y: Float64Array, out: Float64Array): void {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let s5 = 0;
  let s6 = 0;
  let s7 = 0;
  let s8 = 0;
  let s9 = 0;
  let s10 = 0;
  let s11 = 0;
  let a0 = 0;
  let a1 = 0;
  let a2 = 0;
  let a3 = 0;
  let a4 = 0;
  let a5 = 0;
  let count = 0;
  for (let i = lo; i < hi; i++) {
    const u = t[i]! * inv;
    const w = localWeight(c0, c1, c2, u);
    count += +(w > 0);
    const u2 = u * u;
    const w1 = w * u;
    const w2 = w * u2;
    const w3 = w1 * u2;
    const w4 = w2 * u2;
    const w5 = w3 * u2;
    const w6 = w4 * u2;
    s0 += w;
    s1 += w1;
    s2 += w2;
    s3 += w3;
    s4 += w4;
    s5 += w5;
    s6 += w6;
    s7 += w5 * u2;
    s8 += w6 * u2;
    s9 += w5 * u2 * u2;
    s10 += w6 * u2 * u2;
    s11 += w5 * u2 * u2 * u2;
    const yi = y[i]!;
    a0 += w * yi;
    a1 += w1 * yi;
    a2 += w2 * yi;
    a3 += w3 * yi;
    a4 += w4 * yi;
    a5 += w5 * yi;
  }
  out[0] = s0;
  out[1] = s1;
  out[2] = s2;
  out[3] = s3;
  out[4] = s4;
  out[5] = s5;
  out[6] = s6;
  out[7] = s7;
  out[8] = s8;
  out[9] = s9;
  out[10] = s10;
  out[11] = s11;
  out[12] = a0;
  out[13] = a1;
  out[14] = a2;
  out[15] = a3;
  out[16] = a4;
  out[17] = a5;
  out[18] = count;
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

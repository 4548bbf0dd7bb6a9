import { plugIn } from './bandwidth-mse';
import { boundaryConstants } from './kernels';
import { requireUsableFits } from './fit-checks';
import { fitSides } from './local-polynomial';
import { sideRange, type OrientedData } from './oriented-data';
import { invertSymmetric } from './small-matrix';
import type { KernelName } from './types';
import { EstimationError } from './errors';

/**
 * Imbens & Kalyanaraman (2012, REStud 79:933–959) bandwidth for the local-linear jump, following
 * METHODS §3b step by step (constants 1.84, 3.56 and 720 from memory there; 1.84 and 720 are
 * derived-consistent):
 *  1. pilot h₁ (given; 1.84·S_X·N^(−1/5));
 *  2. f̂(c) = (N₋ + N₊)/(2Nh₁) and σ̂²± the sample variances of y inside h₁ on each side;
 *  3. m̂''' = 6γ̂₃ from OLS of y on 1, Z, x, x², x³ over all data;
 *  4. h₂± = 3.56·[σ̂²±/(f̂·m̂'''²)]^(1/7)·N±^(−1/7);
 *  5. m̂''± = 2λ̂₂ from local quadratics with uniform weights inside h₂±;
 *  6. r̂± = 720·σ̂²±/(N₂±·h₂±⁴);
 *  7. ĥ = C_K·[(σ̂²₋ + σ̂²₊)/(f̂·((m̂''₊ − m̂''₋)² + r̂₊ + r̂₋))]^(1/5)·N^(−1/5), C_K of the kernel.
 * A fuzzy design passes y − τ̃·d, which turns every step into the fuzzy formulas of §3b (variances
 * and curvatures of that combination) [derived].
 */
export function ikBandwidth(data: OrientedData, kernel: KernelName, pilot: number): number {
  if (data.columns.length !== 1) throw new RangeError('ikBandwidth: expected exactly one outcome column');
  const { t, n } = data;
  const y = data.columns[0]!;
  // Step 2: counts and side variances inside the pilot window [−h₁, 0) and [0, h₁].
  const count = [0, 0];
  const sigma2 = [0, 0];
  for (const s of [0, 1] as const) {
    const [lo, hi] = sideRange(data, s, pilot);
    let k = 0;
    let sum = 0;
    for (let i = lo; i < hi; i++) {
      const inside = +(Math.abs(t[i]!) <= pilot);
      k += inside;
      sum += inside * y[i]!;
    }
    const mean = sum / k;
    let ss = 0;
    for (let i = lo; i < hi; i++) {
      const e = y[i]! - mean;
      ss += +(Math.abs(t[i]!) <= pilot) * e * e;
    }
    count[s] = k;
    sigma2[s] = ss / (k - 1);
  }
  if (count[0]! < 2 || count[1]! < 2) {
    throw new EstimationError('too_few_observations', 'Fewer than two observations fall inside the pilot bandwidth on one side.');
  }
  const density = (count[0]! + count[1]!) / (2 * n * pilot);

  // Step 3: global cubic with a jump, regressors (1, Z, s, s², s³) on s = t/scale.
  const third = globalThirdDerivative(data);

  // Step 4–5: local quadratics with uniform weights inside h₂±.
  const h2 = [0, 1].map((s) => {
    const range = data.sideRanges[s as 0 | 1];
    const value = 3.56 * Math.pow(sigma2[s]! / (density * third * third), 1 / 7) * Math.pow(data.sideCounts[s as 0 | 1], -1 / 7);
    return Number.isFinite(value) && value < range ? value : range;
  }) as [number, number];
  const quad = fitSides(data, 2, 'uniform', h2);
  requireUsableFits(quad, 'the Imbens–Kalyanaraman second-derivative bandwidth');
  const curvature = quad.map((f) => (2 * f.coefficients[0]![2]!) / (f.h * f.h));
  // Step 6: regularisation.
  const reg = quad.map((f, s) => (720 * sigma2[s]!) / (f.used * Math.pow(f.h, 4)));
  // Step 7.
  const ck = boundaryConstants(kernel).ck;
  const diff = curvature[1]! - curvature[0]!;
  const cap = Math.max(data.sideRanges[0], data.sideRanges[1]);
  const core = plugIn(sigma2[0]! + sigma2[1]!, density * (diff * diff + reg[0]! + reg[1]!), 1 / 5, Infinity);
  return Math.min(cap, ck * core * Math.pow(n, -1 / 5));
}

/** 6·γ̂₃ of OLS of y on (1, Z, t, t², t³) over all observations (IK step 3). */
function globalThirdDerivative(data: OrientedData): number {
  const { t, n } = data;
  const y = data.columns[0]!;
  const scale = Math.max(data.sideRanges[0], data.sideRanges[1]) || 1;
  const k = 5;
  const gram = new Float64Array(k * k);
  const cross = new Float64Array(k);
  const r = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    const s = t[i]! / scale;
    r[0] = 1;
    r[1] = t[i]! >= 0 ? 1 : 0;
    r[2] = s;
    r[3] = s * s;
    r[4] = s * s * s;
    for (let a = 0; a < k; a++) {
      cross[a]! += r[a]! * y[i]!;
      for (let b = 0; b <= a; b++) gram[a * k + b]! += r[a]! * r[b]!;
    }
  }
  for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) gram[a * k + b] = gram[b * k + a]!;
  const inv = invertSymmetric(gram, k);
  if (!inv) throw new EstimationError('singular_fit', 'The scores have too few distinct values for the global cubic fit of the Imbens–Kalyanaraman rule.');
  let g3 = 0;
  for (let b = 0; b < k; b++) g3 += inv[4 * k + b]! * cross[b]!;
  return (6 * g3) / (scale * scale * scale);
}

import type { KernelName } from './types';

/** The kernels, in the order of their integer codes used inside hot loops. */
export const KERNELS: readonly KernelName[] = ['triangular', 'epanechnikov', 'uniform'];

/** Integer code of a kernel for `kernelWeight` (a switch on a small integer keeps loops fast). */
export function kernelCode(kernel: KernelName): number {
  const code = KERNELS.indexOf(kernel);
  if (code < 0) throw new RangeError(`kernelCode: unknown kernel "${String(kernel)}"`);
  return code;
}

/**
 * K(u) on the support |u| ≤ 1 (METHODS §1a): triangular (1 − |u|), Epanechnikov 0.75·(1 − u²),
 * uniform 0.5. Zero outside the support. Constant factors cancel in every estimate and sandwich
 * variance; they matter only in the asymptotic constants below.
 *
 * Written as one branch-free formula, K(u) = c₀·(v₁ + |v₁|) + c₁·(v₂ + |v₂|) + c₂·[|u| ≤ 1] with
 * v₁ = 1 − |u|, v₂ = 1 − u² (so c·(v + |v|) = 2c·max(0, v), exactly), and per-kernel constants
 * (c₀, c₁, c₂): with rows in random order a data-dependent branch mispredicts, and V8 keeps this
 * inlined in hot loops where a switch on the kernel would not be.
 */
export function kernelCoefficients(code: number): readonly [number, number, number] {
  return KERNEL_COEFFICIENTS[code] ?? KERNEL_COEFFICIENTS[0]!;
}

const KERNEL_COEFFICIENTS: readonly (readonly [number, number, number])[] = [
  [0.5, 0, 0], // triangular
  [0, 0.375, 0], // Epanechnikov
  [0, 0, 0.5], // uniform
];

/** K(u) from `kernelCoefficients` (callers keep h > 0, so u is never NaN). */
export function weightOf(c0: number, c1: number, c2: number, u: number): number {
  const a = Math.abs(u);
  const v1 = 1 - a;
  const v2 = 1 - a * a;
  return c0 * (v1 + Math.abs(v1)) + c1 * (v2 + Math.abs(v2)) + c2 * +(a <= 1);
}

/** K(u) for the kernel with this code (convenient outside hot loops). */
export function kernelWeight(code: number, u: number): number {
  const [c0, c1, c2] = kernelCoefficients(code);
  return weightOf(c0, c1, c2, u);
}

/** ν_j = ∫₀¹ u^j K(u) du, in closed form. */
export function kernelMoment(kernel: KernelName, j: number): number {
  switch (kernel) {
    case 'triangular':
      return 1 / (j + 1) - 1 / (j + 2);
    case 'epanechnikov':
      return 0.75 * (1 / (j + 1) - 1 / (j + 3));
    case 'uniform':
      return 0.5 / (j + 1);
  }
}

/** π_j = ∫₀¹ u^j K(u)² du, in closed form. */
export function kernelSquaredMoment(kernel: KernelName, j: number): number {
  switch (kernel) {
    case 'triangular':
      return 1 / (j + 1) - 2 / (j + 2) + 1 / (j + 3);
    case 'epanechnikov':
      return 0.5625 * (1 / (j + 1) - 2 / (j + 3) + 1 / (j + 5));
    case 'uniform':
      return 0.25 / (j + 1);
  }
}

/** Boundary constants of local-linear estimation at a cutoff. */
export interface BoundaryConstants {
  /** Leading bias of the intercept per h²·m''(c): (ν₂² − ν₁ν₃) / (2(ν₂ν₀ − ν₁²)). */
  c1: number;
  /** Leading variance per σ²/(n·h·f): ∫₀¹(ν₂ − uν₁)²K(u)²du / (ν₂ν₀ − ν₁²)². */
  c2: number;
  /** Bandwidth constant (C₂ / (4C₁²))^(1/5) of the MSE-optimal jump bandwidth. */
  ck: number;
}

/**
 * Boundary constants of the local-linear jump (METHODS §3a, derived; Imbens & Kalyanaraman 2012
 * print 3.4375 for the triangular kernel, which these integrals reproduce).
 * @example boundaryConstants('triangular').ck // ≈ 3.4375
 */
export function boundaryConstants(kernel: KernelName): BoundaryConstants {
  const nu = (j: number) => kernelMoment(kernel, j);
  const pi = (j: number) => kernelSquaredMoment(kernel, j);
  const det = nu(2) * nu(0) - nu(1) * nu(1);
  const c1 = (nu(2) * nu(2) - nu(1) * nu(3)) / (2 * det);
  const numerator = nu(2) * nu(2) * pi(0) - 2 * nu(1) * nu(2) * pi(1) + nu(1) * nu(1) * pi(2);
  const c2 = numerator / (det * det);
  return { c1, c2, ck: Math.pow(c2 / (4 * c1 * c1), 0.2) };
}

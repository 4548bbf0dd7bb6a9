import { describe, expect, it } from 'vitest';
import { boundaryConstants, kernelCode, kernelMoment, kernelSquaredMoment, kernelWeight, KERNELS } from './kernels';

/** Composite Simpson rule on [0, 1], 2000 panels: exact for the piecewise polynomials here up to ~1e-13. */
function simpson(f: (u: number) => number): number {
  const m = 2000;
  const step = 1 / m;
  let s = f(0) + f(1);
  for (let i = 1; i < m; i++) s += (i % 2 ? 4 : 2) * f(i * step);
  return (s * step) / 3;
}

describe('kernels', () => {
  it('weights: shape on the support, zero outside (METHODS §1a)', () => {
    expect(kernelWeight(kernelCode('triangular'), 0.25)).toBe(0.75);
    expect(kernelWeight(kernelCode('triangular'), -1)).toBe(0);
    expect(kernelWeight(kernelCode('epanechnikov'), 0.5)).toBeCloseTo(0.75 * 0.75, 15);
    expect(kernelWeight(kernelCode('uniform'), -1)).toBe(0.5);
    for (const k of KERNELS) {
      expect(kernelWeight(kernelCode(k), 1.0000001)).toBe(0);
      expect(kernelWeight(kernelCode(k), -3)).toBe(0);
    }
  });

  it('closed-form moments equal numerical integrals (identity)', () => {
    for (const k of KERNELS) {
      const code = kernelCode(k);
      for (let j = 0; j <= 4; j++) {
        expect(kernelMoment(k, j)).toBeCloseTo(simpson((u) => u ** j * kernelWeight(code, u)), 10);
        expect(kernelSquaredMoment(k, j)).toBeCloseTo(simpson((u) => u ** j * kernelWeight(code, u) ** 2), 10);
      }
    }
  });

  // METHODS §3a/§12 [derived]: C1, C2, C_K from the kernel integrals; 3.4375 for the triangular
  // kernel is also the constant Imbens & Kalyanaraman print (from memory, matches).
  it('boundary constants match the derived table', () => {
    const tri = boundaryConstants('triangular');
    expect(tri.c1).toBeCloseTo(-1 / 20, 14);
    expect(tri.c2).toBeCloseTo(24 / 5, 12);
    expect(tri.ck).toBeCloseTo(3.43754, 4);
    const epa = boundaryConstants('epanechnikov');
    expect(epa.c1).toBeCloseTo(-0.057895, 5);
    expect(epa.c2).toBeCloseTo(4.497982, 5);
    expect(epa.ck).toBeCloseTo(3.1999, 4);
    const uni = boundaryConstants('uniform');
    expect(uni.c1).toBeCloseTo(-1 / 12, 14);
    expect(uni.c2).toBeCloseTo(4, 12);
    expect(uni.ck).toBeCloseTo(2.70192, 4);
  });

  it('rejects an unknown kernel by name', () => {
    expect(() => kernelCode('gaussian' as never)).toThrow(/kernelCode: unknown kernel/);
  });
});

import { describe, expect, it } from 'vitest';
import { invertSymmetric } from './small-matrix';

describe('invertSymmetric', () => {
  it('inverts the 3×3 Hilbert matrix; its (3,3) entry is 180, so 4·180 = 720 (METHODS §3b, IK regularisation)', () => {
    const h = new Float64Array(9);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) h[i * 3 + j] = 1 / (i + j + 1);
    const inv = invertSymmetric(h, 3)!;
    expect(inv[8]).toBeCloseTo(180, 9);
    expect(4 * inv[8]!).toBeCloseTo(720, 8);
    // A·A⁻¹ = I (identity).
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += h[i * 3 + k]! * inv[k * 3 + j]!;
        expect(s).toBeCloseTo(i === j ? 1 : 0, 10);
      }
    }
  });

  it('reports a singular matrix as null', () => {
    expect(invertSymmetric(new Float64Array([1, 2, 2, 4]), 2)).toBeNull();
    expect(invertSymmetric(new Float64Array([0, 0, 0, 0]), 2)).toBeNull();
  });
});

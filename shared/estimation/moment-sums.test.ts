import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { kernelCode, KERNELS } from './kernels';
import { accumulateMoments } from './moment-sums';

describe('accumulateMoments', () => {
  // The written-out loops (orders ≤ 3, ≤ 2 columns) and the general loop must give the same sums:
  // a third column forces the general loop on the same data (identity up to rounding order).
  it('gives the same sums on the unrolled and the general path', () => {
    // Orders 4–5 with one column are written out too: a second column forces the general loop.
    const rng = createRng(12);
    const n = 3000;
    const t = Float64Array.from({ length: n }, () => rng.uniform() * 4 - 2);
    const y = Float64Array.from({ length: n }, () => rng.normal());
    const d = Float64Array.from({ length: n }, () => rng.bernoulli(0.4));
    for (const kernel of KERNELS) {
      for (let order = 0; order <= 3; order++) {
        const powers = 2 * order + 2;
        const k = order + 1;
        const fast = { sums: new Float64Array(powers), cross: new Float64Array(2 * k) };
        const slow = { sums: new Float64Array(powers), cross: new Float64Array(3 * k) };
        const n1 = accumulateMoments(t, 0, n, 1.3, kernelCode(kernel), order, [y, d], fast.sums, fast.cross);
        const n2 = accumulateMoments(t, 0, n, 1.3, kernelCode(kernel), order, [y, d, y], slow.sums, slow.cross);
        expect(n1).toBe(n2);
        fast.sums.forEach((v, j) => expect(v).toBeCloseTo(slow.sums[j]!, 9));
        fast.cross.forEach((v, j) => expect(v).toBeCloseTo(slow.cross[j]!, 9));
      }
      for (const order of [4, 5]) {
        const one = { sums: new Float64Array(2 * order + 2), cross: new Float64Array(order + 1) };
        const two = { sums: new Float64Array(2 * order + 2), cross: new Float64Array(2 * (order + 1)) };
        accumulateMoments(t, 0, n, 1.3, kernelCode(kernel), order, [y], one.sums, one.cross);
        accumulateMoments(t, 0, n, 1.3, kernelCode(kernel), order, [y, d], two.sums, two.cross);
        one.sums.forEach((v, j) => expect(v).toBeCloseTo(two.sums[j]!, 9));
        one.cross.forEach((v, j) => expect(v).toBeCloseTo(two.cross[j]!, 9));
      }
    }
  });
});

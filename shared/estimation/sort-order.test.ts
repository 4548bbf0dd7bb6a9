import { describe, expect, it } from 'vitest';
import { createRng } from '../random/rng';
import { sortOrder } from './sort-order';

const reference = (v: Float64Array) => Array.from(v.keys()).sort((a, b) => v[a]! - v[b]! || a - b);

describe('sortOrder', () => {
  it('equals a stable comparator sort on random, tied, negative and nearly equal values', () => {
    const rng = createRng(3);
    const n = 20_000;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const kind = rng.int(4);
      if (kind === 0) v[i] = rng.normal() * 1e3;
      else if (kind === 1) v[i] = Math.round(rng.normal() * 50) / 10; // a 0.1 grid: many ties
      else if (kind === 2) v[i] = 1 + rng.uniform() * 1e-9; // closer than float32 resolves
      else v[i] = -rng.uniform() * 1e-30;
    }
    expect(Array.from(sortOrder(v))).toEqual(reference(v));
  });

  it('handles empty, single and constant input', () => {
    expect(Array.from(sortOrder(new Float64Array(0)))).toEqual([]);
    expect(Array.from(sortOrder(new Float64Array([5])))).toEqual([0]);
    expect(Array.from(sortOrder(new Float64Array([2, 2, 2])))).toEqual([0, 1, 2]);
  });
});

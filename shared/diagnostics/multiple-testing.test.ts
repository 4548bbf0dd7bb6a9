import { describe, expect, it } from 'vitest';
import { bonferroniAdjust, holmAdjust } from './multiple-testing';

describe('Holm adjustment', () => {
  // By hand (Holm 1979): sorted 0.01, 0.03, 0.04 → 3·0.01 = 0.03, 2·0.03 = 0.06, max(0.06, 1·0.04) = 0.06.
  it('steps down and keeps the input order', () => {
    const adjusted = holmAdjust([0.01, 0.04, 0.03]);
    expect(adjusted[0]).toBeCloseTo(0.03, 12);
    expect(adjusted[1]).toBeCloseTo(0.06, 12);
    expect(adjusted[2]).toBeCloseTo(0.06, 12);
    expect(bonferroniAdjust([0.01, 0.5])).toEqual([0.02, 1]);
    expect(holmAdjust([])).toEqual([]);
  });
});

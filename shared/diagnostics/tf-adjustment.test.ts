import { describe, expect, it } from 'vitest';
import { STOCK_YOGO_10_PERCENT_F } from '../estimation';
import { TF_POINTS, tfCriticalValue, tfInterval } from './tf-adjustment';

describe('tF critical values (Lee, McCrary, Moreira & Porter 2022)', () => {
  // Verified (METHODS §6, LMMP abstract): F = 10 needs 3.43; F > 104.7 needs no adjustment.
  it('matches the verified points', () => {
    expect(tfCriticalValue(10)).toEqual({ critical: 3.43, factor: 3.43 / 1.96, basis: 'verified-point' });
    expect(tfCriticalValue(10).factor).toBeCloseTo(1.75, 3);
    expect(tfCriticalValue(104.7)).toEqual({ critical: 1.96, factor: 1, basis: 'no-adjustment' });
    expect(tfCriticalValue(500).factor).toBe(1);
    expect(tfCriticalValue(104.69).factor).toBeGreaterThan(1);
  });

  it('labels which values are verified, interpolated or from memory', () => {
    expect(TF_POINTS.filter((p) => p.source === 'verified').map((p) => p.f)).toEqual([10, 104.7]);
    // The only finite point not verified: F = 4 → 18.66, recalled from LMMP's table (from memory).
    expect(TF_POINTS.filter((p) => p.source === 'from-memory')).toEqual([{ f: 4, critical: 18.66, source: 'from-memory' }]);
    expect(tfCriticalValue(30).basis).toBe('interpolated-between-verified');
    expect(tfCriticalValue(6).basis).toBe('from-memory');
    expect(tfCriticalValue(3.8).basis).toBe('unbounded');
  });

  it('decreases in F and is unbounded at or below F = 1.96² (from memory)', () => {
    let previous = Infinity;
    for (let f = 3.85; f < 110; f += 0.25) {
      const c = tfCriticalValue(f).critical;
      expect(c).toBeLessThanOrEqual(previous);
      previous = c;
    }
    expect(tfInterval(1, 0.5, 3.5)).toEqual({ critical: null, factor: null, basis: 'unbounded', ciLow: null, ciHigh: null });
    expect(tfInterval(1, 0.5, 10).ciHigh).toBeCloseTo(1 + 3.43 * 0.5, 12);
  });

  // Stock & Yogo (2005), Table 5.2 (critical values for the TSLS Wald test, one endogenous regressor,
  // one instrument, 10% maximal size of a nominal 5% test): 16.38 — from memory, high confidence
  // (METHODS §6). The engine's constant is the one the weak-take-up flag uses.
  it('uses Stock–Yogo 16.38 from their Table 5.2', () => {
    expect(STOCK_YOGO_10_PERCENT_F).toBe(16.38);
  });
});

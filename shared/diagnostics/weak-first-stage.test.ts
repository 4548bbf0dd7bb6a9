import { describe, expect, it } from 'vitest';
import { andersonRubin } from './weak-first-stage';

describe('Anderson–Rubin set', () => {
  const z = 1.959963984540054;
  it('is an interval around the ratio when the take-up jump is strong', () => {
    const r = andersonRubin(0.2, 0.5, 0.01, 0.001, 0.0005, z);
    expect(r.shape).toBe('interval');
    expect(r.low!).toBeLessThan(0.4);
    expect(r.high!).toBeGreaterThan(0.4);
    // At each end the AR statistic equals z² (identity of the quadratic).
    for (const tau of [r.low!, r.high!]) {
      expect((0.2 - tau * 0.5) ** 2 / (0.01 - 2 * tau * 0.0005 + tau * tau * 0.001)).toBeCloseTo(z * z, 8);
    }
  });

  it('is unbounded when the take-up jump is weak', () => {
    expect(andersonRubin(0.2, 0.05, 0.01, 0.004, 0, z).shape).toBe('two-rays');
    expect(andersonRubin(0.01, 0.05, 0.01, 0.004, 0, z)).toEqual({ low: null, high: null, shape: 'everything' });
  });
});

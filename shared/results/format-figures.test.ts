import { describe, expect, it } from 'vitest';
import { formatChange, formatInterval, monthLabel } from './format-figures';

describe('figure formatting', () => {
  it('writes shares as percentage points and other units with two decimals', () => {
    expect(formatChange(-0.1234, { unit: 'share' })).toBe('−12.3 pp');
    expect(formatChange(0.62, { unit: 'share' })).toBe('+62.0 pp');
    expect(formatChange(-0.8, { unit: 'months' })).toBe('−0.80 months');
    expect(formatChange(0.0001, { unit: 'months' })).toBe('0.00 months');
  });
  it('writes intervals with the unit once', () => {
    expect(formatInterval({ ciLow: -0.2, ciHigh: -0.05 }, { unit: 'share' })).toBe('−20.0 to −5.0 pp');
    expect(formatInterval({ ciLow: -1.25, ciHigh: 0.1 }, { unit: 'months' })).toBe('−1.25 to +0.10 months');
  });
  it('names months', () => {
    expect(monthLabel('2026-10')).toBe('October 2026');
  });
});

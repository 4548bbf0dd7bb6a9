import { describe, expect, it } from 'vitest';
import { formatNumber, formatPeriod, formatShare } from './format';

describe('format', () => {
  it('shows a dash for missing or non-finite numbers', () => {
    expect(formatNumber(null)).toBe('—');
    expect(formatNumber(Number.NaN)).toBe('—');
    expect(formatShare(undefined)).toBe('—');
  });
  it('formats numbers, shares and periods in a given locale', () => {
    expect(formatNumber(1234.5678, 2, 'en-US')).toBe('1,234.57');
    expect(formatShare(0.614, 1, 'en-US')).toBe('61.4%');
    expect(formatPeriod('2025-04', 'en-US')).toBe('Apr 2025');
  });
});

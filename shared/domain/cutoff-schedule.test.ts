import { describe, expect, it } from 'vitest';
import { cutoffForPeriod, isEligible } from './cutoff-schedule';
import { addMonths, daysInPeriod, periodRange } from './period';

describe('cutoffForPeriod', () => {
  const schedule = [
    { cutoff: 58, firstPeriod: '2025-11' },
    { cutoff: 60, firstPeriod: '2024-11' },
  ];
  it('uses the latest change not after the period, whatever the order given', () => {
    expect(cutoffForPeriod(schedule, '2024-11')).toBe(60);
    expect(cutoffForPeriod(schedule, '2025-10')).toBe(60);
    expect(cutoffForPeriod(schedule, '2025-11')).toBe(58);
    expect(cutoffForPeriod(schedule, '2030-01')).toBe(58);
  });
  it('returns null before the schedule starts', () => {
    expect(cutoffForPeriod(schedule, '2024-10')).toBeNull();
  });
});

describe('isEligible', () => {
  it('treats a score exactly at the cutoff as eligible on both conventions', () => {
    expect(isEligible(60, 60, 'at-or-above')).toBe(true);
    expect(isEligible(60, 60, 'at-or-below')).toBe(true);
    expect(isEligible(59.9, 60, 'at-or-above')).toBe(false);
    expect(isEligible(60.1, 60, 'at-or-below')).toBe(false);
  });
});

describe('periods', () => {
  it('adds months across year ends and counts days', () => {
    expect(addMonths('2025-11', 3)).toBe('2026-02');
    expect(addMonths('2025-01', -1)).toBe('2024-12');
    expect(periodRange('2025-11', '2026-01')).toEqual(['2025-11', '2025-12', '2026-01']);
    expect(daysInPeriod('2024-02')).toBe(29);
    expect(daysInPeriod('2025-02')).toBe(28);
  });
  it('refuses a malformed period', () => {
    expect(() => addMonths('2025-13x', 1)).toThrow(RangeError);
  });
});

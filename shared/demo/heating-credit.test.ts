import { describe, expect, it } from 'vitest';
import { DEMO_HEAPING_PERIOD, DEMO_WEAK_TAKE_UP_PERIOD, demoPeriods, generateDemoCohort } from './heating-credit';

describe('demo scenario', () => {
  it('has 24 monthly cohorts and a cutoff that moves from 60 to 58 with the 13th', () => {
    const periods = demoPeriods();
    expect(periods).toHaveLength(24);
    expect(generateDemoCohort(periods[11]!).cutoff).toBe(60);
    expect(generateDemoCohort(periods[12]!).cutoff).toBe(58);
  });

  it('is deterministic and sized 1,500–4,000 households per cohort, with unique case numbers', () => {
    const a = generateDemoCohort('2025-02');
    const b = generateDemoCohort('2025-02');
    expect(a.households).toEqual(b.households);
    for (const period of demoPeriods()) {
      const { households } = generateDemoCohort(period);
      expect(households.length).toBeGreaterThanOrEqual(1500);
      expect(households.length).toBeLessThanOrEqual(4000);
      expect(new Set(households.map((h) => h.caseNumber)).size).toBe(households.length);
    }
  });

  const takeUpNearCutoff = (period: string) => {
    const { households, cutoff } = generateDemoCohort(period);
    const near = households.filter((h) => Math.abs(h.score - cutoff) <= 5);
    const share = (rows: typeof near) => rows.reduce((s, h) => s + h.takeUp, 0) / rows.length;
    return share(near.filter((h) => h.score >= cutoff)) - share(near.filter((h) => h.score < cutoff));
  };

  it('has a strong take-up jump in an ordinary month and a weak one in the outreach-lapse month', () => {
    expect(takeUpNearCutoff('2025-02')).toBeGreaterThan(0.5);
    expect(takeUpNearCutoff(DEMO_WEAK_TAKE_UP_PERIOD)).toBeLessThan(0.25);
  });

  it('piles scores just above the cutoff in the heaping month only', () => {
    const pile = (period: string) => {
      const { households, cutoff } = generateDemoCohort(period);
      const above = households.filter((h) => h.score >= cutoff && h.score <= cutoff + 0.5).length;
      const below = households.filter((h) => h.score >= cutoff - 0.6 && h.score < cutoff - 0.1).length;
      return above / below;
    };
    expect(pile(DEMO_HEAPING_PERIOD)).toBeGreaterThan(2);
    expect(pile('2026-03')).toBeLessThan(1.6);
  });
});

import { describe, expect, it } from 'vitest';
import { ARREARS, SHUTOFF, point, windowResult, inference } from './test-fixtures';
import { bandSeries, cutoffChanges, displayScale, seriousPeriods, takeUpSides, valueRange, windowRows } from './trend-series';

describe('trend chart transforms', () => {
  const points = [
    point('2025-09', 60),
    point('2025-10', 60, { worstCaveat: 'serious' }),
    point('2025-11', 58, { worstCaveat: 'caution' }),
    point('2025-12', 58, { status: 'not-estimable', firstStage: null, itt: null, effect: null, takeUp: null }),
  ];

  it('scales shares to percentage points and keeps other units', () => {
    expect(displayScale(SHUTOFF, 'effect')).toBe(100);
    expect(displayScale(ARREARS, 'effect')).toBe(1);
    // Take-up is a share whatever the outcome.
    expect(displayScale(ARREARS, 'firstStage')).toBe(100);
  });

  it('gives each month its estimate and interval, null where not estimable, and marks serious months', () => {
    const s = bandSeries(points, 'effect', 100);
    expect(s[0]).toEqual({ period: '2025-09', estimate: -12, low: -20, high: -4, serious: false });
    expect(s[1]!.serious).toBe(true);
    expect(s[3]).toEqual({ period: '2025-12', estimate: null, low: null, high: null, serious: false });
    expect(seriousPeriods(points)).toEqual(['2025-10']);
  });

  it('gives take-up either side in percent', () => {
    const sides = takeUpSides(points);
    expect(sides.eligible.map((p) => p.value)).toEqual([70, 70, 70, null]);
    expect(sides.ineligible[0]).toEqual({ period: '2025-09', value: 10 });
  });

  it('finds where the cutoff moved', () => {
    expect(cutoffChanges(points)).toEqual([{ period: '2025-11', from: 60, to: 58 }]);
    expect(cutoffChanges([point('2025-01', 60)])).toEqual([]);
  });

  it('spans every interval end and zero', () => {
    const r = valueRange([bandSeries(points, 'effect', 100)]);
    // Ends −20 and 0 (zero is always in range), padded by 5% of the span (1).
    expect(r.min).toBeCloseTo(-21, 10);
    expect(r.max).toBeCloseTo(1, 10);
  });

  it('lists the last-N windows shortest first with headline figures (conventional estimate, robust interval)', () => {
    const six = windowResult(['2026-05', '2026-06', '2026-07', '2026-08', '2026-09', '2026-10']);
    const three = windowResult(['2026-08', '2026-09', '2026-10'], { caveats: [{ code: 'x', severity: 'serious', message: 'm', values: {} }] });
    const baseline = windowResult(['2026-07', '2026-08', '2026-09'], { scope: { ...three.scope, key: 'window:previous-3' } });
    const rows = windowRows([six, baseline, three], SHUTOFF);
    expect(rows.map((r) => r.key)).toEqual(['window:last-3', 'window:last-6']);
    expect(rows[0]!.serious).toBe(true);
    expect(rows[1]!.effect.estimate).toBeCloseTo(-12.1, 10);
    expect(rows[1]!.effect.low).toBeCloseTo(-19.8, 10);
    expect(rows[1]!.firstStage.estimate).toBeCloseTo(61.2, 10);
    expect(rows[1]!.nUsed).toBe(4100);
    expect(windowRows([windowResult(['2026-10'], { itt: { conventional: inference(0.5, 0.4, 0.6), robust: inference(0.5, 0.4, 0.6) } })], ARREARS)[0]!.itt.estimate).toBe(0.5);
  });
});

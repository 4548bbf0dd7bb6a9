import { describe, expect, it } from 'vitest';
import { DEMO_HEAPING_PERIOD, DEMO_WEAK_TAKE_UP_PERIOD, generateDemoCohort } from '../demo/heating-credit';
import { createDiagnosticsMemo } from './memo';
import { runDiagnostics } from './run-diagnostics';
import type { DiagnosticsData } from './types';

function demoData(period: string): { data: DiagnosticsData; cutoff: number } {
  const cohort = generateDemoCohort(period);
  const col = (key: 'score' | 'takeUp' | 'shutoff_6m' | 'household_size' | 'prior_arrears') => Float64Array.from(cohort.households, (h) => h[key]);
  return {
    cutoff: cohort.cutoff,
    data: {
      score: col('score'),
      outcome: col('shutoff_6m'),
      takeUp: col('takeUp'),
      covariates: [
        { name: 'household_size', label: 'household size', values: col('household_size') },
        { name: 'prior_arrears', label: 'prior-year arrears', values: col('prior_arrears') },
      ],
    },
  };
}

describe('runDiagnostics', () => {
  it('gives the same report with a memo shared between the outcomes of one scope as without it (identity)', () => {
    const { data, cutoff } = demoData('2025-08');
    const cohort = generateDemoCohort('2025-08');
    const arrears = Float64Array.from(cohort.households, (h) => h.arrears_months);
    const options = { cutoff, eligibleSide: 'at-or-above' as const, population: 'households', permutations: 500 };
    const memo = createDiagnosticsMemo();
    const shared = [runDiagnostics(data, options, memo), runDiagnostics({ ...data, outcome: arrears }, options, memo)];
    expect(memo.entries.size).toBeGreaterThan(0);
    expect(shared[0]).toEqual(runDiagnostics(data, options));
    expect(shared[1]).toEqual(runDiagnostics({ ...data, outcome: arrears }, options));
    // Other scores under the same memo are not mistaken for the first ones.
    const shifted = { ...data, score: data.score.map((x) => x + 1) };
    expect(runDiagnostics(shifted, { ...options, cutoff: cutoff + 1 }, memo)).toEqual(runDiagnostics(shifted, { ...options, cutoff: cutoff + 1 }));
  });

  it('returns exactly the documented keys, as plain JSON', () => {
    const { data, cutoff } = demoData('2025-08');
    const report = runDiagnostics(data, { cutoff, eligibleSide: 'at-or-above', population: 'households', permutations: 500 });
    expect(Object.keys(report).sort()).toEqual(
      ['balance', 'bins', 'caveats', 'density', 'donut', 'heaping', 'localRandomization', 'placebo', 'power', 'sensitivity', 'weakFirstStage'].sort(),
    );
    expect(Object.keys(report.density!.mccrary)).toEqual(expect.arrayContaining(['theta', 'se', 'z', 'p']));
    expect(Object.keys(report.density!.localPolynomial)).toEqual(expect.arrayContaining(['statistic', 'p']));
    expect(Object.keys(report.weakFirstStage!)).toEqual(expect.arrayContaining(['f', 'tfCiLow', 'tfCiHigh']));
    for (const row of report.balance) expect(Object.keys(row)).toEqual(expect.arrayContaining(['covariate', 'jump', 'ciLow', 'ciHigh', 'p']));
    for (const row of report.placebo) expect(Object.keys(row)).toEqual(expect.arrayContaining(['cutoff', 'estimate', 'ciLow', 'ciHigh']));
    for (const row of report.sensitivity) expect(Object.keys(row)).toEqual(expect.arrayContaining(['h', 'estimate', 'ciLow', 'ciHigh']));
    for (const row of report.donut) expect(Object.keys(row)).toEqual(expect.arrayContaining(['radius', 'estimate', 'ciLow', 'ciHigh']));
    // JSON round trip loses nothing: no NaN, Infinity or typed arrays anywhere.
    expect(JSON.parse(JSON.stringify(report))).toEqual(report);
    expect(report.sensitivity.find((r) => r.multiple === 1)).toBeDefined();
    expect(report.sensitivity.find((r) => r.rule === 'coverage')).toBeDefined();
    expect(report.bins!.outcome.fit.eligible[0]!.score).toBe(cutoff);
    expect(report.caveats.filter((c) => c.severity === 'serious')).toEqual([]);
  });

  it('flags the demo scenario’s piled-up month and its weak take-up month', () => {
    const heaped = demoData(DEMO_HEAPING_PERIOD);
    const heapedCodes = runDiagnostics(heaped.data, { cutoff: heaped.cutoff, eligibleSide: 'at-or-above', permutations: 500 }).caveats.map((c) => c.code);
    expect(heapedCodes).toContain('score_density_jump');
    const weak = demoData(DEMO_WEAK_TAKE_UP_PERIOD);
    const weakCodes = runDiagnostics(weak.data, { cutoff: weak.cutoff, eligibleSide: 'at-or-above', permutations: 500 }).caveats.map((c) => c.code);
    expect(weakCodes).toContain('weak_take_up_jump');
  });

  it('handles a sharp design and a program whose eligible side is at or below the cutoff', () => {
    const { data, cutoff } = demoData('2025-08');
    // Mirror the score so that low scores qualify: same households, same eligibility.
    const mirrored = { score: data.score.map((s) => 200 - s), outcome: data.outcome };
    const report = runDiagnostics(mirrored, { cutoff: 200 - cutoff, eligibleSide: 'at-or-below', permutations: 500 });
    expect(report.weakFirstStage).toBeNull();
    expect(report.bins!.takeUp).toBeNull();
    expect(report.caveats.map((c) => c.code)).not.toContain('eligibility_versus_participation');
    const original = runDiagnostics({ score: data.score, outcome: data.outcome }, { cutoff, eligibleSide: 'at-or-above', permutations: 500 });
    expect(report.density!.mccrary.theta).toBeCloseTo(original.density!.mccrary.theta, 9);
    expect(report.sensitivity[2]!.estimate).toBeCloseTo(original.sensitivity[2]!.estimate, 9);
  });

  it('reports a diagnostic it cannot compute as a caveat, not an error', () => {
    const score = Float64Array.from({ length: 30 }, (_, i) => i);
    const outcome = Float64Array.from(score, (s) => s / 10);
    const report = runDiagnostics({ score, outcome }, { cutoff: 15, eligibleSide: 'at-or-above', bandwidth: 10 });
    expect(report.density).toBeNull();
    expect(report.caveats.find((c) => c.code === 'check_not_run' && c.values.check === 'score density check')).toBeDefined();
  });
});

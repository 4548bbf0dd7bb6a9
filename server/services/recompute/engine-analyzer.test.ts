import { describe, expect, it } from 'vitest';
import { generateDemoCohort, DEMO_TRUE_EFFECTS } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import type { ScopeData } from './analyzer';
import { engineAnalyzer, POOLING_STATEMENT } from './engine-analyzer';
import { planScopes, type CohortInput } from './scope-plan';

/** Four demo months around the cutoff change (60 until 2025-10, 58 from 2025-11), as one window's arrays. */
function windowAcrossCutoffChange(periods = ['2025-09', '2025-10', '2025-11', '2025-12']): { data: ScopeData; cohorts: CohortInput[] } {
  const months = periods.map((p) => generateDemoCohort(p));
  const n = months.reduce((s, m) => s + m.households.length, 0);
  const data: ScopeData = {
    n,
    centred: new Float64Array(n),
    cutoffOf: new Float64Array(n),
    takeUp: new Float64Array(n),
    outcomes: { shutoff_6m: new Float64Array(n), arrears_months: new Float64Array(n) },
    covariates: {},
    cluster: null,
  };
  let i = 0;
  for (const m of months) {
    for (const h of m.households) {
      data.centred[i] = h.score - m.cutoff;
      data.cutoffOf[i] = m.cutoff;
      data.takeUp![i] = h.takeUp;
      data.outcomes.shutoff_6m![i] = h.shutoff_6m;
      data.outcomes.arrears_months![i] = h.arrears_months;
      i++;
    }
  }
  const cohorts = months.map((m, k) => ({ period: m.period, cutoff: m.cutoff, extractId: k + 1, sha256: 'x'.repeat(64), acceptedAt: new Date(0), rows: m.households.length }));
  return { data, cohorts };
}

describe('engine analyzer', () => {
  it('pools a window across a cutoff change on scores centred at each month’s cutoff, and says how to read it', () => {
    const { data, cohorts } = windowAcrossCutoffChange();
    const settings = defaultDesignSettings(['shutoff_6m', 'arrears_months'], []);
    const plans = planScopes(cohorts, { designVersionId: 1, settings, eligibleSide: 'at-or-above', engineVersion: engineAnalyzer.engineVersion, diagnosticsVersion: null });
    const window = plans.find((p) => p.scope.key === 'window:last-3')!;
    const wholeWindow = { ...window, cohorts, scope: { ...window.scope, kind: 'window' as const, periods: cohorts.map((c) => ({ period: c.period, cutoff: c.cutoff })) } };
    const [shutoff, arrears] = engineAnalyzer.analyze({ scope: wholeWindow, data, settings, eligibleSide: 'at-or-above' });
    expect(shutoff!.status).toBe('ok');
    const pooling = shutoff!.figures.pooling!;
    expect(pooling.statement).toBe(POOLING_STATEMENT);
    expect(pooling.weights.map((w) => [w.cutoff, w.periods])).toEqual([
      [58, ['2025-11', '2025-12']],
      [60, ['2025-09', '2025-10']],
    ]);
    expect(pooling.weights.reduce((s, w) => s + w.share, 0)).toBeCloseTo(1, 12); // identity: shares of one total
    // The demo's built-in complier effects (shared/demo/heating-credit.ts) lie within 2.576 robust
    // standard errors of the robust estimates (a 99% interval: one draw of one window is checked,
    // so a 95% interval would miss the truth one time in twenty by design).
    for (const [r, truth] of [[shutoff!, DEMO_TRUE_EFFECTS.shutoff_6m], [arrears!, DEMO_TRUE_EFFECTS.arrears_months]] as const) {
      const robust = r.figures.effect!.robust;
      expect(Math.abs(robust.estimate - truth)).toBeLessThan(2.576 * robust.se);
    }
    // Take-up jumps from about 8% to about 70% at the cutoff by construction.
    expect(shutoff!.figures.firstStage!.conventional.estimate).toBeGreaterThan(0.45);
    expect(shutoff!.bins.some((b) => b.side === 'eligible') && shutoff!.bins.some((b) => b.side === 'ineligible')).toBe(true);
    // Diagnostics and caveats come from runDiagnostics; the standing cautions are always there.
    expect(Object.keys(shutoff!.diagnostics ?? {})).toEqual(expect.arrayContaining(['density', 'balance', 'placebo', 'sensitivity', 'donut', 'weakFirstStage', 'bins', 'power']));
    expect(shutoff!.caveats.some((c) => c.severity === 'info')).toBe(true);
    // Pooled over two cutoffs, the caveats speak of "the cutoff", never of the centred origin 0.
    expect(shutoff!.caveats.find((c) => c.code === 'local_to_cutoff')!.message).toContain('scores near the cutoff in force each month');
  });

  it('names the cohort’s own cutoff in its caveats and checks round values on the agency’s scores', () => {
    const { data, cohorts } = windowAcrossCutoffChange(['2025-11']);
    const settings = defaultDesignSettings(['shutoff_6m'], []);
    const [plan] = planScopes(cohorts, { designVersionId: 1, settings, eligibleSide: 'at-or-above', engineVersion: 'x', diagnosticsVersion: null });
    const [r] = engineAnalyzer.analyze({ scope: plan!, data, settings, eligibleSide: 'at-or-above' });
    expect(r!.caveats.find((c) => c.code === 'local_to_cutoff')!.message).toMatch(/with scores near 58\./);
    const heaping = (r!.diagnostics as { heaping: { atCutoff: { score: number } | null } }).heaping;
    expect(heaping.atCutoff?.score).toBe(58);
  });

  it('gives a not-estimable result, not an error, when a side is empty', () => {
    const { data, cohorts } = windowAcrossCutoffChange();
    for (let i = 0; i < data.n; i++) if (data.centred[i]! < 0) data.centred[i] = Number.NaN;
    const settings = defaultDesignSettings(['shutoff_6m'], []);
    const [plan] = planScopes(cohorts.slice(0, 1), { designVersionId: 1, settings, eligibleSide: 'at-or-above', engineVersion: 'x', diagnosticsVersion: null });
    const [r] = engineAnalyzer.analyze({ scope: plan!, data, settings, eligibleSide: 'at-or-above' });
    expect(r!.status).toBe('not-estimable');
    expect(r!.figures.problem).toMatchObject({ code: 'too_few_observations' });
  });
});

import { describe, expect, it } from 'vitest';
import { generateDemoCohort } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import type { AnalyzeInput } from './analyzer';
import { pooledEngineAnalyzer } from './analyzer-pool';
import { engineAnalyzer } from './engine-analyzer';
import { planScopes } from './scope-plan';

function cohortInput(period: string): AnalyzeInput {
  const m = generateDemoCohort(period);
  const col = (f: (h: (typeof m.households)[number]) => number) => Float64Array.from(m.households, f);
  const settings = defaultDesignSettings(['shutoff_6m', 'arrears_months'], ['household_size']);
  const cohorts = [{ period, cutoff: m.cutoff, extractId: 1, sha256: 'x'.repeat(64), acceptedAt: new Date(0), rows: m.households.length }];
  const [scope] = planScopes(cohorts, { designVersionId: 1, settings, eligibleSide: 'at-or-above', engineVersion: 'x', diagnosticsVersion: null });
  return {
    scope: scope!,
    settings,
    eligibleSide: 'at-or-above',
    data: {
      n: m.households.length,
      centred: col((h) => h.score - m.cutoff),
      cutoffOf: col(() => m.cutoff),
      takeUp: col((h) => h.takeUp),
      outcomes: { shutoff_6m: col((h) => h.shutoff_6m), arrears_months: col((h) => h.arrears_months) },
      covariates: { household_size: col((h) => h.household_size) },
      cluster: null,
    },
  };
}

describe('analyzer pool', () => {
  it('gives exactly the in-process analyzer’s results, several scopes at once on worker threads (identity)', async () => {
    const pool = pooledEngineAnalyzer(2);
    const inputs = ['2025-02', '2025-03', '2025-04'].map(cohortInput);
    const pooled = await Promise.all(inputs.map((input) => pool.analyze(input)));
    expect(pooled).toEqual(inputs.map((input) => engineAnalyzer.analyze(input)));
  }, 60_000);

  it('passes an analysis error back as a rejection and keeps working', async () => {
    const pool = pooledEngineAnalyzer(1);
    const bad = cohortInput('2025-02');
    bad.settings = { ...bad.settings, kernel: 'no-such-kernel' as never };
    await expect(pool.analyze(bad)).rejects.toThrow();
    expect((await pool.analyze(cohortInput('2025-03')))[0]!.status).toBe('ok');
  }, 60_000);
});

import { describe, expect, it } from 'vitest';
import type { CaveatDto, OutcomeResultDto } from '../api/results';
import { changeAlerts, DIFFERENCE_TEST_STATEMENT } from './change-alerts';

function result(key: string, effect: number, se: number, caveats: CaveatDto[] = []): OutcomeResultDto {
  const inf = { estimate: effect, se, ciLow: effect - 1.96 * se, ciHigh: effect + 1.96 * se, p: 0.5 };
  const fs = { estimate: 0.6, se: 0.03, ciLow: 0.54, ciHigh: 0.66, p: 0 };
  return {
    id: 1,
    programId: 1,
    outcome: { key: 'shutoff_6m', label: 'Shut-off', unit: 'share', kind: 'binary', goodDirection: 'lower' },
    scope: { kind: key.startsWith('cohort') ? 'cohort' : 'window', key, firstPeriod: '2026-10', lastPeriod: '2026-10', cohortCount: 1, periods: [] },
    status: 'ok',
    problem: null,
    level: 0.95,
    firstStage: { conventional: fs, robust: fs, f: 400, weak: false },
    itt: { conventional: inf, robust: inf },
    effect: { conventional: inf, robust: inf },
    bandwidth: null,
    n: null,
    pooling: null,
    caveats,
    stale: false,
    staleReason: null,
    deviationCount: 0,
    preRegistered: false,
    provenance: { runId: 1, computedAt: '', designId: 1, designVersion: 1, designVersionId: 1, engineVersion: 'x', diagnosticsVersion: null, appVersion: 'x', extracts: [] },
  };
}

const serious: CaveatDto = { code: 'weak_first_stage', severity: 'serious', message: 'Take-up barely jumped.', values: {} };

describe('change alerts', () => {
  it('flags a difference beyond the joint uncertainty, with the test and its assumption', () => {
    // Identity: (−0.30 − (−0.10)) / √(0.05² + 0.05²) = −2.8284; two-sided normal p = 0.00468 (standard normal table).
    const [alert] = changeAlerts(result('cohort:2026-10', -0.3, 0.05), result('window:previous-3', -0.1, 0.05), null);
    expect(alert).toMatchObject({ kind: 'difference', quantity: 'effect', baselineKey: 'window:previous-3', alpha: expect.closeTo(0.05, 12), test: DIFFERENCE_TEST_STATEMENT });
    if (alert?.kind !== 'difference') throw new Error('expected a difference alert');
    expect(alert.z).toBeCloseTo(-2.8284, 4);
    expect(alert.p).toBeCloseTo(0.00468, 4);
  });

  it('stays quiet when the difference is within the joint uncertainty', () => {
    // (−0.20 − (−0.10)) / 0.0707 = −1.414 < 1.96.
    expect(changeAlerts(result('cohort:2026-10', -0.2, 0.05), result('window:previous-3', -0.1, 0.05), null)).toEqual([]);
  });

  it('leads with a serious caveat the previous month did not have', () => {
    const alerts = changeAlerts(result('cohort:2026-10', -0.1, 0.05, [serious]), result('window:previous-3', -0.1, 0.05), result('cohort:2026-09', -0.1, 0.05));
    expect(alerts).toEqual([{ kind: 'new-caveat', outcomeKey: 'shutoff_6m', period: '2026-10', caveat: serious }]);
    expect(changeAlerts(result('cohort:2026-10', -0.1, 0.05, [serious]), null, result('cohort:2026-09', -0.1, 0.05, [serious]))).toEqual([]);
  });
});

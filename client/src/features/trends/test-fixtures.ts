import type { InferenceDto, OutcomeRefDto, OutcomeResultDto, TrendPointDto } from '@shared/api/results';

/** Small hand-made results for the trend transforms' and the summary's tests (values invented). */
export const SHUTOFF: OutcomeRefDto = { key: 'shutoff_6m', label: 'Utility shut-off within 6 months', unit: 'share', kind: 'binary', goodDirection: 'lower' };
export const ARREARS: OutcomeRefDto = { key: 'arrears_months', label: 'Months in arrears (next 6 months)', unit: 'months', kind: 'continuous', goodDirection: 'lower' };

export const inference = (estimate: number, ciLow: number, ciHigh: number): InferenceDto => ({ estimate, se: (ciHigh - ciLow) / 3.92, ciLow, ciHigh, p: 0.01 });

export function point(period: string, cutoff: number, over: Partial<TrendPointDto> = {}): TrendPointDto {
  return {
    period,
    cutoff,
    resultId: 1,
    status: 'ok',
    firstStage: inference(0.6, 0.5, 0.7),
    itt: inference(-0.07, -0.12, -0.02),
    effect: inference(-0.12, -0.2, -0.04),
    takeUp: { ineligible: 0.1, eligible: 0.7 },
    nUsed: 900,
    worstCaveat: null,
    stale: false,
    ...over,
  };
}

export function windowResult(periods: string[], over: Partial<OutcomeResultDto> = {}): OutcomeResultDto {
  const both = (e: InferenceDto) => ({ conventional: e, robust: { ...e, estimate: e.estimate * 1.1 } });
  return {
    id: 99,
    programId: 1,
    outcome: SHUTOFF,
    scope: { kind: 'window', key: `window:last-${periods.length}`, firstPeriod: periods[0]!, lastPeriod: periods.at(-1)!, cohortCount: periods.length, periods: periods.map((p) => ({ period: p, cutoff: 58 })) },
    status: 'ok',
    problem: null,
    level: 0.95,
    firstStage: { ...both(inference(0.612, 0.553, 0.671)), f: 300, weak: false },
    itt: both(inference(-0.074, -0.11, -0.03)),
    effect: both(inference(-0.121, -0.198, -0.041)),
    bandwidth: { rule: 'mse', h: 12, b: 20, hIneligible: 12, hEligible: 12 },
    n: { ineligible: 5000, eligible: 5000, usedIneligible: 2000, usedEligible: 2100, clusters: null, droppedByDonut: 0 },
    pooling: null,
    caveats: [],
    stale: false,
    staleReason: null,
    deviationCount: 0,
    preRegistered: false,
    provenance: { runId: 1, computedAt: '2026-11-02T13:00:00.000Z', designId: 1, designVersion: 1, designVersionId: 1, engineVersion: 'x', diagnosticsVersion: null, appVersion: 'x', extracts: [] },
    ...over,
  };
}

import type { OutcomeRefDto, OutcomeResultDto, TrendPointDto } from '@shared/api/results';
import { headline } from '@shared/results/headline';

/**
 * Pure transforms from the results contract to what the trend charts and tables draw. Values are
 * in display units: shares and jumps in shares become percentages / percentage points (×100),
 * other outcomes keep their own units.
 */

/** One month of a line with its interval; nulls where the month has no estimate. */
export interface BandPoint {
  period: string;
  estimate: number | null;
  low: number | null;
  high: number | null;
  /** The month carries a serious caveat (drawn with a mark and listed in words). */
  serious: boolean;
}

export type TrendQuantity = 'firstStage' | 'itt' | 'effect';

/** ×100 for shares (percentage points), ×1 otherwise. */
export const displayScale = (outcome: Pick<OutcomeRefDto, 'unit'>, quantity: TrendQuantity): number =>
  quantity === 'firstStage' || outcome.unit === 'share' ? 100 : 1;

/** One quantity across the months, scaled for display. */
export function bandSeries(points: readonly TrendPointDto[], quantity: TrendQuantity, scale: number): BandPoint[] {
  return points.map((p) => {
    const v = p.status === 'ok' ? p[quantity] : null;
    return {
      period: p.period,
      estimate: v ? v.estimate * scale : null,
      low: v ? v.ciLow * scale : null,
      high: v ? v.ciHigh * scale : null,
      serious: p.worstCaveat === 'serious',
    };
  });
}

/** Take-up just below and just above the cutoff, in percent, month by month. */
export function takeUpSides(points: readonly TrendPointDto[]): { eligible: Array<{ period: string; value: number | null }>; ineligible: Array<{ period: string; value: number | null }> } {
  const side = (which: 'eligible' | 'ineligible') =>
    points.map((p) => {
      const v = p.status === 'ok' ? (p.takeUp?.[which] ?? null) : null;
      return { period: p.period, value: v === null ? null : v * 100 };
    });
  return { eligible: side('eligible'), ineligible: side('ineligible') };
}

/** Where the cutoff moved: the first month of each new cutoff after the first month shown. */
export function cutoffChanges(points: readonly TrendPointDto[]): Array<{ period: string; from: number; to: number }> {
  const out: Array<{ period: string; from: number; to: number }> = [];
  for (let i = 1; i < points.length; i++) {
    const before = points[i - 1]!;
    const now = points[i]!;
    if (now.cutoff !== before.cutoff) out.push({ period: now.period, from: before.cutoff, to: now.cutoff });
  }
  return out;
}

/** Months with a serious caveat, in order. */
export const seriousPeriods = (points: readonly TrendPointDto[]): string[] => points.filter((p) => p.worstCaveat === 'serious').map((p) => p.period);

/** The y range that holds every estimate and interval end (with 5% headroom), and 0. */
export function valueRange(series: ReadonlyArray<readonly BandPoint[]>, extra: ReadonlyArray<number | null> = []): { min: number; max: number } {
  const values = [0, ...extra.filter((v): v is number => v !== null)];
  for (const s of series) for (const p of s) for (const v of [p.estimate, p.low, p.high]) if (v !== null && Number.isFinite(v)) values.push(v);
  const min = Math.min(...values);
  const max = Math.max(...values);
  const pad = (max - min || 1) * 0.05;
  return { min: min - pad, max: max + pad };
}

/** A pooled window as a row of the pooled view: label, months, headline figures (display units). */
export interface WindowRow {
  key: string;
  months: number;
  firstPeriod: string;
  lastPeriod: string;
  status: OutcomeResultDto['status'];
  problem: string | null;
  firstStage: BandPoint;
  itt: BandPoint;
  effect: BandPoint;
  nUsed: number | null;
  cutoffs: number[];
  serious: boolean;
  stale: boolean;
}

/** The `window:last-N` results, shortest first (previous-N baselines are for alerts, not shown here). */
export function windowRows(windows: readonly OutcomeResultDto[], outcome: Pick<OutcomeRefDto, 'unit'>): WindowRow[] {
  const serious = (w: OutcomeResultDto) => w.caveats.some((c) => c.severity === 'serious');
  const band = (w: OutcomeResultDto, q: TrendQuantity): BandPoint => {
    const h = w.status === 'ok' ? headline(w[q]) : null;
    const s = displayScale(outcome, q);
    return { period: w.scope.key, estimate: h ? h.estimate * s : null, low: h ? h.ciLow * s : null, high: h ? h.ciHigh * s : null, serious: serious(w) };
  };
  return windows
    .filter((w) => w.scope.key.startsWith('window:last-'))
    .sort((a, b) => a.scope.cohortCount - b.scope.cohortCount)
    .map((w) => ({
      key: w.scope.key,
      months: w.scope.cohortCount,
      firstPeriod: w.scope.firstPeriod,
      lastPeriod: w.scope.lastPeriod,
      status: w.status,
      problem: w.problem?.message ?? null,
      firstStage: band(w, 'firstStage'),
      itt: band(w, 'itt'),
      effect: band(w, 'effect'),
      nUsed: w.n ? w.n.usedEligible + w.n.usedIneligible : null,
      cutoffs: [...new Set(w.scope.periods.map((p) => p.cutoff))],
      serious: serious(w),
      stale: w.stale,
    }));
}

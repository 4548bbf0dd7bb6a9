/**
 * The tF procedure of Lee, McCrary, Moreira & Porter (2022, AER 112(10):3260–90) for a 5% test with
 * one instrument: replace 1.96 by a critical value c(F) that depends on the first-stage F, so the
 * t-test keeps its size whatever the instrument's strength.
 *
 * Points of c(F) used here, and where each comes from:
 * | F       | c(F)  | source |
 * |---------|-------|--------|
 * | 3.8416  | ∞     | from memory: below F = 1.96² the tF interval is unbounded (METHODS §6) |
 * | 4.0     | 18.66 | FROM MEMORY, low confidence: recalled first row of LMMP's Table 3; not verified |
 * | 10      | 3.43  | verified: LMMP abstract (METHODS §6) |
 * | 104.7   | 1.96  | verified: LMMP abstract, "F > 104.7" for a true 5% test at ±1.96 (METHODS §6) |
 *
 * Between points, log c is interpolated linearly in log(F − 3.8416), which is monotone, continuous,
 * and tends to ∞ at the asymptote. The intermediate published rows (F = 5, 6, 8, 15, 20, 30, 50, …)
 * were not available to us, so values between the points above are interpolations, not table
 * entries; the interval is labelled with `basis` so a reader knows which kind they got.
 */
export const TF_ASYMPTOTE_F = 1.96 * 1.96;
/** Above this F no adjustment is needed at 5% (verified, LMMP 2022). */
export const TF_NO_ADJUSTMENT_F = 104.7;

export type TfPointSource = 'verified' | 'from-memory';

export interface TfPoint {
  f: number;
  critical: number;
  source: TfPointSource;
}

/** The finite points of c(F), ascending in F (the asymptote is handled separately). */
export const TF_POINTS: readonly TfPoint[] = [
  { f: 4.0, critical: 18.66, source: 'from-memory' },
  { f: 10, critical: 3.43, source: 'verified' },
  { f: TF_NO_ADJUSTMENT_F, critical: 1.96, source: 'verified' },
];

/** How a critical value was obtained. */
export type TfBasis =
  /** At or above F = 104.7: 1.96 itself (verified). */
  | 'no-adjustment'
  /** Exactly at a verified point. */
  | 'verified-point'
  /** Between verified points only (10 ≤ F < 104.7): interpolated, not a published row. */
  | 'interpolated-between-verified'
  /** Below F = 10: depends on the from-memory point at F = 4. */
  | 'from-memory'
  /** F ≤ 3.8416: unbounded. */
  | 'unbounded';

export interface TfCriticalValue {
  /** c(F) for a 5% two-sided test; Infinity when unbounded. */
  critical: number;
  /** c(F) / 1.96: how much wider the interval is than the usual one. */
  factor: number;
  basis: TfBasis;
}

/**
 * c(F) at 5%.
 * @example tfCriticalValue(10).critical // 3.43
 * @example tfCriticalValue(150).factor // 1
 */
export function tfCriticalValue(f: number): TfCriticalValue {
  if (Number.isNaN(f) || f < 0) throw new RangeError(`tfCriticalValue: F must be a non-negative number, got ${f}`);
  if (f >= TF_NO_ADJUSTMENT_F) return { critical: 1.96, factor: 1, basis: 'no-adjustment' };
  if (f <= TF_ASYMPTOTE_F) return { critical: Infinity, factor: Infinity, basis: 'unbounded' };
  const exact = TF_POINTS.find((p) => p.f === f && p.source === 'verified');
  const basis: TfBasis = exact ? 'verified-point' : f >= 10 ? 'interpolated-between-verified' : 'from-memory';
  const critical = exact ? exact.critical : interpolate(f);
  return { critical, factor: critical / 1.96, basis };
}

function interpolate(f: number): number {
  const x = Math.log(f - TF_ASYMPTOTE_F);
  let upper = 0;
  while (TF_POINTS[upper]!.f < f) upper++;
  const hi = TF_POINTS[upper]!;
  if (upper === 0) {
    // Between the asymptote and the first point: extend the first segment's log–log slope.
    const next = TF_POINTS[1]!;
    return Math.exp(lineAt(x, hi, next));
  }
  return Math.exp(lineAt(x, TF_POINTS[upper - 1]!, hi));
}

function lineAt(x: number, a: TfPoint, b: TfPoint): number {
  const xa = Math.log(a.f - TF_ASYMPTOTE_F);
  const xb = Math.log(b.f - TF_ASYMPTOTE_F);
  const ya = Math.log(a.critical);
  const yb = Math.log(b.critical);
  return ya + ((x - xa) / (xb - xa)) * (yb - ya);
}

/** JSON-serialisable: unbounded intervals have nulls, never Infinity. */
export interface TfInterval {
  /** c(F), or null when unbounded. */
  critical: number | null;
  /** c(F)/1.96, or null when unbounded. */
  factor: number | null;
  basis: TfBasis;
  /** estimate ± c(F)·se; null when unbounded (F ≤ 3.8416). */
  ciLow: number | null;
  ciHigh: number | null;
}

/** The tF-adjusted 95% interval for an estimate with standard error `se` and first-stage F. */
export function tfInterval(estimate: number, se: number, f: number): TfInterval {
  const c = tfCriticalValue(f);
  if (!Number.isFinite(c.critical)) return { critical: null, factor: null, basis: c.basis, ciLow: null, ciHigh: null };
  return { ...c, ciLow: estimate - c.critical * se, ciHigh: estimate + c.critical * se };
}

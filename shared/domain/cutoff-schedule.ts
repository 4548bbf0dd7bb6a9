import type { EligibleSide } from '../schemas/program';

export interface ScheduledCutoff {
  cutoff: number;
  /** First period (`YYYY-MM`) the cutoff applies to. */
  firstPeriod: string;
}

/**
 * The cutoff in force for a cohort period: the latest change whose first period is not after it.
 * Periods compare as strings because `YYYY-MM` sorts chronologically.
 *
 * @returns the cutoff, or `null` when the schedule starts after `period`.
 * @example cutoffForPeriod([{ cutoff: 60, firstPeriod: '2024-11' }, { cutoff: 58, firstPeriod: '2025-11' }], '2026-01') // => 58
 */
export function cutoffForPeriod(schedule: readonly ScheduledCutoff[], period: string): number | null {
  let best: ScheduledCutoff | null = null;
  for (const change of schedule) {
    if (change.firstPeriod <= period && (best === null || change.firstPeriod > best.firstPeriod)) best = change;
  }
  return best === null ? null : best.cutoff;
}

/**
 * Whether a score qualifies. A score exactly at the cutoff is eligible on either side convention.
 * @example isEligible(60, 60, 'at-or-above') // => true
 */
export function isEligible(score: number, cutoff: number, side: EligibleSide): boolean {
  return side === 'at-or-above' ? score >= cutoff : score <= cutoff;
}

import type { DiscontinuityData, DiscontinuityOptions } from '../estimation';
import { estimateSharp, reportedEffect, subsetRows } from './engine-calls';
import { holmAdjust } from './multiple-testing';
import type { PlaceboRow } from './types';

/** Default positions of the false cutoffs: quartiles of the score on each side. */
export const PLACEBO_QUANTILES = [0.25, 0.5, 0.75] as const;

/**
 * Placebo cutoffs (Imbens & Lemieux 2008 suggest the medians of each side; METHODS §7): the jump
 * in the outcome at false cutoffs at quantiles of the score within each side, using only that
 * side's observations, so the real discontinuity never enters. Estimated by the engine as a sharp
 * design (take-up does not jump there, so a ratio would be undefined) with the same options and a
 * fresh bandwidth from the same rule. Expected to be null; Holm-adjusted p-values summarise them.
 * False cutoffs the engine cannot estimate (too few observations) are skipped.
 */
export function placeboCutoffs(data: DiscontinuityData, options: DiscontinuityOptions, quantiles: readonly number[] = PLACEBO_QUANTILES): PlaceboRow[] {
  const eligibleAt = (x: number) => (options.eligibleSide === 'at-or-above' ? x >= options.cutoff : x <= options.cutoff);
  const partial: Omit<PlaceboRow, 'pAdjusted'>[] = [];
  for (const side of ['ineligible', 'eligible'] as const) {
    const sideData = subsetRows(data, (i) => eligibleAt(data.score[i]!) === (side === 'eligible'));
    const sorted = Float64Array.from(sideData.score).sort();
    for (const q of quantiles) {
      const cutoff = sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
      if (cutoff === undefined || cutoff === options.cutoff) continue;
      try {
        const r = reportedEffect(estimateSharp(sideData.score, sideData.outcome, sideData.cluster, { ...options, cutoff }));
        partial.push({ cutoff, side, estimate: r.estimate, ciLow: r.ciLow, ciHigh: r.ciHigh, p: r.p, h: r.h });
      } catch {
        // Too few observations either side of this false cutoff: nothing to report for it.
      }
    }
  }
  const adjusted = holmAdjust(partial.map((r) => r.p));
  return partial.map((r, i) => ({ ...r, pAdjusted: adjusted[i]! }));
}

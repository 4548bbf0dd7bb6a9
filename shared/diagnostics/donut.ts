import { estimateDiscontinuity, type DiscontinuityData, type DiscontinuityOptions } from '../estimation';
import { reportedEffect, subsetRows } from './engine-calls';
import type { DonutRow } from './types';

/** Radii as multiples of the score's grid step when it has one (1, 2, 3 steps). */
export const DONUT_STEPS = [1, 2, 3] as const;
/** Radii as fractions of the main bandwidth for a continuous score (common practice, no source). */
export const DONUT_BANDWIDTH_FRACTIONS = [0.05, 0.1, 0.2] as const;

/**
 * Donut estimates (METHODS §7): drop the observations with |score − cutoff| < r and re-estimate
 * with the same options (a data-driven bandwidth is chosen again on the remaining data). For
 * heaping or manipulation right at the cutoff; it trades robustness for extrapolation to the
 * cutoff. Radii the engine cannot estimate are skipped.
 * @param radii score units, e.g. `donutRadii(step, h)`.
 */
export function donutEstimates(data: DiscontinuityData, options: DiscontinuityOptions, radii: readonly number[]): DonutRow[] {
  const rows: DonutRow[] = [];
  for (const radius of radii) {
    const kept = subsetRows(data, (i) => !(Math.abs(data.score[i]! - options.cutoff) < radius));
    const dropped = data.score.length - kept.score.length;
    try {
      const r = reportedEffect(estimateDiscontinuity(kept, options));
      rows.push({ radius, dropped, estimate: r.estimate, ciLow: r.ciLow, ciHigh: r.ciHigh, p: r.p, h: r.h });
    } catch {
      // Too few observations left near the cutoff for this radius.
    }
  }
  return rows;
}

/**
 * The default radii: 1–3 grid steps when the score's grid is coarse next to the bandwidth (a step
 * of at least 5% of h), else 5%, 10% and 20% of the bandwidth.
 */
export function donutRadii(gridStep: number | null, h: number): number[] {
  if (gridStep !== null && gridStep >= DONUT_BANDWIDTH_FRACTIONS[0] * h && gridStep < h) {
    // Rounded to the grid's decimals so radii read like scores (0.3, not 0.30000000000000004).
    const decimals = Math.max(0, 1 - Math.floor(Math.log10(gridStep)));
    return DONUT_STEPS.map((k) => Number((k * gridStep).toFixed(decimals)));
  }
  return DONUT_BANDWIDTH_FRACTIONS.map((f) => f * h);
}

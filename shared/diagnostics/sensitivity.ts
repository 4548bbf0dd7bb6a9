import { estimateDiscontinuity, type DiscontinuityData, type DiscontinuityEstimate, type DiscontinuityOptions } from '../estimation';
import { reportedEffect } from './engine-calls';
import type { SensitivityRow } from './types';

/** Multiples of the main bandwidth (METHODS §7: {0.5, 0.75, 1, 1.25, 1.5, 2} × h). */
export const SENSITIVITY_MULTIPLES = [0.5, 0.75, 1, 1.25, 1.5, 2] as const;

/**
 * Bandwidth sensitivity (METHODS §7): the estimate and robust interval at multiples of the main
 * bandwidth h, with the bias bandwidth b scaled alike (so h/b stays as in the main estimate and
 * the row at 1 is the main estimate), plus the coverage-error-optimal bandwidth (Calonico,
 * Cattaneo & Farrell; the engine's `coverage` rule). Multiples the engine cannot estimate (too
 * few observations in a narrow window) are skipped.
 */
export function bandwidthSensitivity(
  data: DiscontinuityData,
  options: DiscontinuityOptions,
  main: DiscontinuityEstimate,
  multiples: readonly number[] = SENSITIVITY_MULTIPLES,
): SensitivityRow[] {
  const rows: SensitivityRow[] = [];
  for (const multiple of multiples) {
    try {
      const result =
        multiple === 1 ? main : estimateDiscontinuity(data, { ...options, bandwidth: multiple * main.bandwidth.h, biasBandwidth: multiple * main.bandwidth.b });
      rows.push(row(result, multiple, 'grid'));
    } catch {
      // Too narrow (or too wide for the data): nothing to show at this multiple.
    }
  }
  if (typeof options.bandwidth !== 'number') {
    try {
      rows.push(row(estimateDiscontinuity(data, { ...options, bandwidth: { rule: 'coverage' }, biasBandwidth: undefined }), null, 'coverage'));
    } catch {
      // The coverage rule shrinks h; with very few observations it may leave too few.
    }
  }
  return rows;
}

function row(result: DiscontinuityEstimate, multiple: number | null, rule: SensitivityRow['rule']): SensitivityRow {
  const r = reportedEffect(result);
  return { h: r.h, multiple, rule, estimate: r.estimate, ciLow: r.ciLow, ciHigh: r.ciHigh, p: r.p };
}

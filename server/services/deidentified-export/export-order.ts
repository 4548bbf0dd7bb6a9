import type { CohortSegment, ObservationArrays } from '../observations.service';

/**
 * The order rows of one cohort are exported in: by score, then take-up, then every outcome and
 * covariate (missing values last). It depends only on the values, so nothing of the uploaded file's
 * row order (which the agency could match to its case list) survives; rows that tie on every value
 * are indistinguishable, whatever order they keep.
 * @returns indices into the arrays, within the cohort's segment
 */
export function exportOrder(data: ObservationArrays, cohort: CohortSegment): number[] {
  const columns: Float64Array[] = [data.score, ...(data.takeUp ? [data.takeUp] : []), ...Object.values(data.outcomes), ...Object.values(data.covariates)];
  const rows = Array.from({ length: cohort.length }, (_v, k) => cohort.offset + k);
  return rows.sort((a, b) => {
    for (const col of columns) {
      const d = compareValues(col[a]!, col[b]!);
      if (d !== 0) return d;
    }
    return 0;
  });
}

function compareValues(x: number, y: number): number {
  const xMissing = Number.isNaN(x);
  const yMissing = Number.isNaN(y);
  if (xMissing || yMissing) return Number(xMissing) - Number(yMissing);
  return x - y;
}

import { estimateDiscontinuity, type DiscontinuityData, type DiscontinuityEstimate, type DiscontinuityOptions } from '../estimation';

/**
 * The small glue every estimator-based diagnostic shares: which number of an engine result it
 * reports, and how to run the engine on a subset of rows. The estimator itself is the engine's.
 */

/** The reported row of one engine result: effect on participants (fuzzy) or the jump (sharp). */
export interface ReportedEffect {
  /** Conventional point estimate. */
  estimate: number;
  /** Robust bias-corrected interval and p-value. */
  ciLow: number;
  ciHigh: number;
  p: number;
  /** Robust t: bias-corrected estimate / robust SE. */
  t: number;
  /** Main bandwidth used, score units. */
  h: number;
}

export function reportedEffect(result: DiscontinuityEstimate): ReportedEffect {
  const e = result.effect;
  return { estimate: e.estimate, ciLow: e.robust.ciLow, ciHigh: e.robust.ciHigh, p: e.robust.p, t: e.robust.z, h: result.bandwidth.h };
}

/** The rows whose index passes `keep`, as a new data object (take-up and clusters follow). */
export function subsetRows(data: DiscontinuityData, keep: (i: number) => boolean): DiscontinuityData {
  const n = data.score.length;
  const index = new Uint32Array(n);
  let kept = 0;
  for (let i = 0; i < n; i++) if (keep(i)) index[kept++] = i;
  // Plain loops: TypedArray.from with a mapping function is several times slower on large data.
  const pick = <T extends Float64Array | Int32Array>(column: T, out: T): T => {
    for (let k = 0; k < kept; k++) out[k] = column[index[k]!]!;
    return out;
  };
  return {
    score: pick(data.score, new Float64Array(kept)),
    outcome: pick(data.outcome, new Float64Array(kept)),
    ...(data.takeUp ? { takeUp: pick(data.takeUp, new Float64Array(kept)) } : {}),
    ...(data.cluster ? { cluster: pick(data.cluster, new Int32Array(kept)) } : {}),
  };
}

/** Runs the engine as a sharp design on `outcome` (covariate balance, placebo cutoffs). */
export function estimateSharp(score: Float64Array, outcome: Float64Array, cluster: Int32Array | undefined, options: DiscontinuityOptions): DiscontinuityEstimate {
  return estimateDiscontinuity({ score, outcome, ...(cluster ? { cluster } : {}) }, options);
}

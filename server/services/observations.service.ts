import { In, IsNull, type DataSource } from 'typeorm';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import { rawConnection, streamRows } from '../db/raw-connection';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { Extract } from '../entities/extract.entity';
import type { CohortLoader } from './recompute/recompute-deps';

/** One cohort's rows inside the arrays: `[offset, offset + length)`. */
export interface CohortSegment {
  period: string;
  extractId: number;
  /** SHA-256 of the extract's file: stamp it on results so a replaced extract marks them stale. */
  sha256: string;
  offset: number;
  length: number;
  /** The cutoff in force for the period (scores are not centred). */
  cutoff: number | null;
}

/**
 * A program's visible observations for some periods, one value per applicant in each array, cohort
 * after cohort in period order (rows of a cohort in file order).
 * - `takeUp` is 0/1, or null when no loaded extract mapped take-up (NaN for rows of one that did not).
 * - outcomes and covariates are keyed by definition key; NaN where the value is missing or the
 *   extract did not map that key.
 * - `cluster` (codes ≥ 1; -1 where missing) is present when any extract mapped a cluster column.
 */
export interface ObservationArrays {
  programId: number;
  n: number;
  score: Float64Array;
  takeUp: Float64Array | null;
  outcomes: Record<string, Float64Array>;
  covariates: Record<string, Float64Array>;
  cluster?: Int32Array;
  cohorts: CohortSegment[];
  /** Asked-for periods with no accepted extract (or whose rows were purged). */
  missingPeriods: string[];
}

/**
 * Loads the accepted observations of one or more periods into typed arrays for the engine: one
 * primary-key range scan per extract, rows streamed as arrays straight into preallocated typed
 * arrays (sized from the extracts' accepted-row counts).
 */
export async function loadObservations(ds: DataSource, programId: number, periods: readonly string[]): Promise<ObservationArrays> {
  const wanted = [...new Set(periods)].sort();
  const extracts =
    wanted.length === 0
      ? []
      : await ds.getRepository(Extract).find({
          where: { programId, period: In(wanted), status: 'accepted', observationsPurgedAt: IsNull() },
          order: { period: 'ASC' },
        });
  const schedule = await ds.getRepository(CutoffChange).find({ where: { programId } });
  const n = extracts.reduce((sum, e) => sum + (e.rowsAccepted ?? 0), 0);
  const outcomeKeys = new Set<string>();
  const covariateKeys = new Set<string>();
  for (const e of extracts) {
    for (const k of Object.keys(e.slots?.outcomes ?? {})) outcomeKeys.add(k);
    for (const k of Object.keys(e.slots?.covariates ?? {})) covariateKeys.add(k);
  }
  const nanArray = () => new Float64Array(n).fill(Number.NaN);
  const result: ObservationArrays = {
    programId,
    n,
    score: new Float64Array(n),
    takeUp: extracts.some((e) => e.slots?.takeUp) ? nanArray() : null,
    outcomes: Object.fromEntries([...outcomeKeys].map((k) => [k, nanArray()])),
    covariates: Object.fromEntries([...covariateKeys].map((k) => [k, nanArray()])),
    cohorts: [],
    missingPeriods: wanted.filter((p) => !extracts.some((e) => e.period === p)),
  };
  if (extracts.some((e) => e.slots?.cluster)) result.cluster = new Int32Array(n).fill(-1);

  const { conn, release } = await rawConnection(ds);
  try {
    let offset = 0;
    for (const e of extracts) {
      const slots = e.slots!;
      const outcomeTargets = Object.entries(slots.outcomes).map(([key, slot]) => ({ column: `o${slot}`, array: result.outcomes[key]! }));
      const covariateTargets = Object.entries(slots.covariates).map(([key, slot]) => ({ column: `c${slot}`, array: result.covariates[key]! }));
      const targets = [...outcomeTargets, ...covariateTargets];
      const sql = `SELECT score, take_up, cluster_code${targets.map((t) => `, ${t.column}`).join('')} FROM observation WHERE extract_id = ? ORDER BY row_no`;
      const start = offset;
      const limit = start + (e.rowsAccepted ?? 0);
      let i = start;
      await streamRows(conn, sql, [e.id], (row) => {
        if (i >= limit) return; // counts and rows disagree: never write past this cohort's segment
        result.score[i] = row[0] as number;
        if (result.takeUp && row[1] !== null) result.takeUp[i] = row[1] as number;
        if (result.cluster && row[2] !== null) result.cluster[i] = row[2] as number;
        for (let t = 0; t < targets.length; t++) {
          const v = row[3 + t];
          if (v !== null) targets[t]!.array[i] = v as number;
        }
        i++;
      });
      result.cohorts.push({ period: e.period, extractId: e.id, sha256: e.sha256, offset: start, length: i - start, cutoff: cutoffForPeriod(schedule, e.period) });
      offset = limit;
    }
  } finally {
    await release();
  }
  return result;
}

/**
 * The recompute's `CohortLoader` (`recompute/recompute-deps.ts`) over `loadObservations`: scores
 * centred on each cohort's own cutoff, the cutoff per applicant, and the cohorts as segments.
 * @throws Error when a cohort's accepted extract is no longer the one the run planned with (an
 *   accept or restore happened meanwhile; the recompute it queued covers the new data)
 */
export const observationCohortLoader: CohortLoader = async (ds, programId, cohorts) => {
  const arrays = await loadObservations(ds, programId, cohorts.map((c) => c.period));
  const planned = new Map(cohorts.map((c) => [c.period, c]));
  const centred = new Float64Array(arrays.n);
  const cutoffOf = new Float64Array(arrays.n);
  for (const segment of arrays.cohorts) {
    const plan = planned.get(segment.period);
    if (!plan || plan.extractId !== segment.extractId) {
      throw new Error(`The accepted extract of ${segment.period} changed while the recompute was planned.`);
    }
    for (let i = segment.offset; i < segment.offset + segment.length; i++) {
      centred[i] = arrays.score[i]! - plan.cutoff;
      cutoffOf[i] = plan.cutoff;
    }
  }
  if (arrays.missingPeriods.length > 0) throw new Error(`No visible observations for ${arrays.missingPeriods.join(', ')}.`);
  return {
    data: { n: arrays.n, centred, cutoffOf, takeUp: arrays.takeUp, outcomes: arrays.outcomes, covariates: arrays.covariates, cluster: arrays.cluster ?? null },
    segments: arrays.cohorts.map((c) => ({ period: c.period, offset: c.offset, length: c.length })),
  };
};

import type { DiscontinuityOptions } from '../estimation';
import { estimateSharp, reportedEffect } from './engine-calls';
import { holmAdjust } from './multiple-testing';
import type { BalanceRow, NamedColumn } from './types';

/**
 * Covariate balance (Lee & Lemieux 2010; Imbens & Lemieux 2008; METHODS §7): the jump at the
 * cutoff in each pre-determined covariate, estimated by the engine as a sharp design with the
 * covariate as the outcome and the same options — the same bandwidth rule, so each covariate gets
 * its own h (or the given h). Joint summary: Holm-adjusted p-values across covariates, and the
 * count of robust |t| > 1.96 (from the rows).
 *
 * A covariate the engine cannot estimate (e.g. constant near the cutoff) is left out and its
 * error returned in `failures`.
 */
export function covariateBalance(
  score: Float64Array,
  covariates: readonly NamedColumn[],
  options: DiscontinuityOptions,
  cluster?: Int32Array,
): { rows: BalanceRow[]; failures: { covariate: string; error: unknown }[] } {
  const partial: Omit<BalanceRow, 'pAdjusted'>[] = [];
  const failures: { covariate: string; error: unknown }[] = [];
  for (const covariate of covariates) {
    try {
      const r = reportedEffect(estimateSharp(score, covariate.values, cluster, options));
      partial.push({ covariate: covariate.name, jump: r.estimate, ciLow: r.ciLow, ciHigh: r.ciHigh, t: r.t, p: r.p, h: r.h });
    } catch (error) {
      failures.push({ covariate: covariate.name, error });
    }
  }
  const adjusted = holmAdjust(partial.map((r) => r.p));
  return { rows: partial.map((r, i) => ({ ...r, pAdjusted: adjusted[i]! })), failures };
}

/** Covariates whose robust |t| exceeds 1.96. */
export function countImbalanced(rows: readonly BalanceRow[]): number {
  return rows.filter((r) => Math.abs(r.t) > 1.96).length;
}

import { createHash } from 'node:crypto';
import type { ResultScopeDto } from '@shared/api/results';
import { WINDOW_SIZES } from '@shared/schemas/design';
import { canonicalJson } from '../design-settings';
import type { AcceptedExtract } from './accepted-extracts';

/** Cohorts before the latest that the change alerts compare the latest cohort with. */
export const BASELINE_WINDOW = 3;

/** A cohort with its accepted extract and the cutoff in force for it. */
export interface CohortInput extends AcceptedExtract {
  cutoff: number;
}

/** One scope the recompute must have a current result for, with the signature of its inputs. */
export interface PlannedScope {
  scope: ResultScopeDto;
  cohorts: CohortInput[];
  /** SHA-256 (hex) of everything the scope's figures depend on. */
  signature: string;
}

/** What the figures depend on besides the data: the design version and the code versions. */
export interface SignatureBasis {
  designVersionId: number;
  settings: unknown;
  eligibleSide: string;
  engineVersion: string;
  diagnosticsVersion: string | null;
}

/**
 * The scopes of a program: every cohort with an accepted extract; the pooled windows of the last
 * 3, 6 and 12 cohorts (when there are that many); and `previous-3`, the three cohorts before the
 * latest, which change alerts compare the latest cohort with.
 */
export function planScopes(cohorts: readonly CohortInput[], basis: SignatureBasis): PlannedScope[] {
  const sorted = [...cohorts].sort((a, b) => a.period.localeCompare(b.period));
  const out: PlannedScope[] = sorted.map((c) => plan(`cohort:${c.period}`, 'cohort', [c], basis));
  for (const size of WINDOW_SIZES) {
    if (sorted.length >= size) out.push(plan(`window:last-${size}`, 'window', sorted.slice(-size), basis));
  }
  if (sorted.length > BASELINE_WINDOW) out.push(plan(`window:previous-${BASELINE_WINDOW}`, 'window', sorted.slice(-BASELINE_WINDOW - 1, -1), basis));
  return out;
}

function plan(key: string, kind: 'cohort' | 'window', cohorts: CohortInput[], basis: SignatureBasis): PlannedScope {
  const scope: ResultScopeDto = {
    kind,
    key,
    firstPeriod: cohorts[0]!.period,
    lastPeriod: cohorts[cohorts.length - 1]!.period,
    cohortCount: cohorts.length,
    periods: cohorts.map((c) => ({ period: c.period, cutoff: c.cutoff })),
  };
  const signature = createHash('sha256')
    .update(canonicalJson({ ...basis, scope: key, cohorts: cohorts.map((c) => ({ period: c.period, cutoff: c.cutoff, extractId: c.extractId, sha256: c.sha256 })) }))
    .digest('hex');
  return { scope, cohorts, signature };
}

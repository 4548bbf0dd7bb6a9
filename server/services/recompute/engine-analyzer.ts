import type { CaveatDto, EstimateDto, InferenceDto, PoolingDto } from '@shared/api/results';
import { createDiagnosticsMemo, DIAGNOSTICS_VERSION, runDiagnostics, type DiagnosticsMemo, type NamedColumn } from '@shared/diagnostics';
import { ENGINE_VERSION, estimateDiscontinuity, isEstimationError, type DiscontinuityEstimate, type DiscontinuityOptions } from '@shared/estimation';
import type { DesignSettings } from '@shared/schemas/design';
import type { StoredFigures } from '../../entities/estimate-result.entity';
import type { AnalyzedOutcome, AnalyzeInput, Analyzer, ScopeData } from './analyzer';
import { plotBins } from './plot-bins';

/** Pooled windows are read as weighted averages over cutoffs; this sentence goes with every pooled result. */
export const POOLING_STATEMENT =
  'Pooled over several months: each month’s scores are measured from that month’s own cutoff, and the pooled estimate is a weighted average of the effects at the cutoffs in force (Cattaneo, Keele, Titiunik & Vazquez-Bare 2016), weighted by how many applicants score near each cutoff.';

/**
 * The analyzer that uses the estimation engine (`@shared/estimation`) and the diagnostics
 * (`@shared/diagnostics`): per outcome, the fuzzy estimate on the scope's applicants (scores
 * centred on their own cohort's cutoff, so the cutoff is 0 for cohorts and windows alike), with the
 * design's kernel, order, bandwidth rule, variance, clusters, level and donut; then every
 * diagnostic and the caveats they imply (`runDiagnostics`), with the design's balance covariates.
 * Data that admit no estimate give a `not-estimable` result, not a failure.
 */
export const engineAnalyzer = {
  engineVersion: ENGINE_VERSION,
  diagnosticsVersion: DIAGNOSTICS_VERSION,
  analyze(input: AnalyzeInput): AnalyzedOutcome[] {
    // The outcomes of a scope share their applicants: rows and outcome-independent diagnostics are kept between them.
    const shared: ScopeShared = { memo: createDiagnosticsMemo(), rows: [] };
    return input.settings.outcomes.map((key) => analyzeOutcome(input, key, shared));
  },
} satisfies Analyzer;

/** What the outcomes of one scope share. */
interface ScopeShared {
  memo: DiagnosticsMemo;
  /** Rows selected so far, by the mask of kept rows (outcomes with the same gaps keep the same rows). */
  rows: Array<{ keep: Uint8Array; rows: SelectedRows }>;
}

function analyzeOutcome({ scope, data, settings, eligibleSide, labels }: AnalyzeInput, outcomeKey: string, shared: ScopeShared): AnalyzedOutcome {
  const outcome = data.outcomes[outcomeKey];
  const empty: StoredFigures = { level: settings.level, problem: null, firstStage: null, itt: null, effect: null, bandwidth: null, n: null, pooling: null };
  if (!outcome) {
    return notEstimable(outcomeKey, empty, 'outcome_not_loaded', 'No accepted extract of these months maps this outcome.');
  }
  const rows = selectRows(data, outcome, settings, shared);
  const bins = plotBins(rows.centred, rows.outcome, rows.takeUp ?? null, eligibleSide);
  const options: DiscontinuityOptions = {
    cutoff: 0,
    eligibleSide,
    kernel: settings.kernel,
    order: settings.order,
    bandwidth: settings.bandwidthRule === 'fixed' ? settings.bandwidthValue! : { rule: settings.bandwidthRule },
    variance: settings.variance,
    level: settings.level,
  };
  const engineData = { score: rows.centred, outcome: rows.outcome, takeUp: rows.takeUp, cluster: rows.cluster };
  const report = runDiagnostics(
    { ...engineData, covariates: rows.covariates.map((c) => ({ ...c, label: labels?.covariates[c.name] ?? c.name })) },
    { ...options, population: labels?.population ?? 'applicants', outcomesTested: settings.outcomes.length, centredFrom: agencyCutoff(scope) },
    shared.memo,
  );
  const { caveats: reportCaveats, ...findings } = report;
  const caveats: CaveatDto[] = reportCaveats.map((c) => ({ code: c.code, severity: c.severity, message: c.message, values: c.values }));
  // Stored without the caveats, which are kept in their own column.
  const diagnostics = findings as unknown as Record<string, unknown>;
  let estimate: DiscontinuityEstimate;
  try {
    estimate = estimateDiscontinuity(engineData, options);
  } catch (err) {
    if (!isEstimationError(err)) throw err;
    return { ...notEstimable(outcomeKey, empty, err.code, err.message), bins, caveats, diagnostics };
  }
  const pooling = scope.scope.kind === 'window' ? poolingWeights(rows.centred, rows.cutoffOf, estimate.bandwidth.h, scope.scope.periods) : null;
  const figures: StoredFigures = {
    level: settings.level,
    problem: null,
    firstStage: estimate.firstStage
      ? { ...jump(estimate.firstStage), f: estimate.firstStage.f, weak: estimate.firstStage.belowRuleOfThumb }
      : null,
    itt: jump(estimate.itt),
    effect: {
      conventional: inference(estimate.effect.estimate, estimate.effect),
      robust: inference(estimate.effect.robust.estimate, estimate.effect.robust),
    },
    bandwidth: {
      rule: estimate.bandwidth.rule,
      h: estimate.bandwidth.h,
      b: estimate.bandwidth.b,
      hIneligible: estimate.bandwidth.sides.ineligible.h,
      hEligible: estimate.bandwidth.sides.eligible.h,
    },
    n: {
      ineligible: estimate.n.ineligible,
      eligible: estimate.n.eligible,
      usedIneligible: estimate.n.usedIneligible,
      usedEligible: estimate.n.usedEligible,
      clusters: estimate.n.clusters,
      droppedByDonut: rows.droppedByDonut,
    },
    pooling,
    limits: estimate.limits,
  };
  return { outcomeKey, status: 'ok', figures, caveats, diagnostics, bins };
}

interface SelectedRows {
  centred: Float64Array;
  cutoffOf: Float64Array;
  outcome: Float64Array;
  takeUp: Float64Array | undefined;
  cluster: Int32Array | undefined;
  /** Balance covariates with a value for every kept row (a covariate with gaps is left out of the balance check). */
  covariates: NamedColumn[];
  droppedByDonut: number;
}

/**
 * Rows with every value the estimate needs, outside the donut. When an earlier outcome of the scope
 * kept exactly the same rows, its arrays are reused (only the outcome is picked anew), so the
 * diagnostics' memo recognises the same applicants.
 */
function selectRows(data: ScopeData, outcome: Float64Array, settings: DesignSettings, shared: ScopeShared): SelectedRows {
  const clustered = settings.cluster === 'cluster-column' && data.cluster !== null;
  const keep = new Uint8Array(data.n);
  let kept = 0;
  let droppedByDonut = 0;
  for (let i = 0; i < data.n; i++) {
    const x = data.centred[i]!;
    const ok = Number.isFinite(x) && Number.isFinite(outcome[i]!) && (!data.takeUp || Number.isFinite(data.takeUp[i]!)) && (!clustered || data.cluster![i]! >= 1);
    if (!ok) continue;
    if (settings.donutRadius > 0 && Math.abs(x) < settings.donutRadius) {
      droppedByDonut++;
      continue;
    }
    keep[i] = 1;
    kept++;
  }
  const pick = (col: Float64Array) => {
    if (kept === data.n) return col;
    const out = new Float64Array(kept);
    for (let i = 0, j = 0; i < data.n; i++) if (keep[i]) out[j++] = col[i]!;
    return out;
  };
  const same = shared.rows.find((r) => sameMask(r.keep, keep));
  if (same) return { ...same.rows, outcome: pick(outcome) };
  let cluster: Int32Array | undefined;
  if (clustered) {
    cluster = new Int32Array(kept);
    for (let i = 0, j = 0; i < data.n; i++) if (keep[i]) cluster[j++] = data.cluster![i]!;
  }
  const covariates: NamedColumn[] = [];
  for (const name of settings.covariates) {
    const col = data.covariates[name];
    if (!col) continue;
    const values = pick(col);
    if (values.every((v) => Number.isFinite(v))) covariates.push({ name, values });
  }
  const rows: SelectedRows = {
    covariates,
    centred: pick(data.centred),
    cutoffOf: pick(data.cutoffOf),
    outcome: pick(outcome),
    takeUp: data.takeUp ? pick(data.takeUp) : undefined,
    cluster,
    droppedByDonut,
  };
  shared.rows.push({ keep, rows });
  return rows;
}

function sameMask(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/**
 * Share of the window's observations within the bandwidth around each cutoff: the density part of
 * the weights of the pooled estimand (Cattaneo, Keele, Titiunik & Vazquez-Bare 2016; from memory,
 * in a fuzzy design the weights also scale with each cutoff's take-up jump).
 */
function poolingWeights(centred: Float64Array, cutoffOf: Float64Array, h: number, periods: ReadonlyArray<{ period: string; cutoff: number }>): PoolingDto {
  const counts = new Map<number, number>();
  let total = 0;
  for (let i = 0; i < centred.length; i++) {
    if (Math.abs(centred[i]!) > h) continue;
    const c = cutoffOf[i]!;
    counts.set(c, (counts.get(c) ?? 0) + 1);
    total++;
  }
  const cutoffs = [...new Set(periods.map((p) => p.cutoff))].sort((a, b) => a - b);
  return {
    method: 'normalised-score',
    statement: POOLING_STATEMENT,
    weights: cutoffs.map((cutoff) => ({
      cutoff,
      periods: periods.filter((p) => p.cutoff === cutoff).map((p) => p.period),
      share: total > 0 ? (counts.get(cutoff) ?? 0) / total : 0,
    })),
  };
}

/** The cutoff of a scope whose cohorts share one (so messages can name it); null when they differ. */
function agencyCutoff(scope: AnalyzeInput['scope']): number | null {
  const cutoffs = new Set(scope.cohorts.map((c) => c.cutoff));
  return cutoffs.size === 1 ? [...cutoffs][0]! : null;
}

function inference(estimate: number, i: { se: number; ciLow: number; ciHigh: number; p: number }): InferenceDto {
  return { estimate, se: i.se, ciLow: i.ciLow, ciHigh: i.ciHigh, p: i.p };
}

function jump(j: DiscontinuityEstimate['itt']): EstimateDto {
  return { conventional: inference(j.jump, j), robust: inference(j.robust.estimate, j.robust) };
}

function notEstimable(outcomeKey: string, empty: StoredFigures, code: string, message: string): AnalyzedOutcome {
  return { outcomeKey, status: 'not-estimable', figures: { ...empty, problem: { code, message } }, caveats: [], diagnostics: null, bins: [] };
}

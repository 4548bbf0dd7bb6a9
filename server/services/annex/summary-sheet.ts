import type { CaveatSeverity } from '@shared/api/results';
import type { AnnexContent, AnnexResult } from './annex-content';
import { reproduceCommand } from './reproduce-command';
import { NUMBER_FORMATS as F, SheetBuilder, type ColumnSpec } from './sheet-model';

const SEVERITY_RANK: Record<CaveatSeverity, number> = { info: 0, caution: 1, serious: 2 };

/**
 * The Summary sheet's columns, one row per outcome and cohort or pooled window. Every figure is
 * read from the result DTO as the API returns it; kernel, order, variance, cluster and donut come
 * from the design version recorded in the result's provenance. Exported for the tests, which
 * compare each numeric cell with the API's value.
 */
export function summaryColumns(content: AnnexContent): Array<ColumnSpec<AnnexResult>> {
  return [
    { header: 'Scope', value: (r) => r.result.scope.key },
    { header: 'Outcome', value: (r) => r.result.outcome.key },
    { header: 'Outcome label', value: (r) => r.result.outcome.label },
    { header: 'Outcome unit', value: (r) => r.result.outcome.unit },
    { header: 'Scope kind', value: (r) => r.result.scope.kind },
    { header: 'First cohort', value: (r) => r.result.scope.firstPeriod },
    { header: 'Last cohort', value: (r) => r.result.scope.lastPeriod },
    { header: 'Cohorts', value: (r) => r.result.scope.cohortCount, numFmt: F.integer },
    { header: 'Cutoff (score)', value: (r) => (r.result.scope.kind === 'cohort' ? r.result.scope.periods[0]?.cutoff : null), numFmt: F.score },
    { header: 'Lowest cutoff pooled', value: (r) => (r.result.scope.kind === 'window' ? Math.min(...r.result.scope.periods.map((p) => p.cutoff)) : null), numFmt: F.score },
    { header: 'Highest cutoff pooled', value: (r) => (r.result.scope.kind === 'window' ? Math.max(...r.result.scope.periods.map((p) => p.cutoff)) : null), numFmt: F.score },
    { header: 'Status', value: (r) => r.result.status },
    { header: 'Not estimable because', value: (r) => r.result.problem?.code ?? null },
    { header: 'Design version', value: (r) => r.result.provenance.designVersion, numFmt: F.integer },
    { header: 'Confidence level', value: (r) => r.result.level, numFmt: F.level },

    { header: 'Take-up jump (first stage)', value: (r) => r.result.firstStage?.conventional.estimate, numFmt: F.estimate },
    { header: 'Take-up jump SE', value: (r) => r.result.firstStage?.conventional.se, numFmt: F.estimate },
    { header: 'First-stage F', value: (r) => r.result.firstStage?.f, numFmt: F.statistic },
    { header: 'Take-up jump robust CI low', value: (r) => r.result.firstStage?.robust.ciLow, numFmt: F.estimate },
    { header: 'Take-up jump robust CI high', value: (r) => r.result.firstStage?.robust.ciHigh, numFmt: F.estimate },

    { header: 'ITT jump', value: (r) => r.result.itt?.conventional.estimate, numFmt: F.estimate },
    { header: 'ITT SE', value: (r) => r.result.itt?.conventional.se, numFmt: F.estimate },
    { header: 'ITT CI low', value: (r) => r.result.itt?.conventional.ciLow, numFmt: F.estimate },
    { header: 'ITT CI high', value: (r) => r.result.itt?.conventional.ciHigh, numFmt: F.estimate },
    { header: 'ITT robust CI low', value: (r) => r.result.itt?.robust.ciLow, numFmt: F.estimate },
    { header: 'ITT robust CI high', value: (r) => r.result.itt?.robust.ciHigh, numFmt: F.estimate },
    { header: 'ITT robust p', value: (r) => r.result.itt?.robust.p, numFmt: F.p },

    { header: 'Complier effect (conventional)', value: (r) => r.result.effect?.conventional.estimate, numFmt: F.estimate },
    { header: 'Complier effect SE (conventional)', value: (r) => r.result.effect?.conventional.se, numFmt: F.estimate },
    { header: 'Complier effect CI low (conventional)', value: (r) => r.result.effect?.conventional.ciLow, numFmt: F.estimate },
    { header: 'Complier effect CI high (conventional)', value: (r) => r.result.effect?.conventional.ciHigh, numFmt: F.estimate },
    { header: 'Complier effect p (conventional)', value: (r) => r.result.effect?.conventional.p, numFmt: F.p },
    { header: 'Complier effect robust bias-corrected', value: (r) => r.result.effect?.robust.estimate, numFmt: F.estimate },
    { header: 'Complier effect robust SE', value: (r) => r.result.effect?.robust.se, numFmt: F.estimate },
    { header: 'Complier effect robust CI low', value: (r) => r.result.effect?.robust.ciLow, numFmt: F.estimate },
    { header: 'Complier effect robust CI high', value: (r) => r.result.effect?.robust.ciHigh, numFmt: F.estimate },
    { header: 'Complier effect robust p', value: (r) => r.result.effect?.robust.p, numFmt: F.p },

    { header: 'Bandwidth rule', value: (r) => r.result.bandwidth?.rule ?? null },
    { header: 'Bandwidth h (score)', value: (r) => r.result.bandwidth?.h, numFmt: F.score },
    { header: 'Bias bandwidth b (score)', value: (r) => r.result.bandwidth?.b, numFmt: F.score },
    { header: 'h, ineligible side', value: (r) => r.result.bandwidth?.hIneligible, numFmt: F.score },
    { header: 'h, eligible side', value: (r) => r.result.bandwidth?.hEligible, numFmt: F.score },
    { header: 'Kernel', value: (r) => r.settings?.kernel ?? null },
    { header: 'Order p', value: (r) => r.settings?.order, numFmt: F.integer },
    { header: 'Variance estimator', value: (r) => r.settings?.variance ?? null },
    { header: 'Clustered by', value: (r) => (r.settings ? (r.settings.cluster === 'none' ? 'none' : 'cluster column') : null) },
    { header: 'Donut radius (score)', value: (r) => r.settings?.donutRadius, numFmt: F.score },

    { header: 'n ineligible side', value: (r) => r.result.n?.ineligible, numFmt: F.count },
    { header: 'n eligible side', value: (r) => r.result.n?.eligible, numFmt: F.count },
    { header: 'Effective n ineligible (weight > 0)', value: (r) => r.result.n?.usedIneligible, numFmt: F.count },
    { header: 'Effective n eligible (weight > 0)', value: (r) => r.result.n?.usedEligible, numFmt: F.count },
    { header: 'Clusters', value: (r) => r.result.n?.clusters, numFmt: F.count },
    { header: 'Left out by the donut', value: (r) => r.result.n?.droppedByDonut, numFmt: F.count },

    { header: 'Caveats', value: (r) => r.result.caveats.length, numFmt: F.integer },
    { header: 'Most serious caveat', value: (r) => worstSeverity(r) },
    { header: 'Deviations from the locked plan', value: (r) => r.result.deviationCount, numFmt: F.integer },
    { header: 'Pre-registered', value: (r) => r.result.preRegistered },
    { header: 'Stale', value: (r) => r.result.stale },
    { header: 'Run', value: (r) => r.result.provenance.runId, numFmt: F.integer },
    { header: 'Computed at (UTC)', value: (r) => r.result.provenance.computedAt },
    { header: 'Reproduce with (from the de-identified export)', value: (r) => reproduceCommand(content.program, r) },
  ];
}

/** Scope and outcome stay in view while scrolling across the figures. */
const FROZEN_COLUMNS = 2;

export function summarySheet(content: AnnexContent): SheetBuilder {
  return new SheetBuilder('Summary').singleTable(summaryColumns(content), content.results, FROZEN_COLUMNS);
}

function worstSeverity(r: AnnexResult): CaveatSeverity | null {
  let worst: CaveatSeverity | null = null;
  for (const c of r.result.caveats) if (worst === null || SEVERITY_RANK[c.severity] > SEVERITY_RANK[worst]) worst = c.severity;
  return worst;
}

import type { DataSource } from 'typeorm';
import type { DesignDetailDto, DesignVersionDto, DeviationDto } from '@shared/api/designs';
import type { ProgramDetailDto } from '@shared/api/programs';
import type { BinDto, OutcomeResultDto, ResultsOverviewDto } from '@shared/api/results';
import type { DiagnosticsReport } from '@shared/diagnostics';
import type { DesignSettings } from '@shared/schemas/design';
import { AppError } from '../../lib/errors';
import { getDesign } from '../designs.service';
import { getProgram } from '../programs.service';
import { clusterExported, exportColumns } from '../deidentified-export/export-columns';
import { getCohortDetail, getCohortTrend, getResultsOverview, resultDetails } from '../results.service';
import { extractMappings } from './extract-mappings';

/** What the recompute stores of a `DiagnosticsReport`: every finding; the caveats are on the result itself. */
export type StoredDiagnostics = Omit<DiagnosticsReport, 'caveats'>;

/** What the annex covers: every stored result of the primary design, or one cohort's. */
export type AnnexScope = { kind: 'program' } | { kind: 'cohort'; period: string };

export interface AnnexRequest {
  scope: AnnexScope;
  /** Who asked for it (display name, printed on the Cover sheet; never logged). */
  generatedBy: string;
  generatedAt: Date;
}

/**
 * One stored result with what the annex prints about it: the API's DTO as returned (never
 * re-derived), its diagnostics and plot bins when the API serves them (cohorts), and the design
 * settings of the version that produced it.
 */
export interface AnnexResult {
  result: OutcomeResultDto;
  /** The diagnostics' findings as stored (`shared/diagnostics`, without their caveats: those are the result's), or null. */
  diagnostics: StoredDiagnostics | null;
  bins: BinDto[];
  deviations: DeviationDto[];
  /** Settings of the design version recorded in the result's provenance (null if that version is unknown). */
  settings: DesignSettings | null;
}

/** Which column of an uploaded extract fed each column of the de-identified export. */
export interface ExtractMapping {
  period: string;
  extractId: number;
  fileName: string;
  /** Export column name → the extract's column. */
  sourceColumns: Record<string, string>;
  /** The codes read as "took part" / "did not", e.g. `1 / 0`. */
  takeUpCodes: string | null;
  /** Mapped columns of the extract that are never exported (identifier, dates, period column). */
  notExported: string[];
}

export interface AnnexContent {
  request: AnnexRequest;
  program: ProgramDetailDto;
  overview: ResultsOverviewDto;
  design: DesignDetailDto;
  /** Cohorts in period order, then pooled windows; within each, outcomes in the design's order. */
  results: AnnexResult[];
  /** First and last cohort period of the results included. */
  periodCovered: { first: string; last: string };
  /** Design versions the included results were computed with, ascending. */
  designVersions: DesignVersionDto[];
  /** Every cohort's extract behind the included results, by period. */
  extracts: Array<{ period: string; extractId: number; sha256: string }>;
  /** Engine, diagnostics and app versions found in the results' provenance. */
  versions: { engine: string[]; diagnostics: string[]; app: string[] };
  /** The export carries a cluster column (a version of the primary design clusters its variance). */
  exportHasCluster: boolean;
  /** The column mapping of each extract behind the results. */
  mappings: ExtractMapping[];
}

/**
 * Everything the annex shows, read through the same services (and DTOs) the results API answers
 * with, so every figure in the workbook is the API's figure for the same cohort or window.
 * @throws no_primary_design | result_not_found when there is nothing to put in the annex
 */
export async function gatherAnnexContent(ds: DataSource, programId: number, request: AnnexRequest): Promise<AnnexContent> {
  const program = await getProgram(ds, programId);
  const overview = await getResultsOverview(ds, programId);
  if (!overview.design) {
    throw new AppError('no_primary_design', 'This program has no evaluation design yet, so there is no annex. An analyst creates one under Designs.');
  }
  const design = await getDesign(ds, programId, overview.design.id);
  const outcomeOrder = overview.outcomes.map((o) => o.outcome.key);
  const settingsOf = (version: number) => design.versions.find((v) => v.version === version)?.settings ?? null;

  const results: AnnexResult[] = [];
  const periods =
    request.scope.kind === 'cohort' ? [request.scope.period] : await cohortPeriods(ds, programId, outcomeOrder);
  for (const period of periods) {
    const detail = await getCohortDetail(ds, programId, period);
    for (const o of detail.outcomes) {
      const { diagnostics, bins, deviations, ...result } = o;
      results.push({ result, diagnostics: asDiagnosticsReport(diagnostics), bins, deviations, settings: settingsOf(result.provenance.designVersion) });
    }
  }
  if (request.scope.kind === 'program') {
    const windows: OutcomeResultDto[] = [];
    for (const key of outcomeOrder) windows.push(...(await getCohortTrend(ds, programId, key)).windows);
    windows.sort((a, b) => windowRank(a.scope.key) - windowRank(b.scope.key) || outcomeOrder.indexOf(a.outcome.key) - outcomeOrder.indexOf(b.outcome.key));
    const details = await resultDetails(ds, windows.map((w) => w.id));
    for (const w of windows) {
      const deviations = design.deviations.filter((d) => d.toVersion <= w.provenance.designVersion).sort((a, b) => a.toVersion - b.toVersion);
      const detail = details.get(w.id);
      results.push({ result: w, diagnostics: asDiagnosticsReport(detail?.diagnostics ?? null), bins: detail?.bins ?? [], deviations, settings: settingsOf(w.provenance.designVersion) });
    }
  }
  if (results.length === 0) {
    throw new AppError('result_not_found', 'There are no results to put in an annex yet. They appear after an extract is accepted and the recompute has run.');
  }
  const summary = provenanceSummary(results, design);
  const exportHasCluster = clusterExported(design.versions);
  const mappings = await extractMappings(ds, programId, summary.extracts.map((e) => e.extractId), exportColumns(program, { cluster: exportHasCluster }));
  return {
    request,
    program,
    overview,
    design,
    results,
    ...summary,
    exportHasCluster,
    mappings,
  };
}

/** Cohort periods with a stored result for any outcome, ascending. */
async function cohortPeriods(ds: DataSource, programId: number, outcomeKeys: readonly string[]): Promise<string[]> {
  const periods = new Set<string>();
  for (const key of outcomeKeys) for (const p of (await getCohortTrend(ds, programId, key)).points) periods.add(p.period);
  return [...periods].sort();
}

/** Windows in a fixed order: last-3, last-6, last-12, then the change-alert baselines. */
function windowRank(key: string): number {
  const m = /^window:(last|previous)-(\d+)$/.exec(key);
  if (!m) return 10_000;
  return (m[1] === 'last' ? 0 : 1_000) + Number(m[2]);
}

function provenanceSummary(results: readonly AnnexResult[], design: DesignDetailDto) {
  const firsts = results.map((r) => r.result.scope.firstPeriod).sort();
  const lasts = results.map((r) => r.result.scope.lastPeriod).sort();
  const extracts = new Map<string, { period: string; extractId: number; sha256: string }>();
  for (const r of results) for (const e of r.result.provenance.extracts) extracts.set(`${e.period}:${e.extractId}`, e);
  const used = new Set(results.map((r) => r.result.provenance.designVersion));
  const distinct = (values: Array<string | null>) => [...new Set(values.filter((v): v is string => v !== null))].sort();
  return {
    periodCovered: { first: firsts[0]!, last: lasts[lasts.length - 1]! },
    designVersions: design.versions.filter((v) => used.has(v.version)).sort((a, b) => a.version - b.version),
    extracts: [...extracts.values()].sort((a, b) => a.period.localeCompare(b.period) || a.extractId - b.extractId),
    versions: {
      engine: distinct(results.map((r) => r.result.provenance.engineVersion)),
      diagnostics: distinct(results.map((r) => r.result.provenance.diagnosticsVersion)),
      app: distinct(results.map((r) => r.result.provenance.appVersion)),
    },
  };
}

/**
 * The stored diagnostics are the findings `runDiagnostics` returned, kept as JSON
 * (`OutcomeResultDetailDto.diagnostics`). Anything without their list keys (an older or partial
 * row) is treated as "not run" rather than guessed at.
 */
function asDiagnosticsReport(value: Record<string, unknown> | null): StoredDiagnostics | null {
  if (!value || !Array.isArray(value.balance) || !Array.isArray(value.placebo) || !Array.isArray(value.sensitivity)) return null;
  return value as unknown as StoredDiagnostics;
}

import type { DataSource, EntityManager } from 'typeorm';
import type { ListDto } from '@shared/api/programs';
import type {
  CaveatSeverity,
  CohortDetailDto,
  CohortTrendDto,
  OutcomeOverviewDto,
  OutcomeRefDto,
  OutcomeResultDetailDto,
  OutcomeResultDto,
  ResultsOverviewDto,
} from '@shared/api/results';
import type { RunDto } from '@shared/api/runs';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import { changeAlerts } from '@shared/results/change-alerts';
import { headline } from '@shared/results/headline';
import { STANDING_CAUTIONS } from '@shared/results/standing-cautions';
import { WINDOW_SIZES } from '@shared/schemas/design';
import type { PageQuery } from '@shared/schemas/paging';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { EstimateResult } from '../entities/estimate-result.entity';
import { EstimateResultDetail } from '../entities/estimate-result-detail.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { RecomputeRun } from '../entities/recompute-run.entity';
import { AppError, notFound } from '../lib/errors';
import { acknowledgementsFor } from './caveat-acknowledgements.service';
import { deviationsUpTo, primaryDesign } from './designs.service';
import { BASELINE_WINDOW } from './recompute/scope-plan';

const SEVERITY_RANK: Record<CaveatSeverity, number> = { info: 0, caution: 1, serious: 2 };

/**
 * The latest results of the program's primary design: per outcome the latest cohort, the one
 * before and the pooled windows; change alerts; the last run. Everything the dashboards' first
 * screen and the director's e-mail show.
 */
export async function getResultsOverview(ds: DataSource, programId: number): Promise<ResultsOverviewDto> {
  const program = await ds.getRepository(Program).findOneBy({ id: programId });
  if (!program) throw notFound('Program');
  const primary = await primaryDesign(ds.manager, programId);
  const lastRun = await ds.getRepository(RecomputeRun).findOne({ where: { programId }, order: { id: 'DESC' } });
  const base: ResultsOverviewDto = {
    programId,
    programName: program.name,
    design: null,
    latestPeriod: null,
    outcomes: [],
    alerts: [],
    stale: false,
    lastRun: lastRun ? toRunDto(lastRun) : null,
    cautions: [...STANDING_CAUTIONS],
  };
  if (!primary) return base;
  const { design, version } = primary;
  const deviations = await deviationsUpTo(ds.manager, design.id, version.version);
  base.design = { id: design.id, name: design.name, version: version.version, locked: design.lockedAt !== null, deviationCount: deviations.length };
  const refs = await outcomeRefs(ds.manager, programId, version.settings.outcomes);
  const rows = await ds.getRepository(EstimateResult).find({ where: { designId: design.id }, order: { lastPeriod: 'ASC' } });
  const dtos = await toDtos(ds.manager, rows, refs);
  const cohortPeriods = [...new Set(dtos.filter((d) => d.scope.kind === 'cohort').map((d) => d.scope.lastPeriod))].sort();
  const latestPeriod = cohortPeriods.at(-1) ?? null;
  const previousPeriod = cohortPeriods.at(-2) ?? null;
  base.latestPeriod = latestPeriod;
  for (const ref of refs) {
    const mine = dtos.filter((d) => d.outcome.key === ref.key);
    const latest = mine.find((d) => d.scope.key === `cohort:${latestPeriod}`) ?? null;
    const previous = mine.find((d) => d.scope.key === `cohort:${previousPeriod}`) ?? null;
    const windows = WINDOW_SIZES.map((n) => mine.find((d) => d.scope.key === `window:last-${n}`)).filter((d): d is OutcomeResultDto => d !== undefined);
    const baseline = mine.find((d) => d.scope.key === `window:previous-${BASELINE_WINDOW}`) ?? null;
    const overview: OutcomeOverviewDto = { outcome: ref, latest, previous, windows, changeFromPrevious: changeFromPrevious(latest, previous) };
    base.outcomes.push(overview);
    base.alerts.push(...changeAlerts(latest, baseline, previous));
    if ([latest, previous, ...windows].some((d) => d?.stale)) base.stale = true;
  }
  return base;
}

/** Per-cohort points of one outcome, with the pooled windows. @throws not_found for an unknown outcome */
export async function getCohortTrend(ds: DataSource, programId: number, outcomeKey: string): Promise<CohortTrendDto> {
  const primary = await requirePrimary(ds, programId);
  const [ref] = await outcomeRefs(ds.manager, programId, [outcomeKey]);
  if (!ref) throw notFound('Outcome');
  const rows = await ds.getRepository(EstimateResult).find({ where: { designId: primary.design.id, outcomeKey }, order: { lastPeriod: 'ASC' } });
  const dtos = await toDtos(ds.manager, rows, [ref]);
  return {
    programId,
    outcome: ref,
    designVersion: primary.version.version,
    points: dtos
      .filter((d) => d.scope.kind === 'cohort')
      .map((d) => ({
        period: d.scope.lastPeriod,
        cutoff: d.scope.periods[0]!.cutoff,
        resultId: d.id,
        status: d.status,
        firstStage: headline(d.firstStage),
        itt: headline(d.itt),
        effect: headline(d.effect),
        takeUp: d.limits ? { ineligible: d.limits.ineligible.takeUp, eligible: d.limits.eligible.takeUp } : null,
        nUsed: d.n ? d.n.usedEligible + d.n.usedIneligible : null,
        worstCaveat: worstSeverity(d),
        stale: d.stale,
      })),
    windows: dtos.filter((d) => d.scope.kind === 'window'),
  };
}

/** The stored diagnostics and plot bins of some results (a pooled window's, say), by result id. */
export async function resultDetails(ds: DataSource, resultIds: readonly number[]): Promise<Map<number, Pick<OutcomeResultDetailDto, 'diagnostics' | 'bins'>>> {
  const details = resultIds.length === 0 ? [] : await ds.getRepository(EstimateResultDetail).findBy(resultIds.map((resultId) => ({ resultId })));
  return new Map(details.map((d) => [d.resultId, { diagnostics: d.diagnostics ?? null, bins: d.bins ?? [] }]));
}

/** One cohort: every outcome's estimates, diagnostics, caveats, bins and deviations. */
export async function getCohortDetail(ds: DataSource, programId: number, period: string): Promise<CohortDetailDto> {
  const primary = await requirePrimary(ds, programId);
  const rows = await ds.getRepository(EstimateResult).find({ where: { designId: primary.design.id, scopeKey: `cohort:${period}` } });
  const schedule = await ds.getRepository(CutoffChange).findBy({ programId });
  const refs = await outcomeRefs(ds.manager, programId, primary.version.settings.outcomes);
  const dtos = await toDtos(ds.manager, rows, refs);
  const details = await resultDetails(ds, rows.map((r) => r.id));
  const outcomes: OutcomeResultDetailDto[] = [];
  for (const d of dtos) {
    outcomes.push({
      ...d,
      ...(details.get(d.id) ?? { diagnostics: null, bins: [] }),
      deviations: await deviationsUpTo(ds.manager, primary.design.id, d.provenance.designVersion),
    });
  }
  outcomes.sort((a, b) => refs.findIndex((r) => r.key === a.outcome.key) - refs.findIndex((r) => r.key === b.outcome.key));
  if (outcomes.length === 0) throw new AppError('result_not_found', `There are no results for ${period} yet. They appear after the month’s extract is accepted and the recompute has run.`);
  return { programId, period, cutoff: cutoffForPeriod(schedule, period), outcomes };
}

/** The job-run log of a program, newest first. */
export async function listRuns(ds: DataSource, programId: number, page: PageQuery): Promise<ListDto<RunDto>> {
  const [rows, total] = await ds.getRepository(RecomputeRun).findAndCount({
    where: { programId },
    order: { id: 'DESC' },
    skip: (page.page - 1) * page.pageSize,
    take: page.pageSize,
  });
  return { items: rows.map(toRunDto), total, page: page.page, pageSize: page.pageSize };
}

export async function getRun(ds: DataSource, programId: number, runId: number): Promise<RunDto> {
  const run = await ds.getRepository(RecomputeRun).findOneBy({ id: runId, programId });
  if (!run) throw notFound('Run');
  return toRunDto(run);
}

export function toRunDto(r: RecomputeRun): RunDto {
  return {
    id: r.id,
    programId: r.programId,
    designId: r.designId,
    trigger: r.trigger,
    requestedBy: r.requestedByLabel,
    status: r.status,
    progress: { done: r.progressDone, total: r.progressTotal, current: r.progressCurrent },
    attempts: r.attempts,
    maxAttempts: r.maxAttempts,
    nextAttemptAt: r.status === 'queued' ? r.nextAttemptAt.toISOString() : null,
    requestedAt: r.requestedAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
    durationS: r.durationMs === null ? null : r.durationMs / 1000,
    resultsWritten: r.resultsWritten,
    error: r.errorMessage,
  };
}

async function requirePrimary(ds: DataSource, programId: number) {
  if (!(await ds.getRepository(Program).existsBy({ id: programId }))) throw notFound('Program');
  const primary = await primaryDesign(ds.manager, programId);
  if (!primary) throw new AppError('no_primary_design', 'This program has no evaluation design yet, so there are no results. An analyst creates one under Designs.');
  return primary;
}

/** Outcome definitions in the design's order. */
async function outcomeRefs(manager: EntityManager, programId: number, keys: readonly string[]): Promise<OutcomeRefDto[]> {
  const defs = await manager.getRepository(OutcomeDefinition).findBy({ programId });
  return keys
    .map((k) => defs.find((d) => d.key === k))
    .filter((d): d is OutcomeDefinition => d !== undefined)
    .map((d) => ({ key: d.key, label: d.label, unit: d.unit, kind: d.kind, goodDirection: d.goodDirection }));
}

async function toDtos(manager: EntityManager, rows: EstimateResult[], refs: OutcomeRefDto[]): Promise<OutcomeResultDto[]> {
  const deviationCounts = new Map<string, number>();
  const acks = await acknowledgementsFor(manager, rows);
  const out: OutcomeResultDto[] = [];
  for (const r of rows) {
    const ref = refs.find((x) => x.key === r.outcomeKey);
    if (!ref) continue;
    const cacheKey = `${r.designId}:${r.designVersion}`;
    if (!deviationCounts.has(cacheKey)) deviationCounts.set(cacheKey, (await deviationsUpTo(manager, r.designId, r.designVersion)).length);
    out.push({ ...toOutcomeResultDto(r, ref, deviationCounts.get(cacheKey)!), acknowledgements: acks.get(r.id) ?? [] });
  }
  return out;
}

export function toOutcomeResultDto(r: EstimateResult, outcome: OutcomeRefDto, deviationCount: number): OutcomeResultDto {
  return {
    id: r.id,
    programId: r.programId,
    outcome,
    scope: r.scope,
    status: r.status,
    problem: r.figures.problem,
    level: r.figures.level,
    firstStage: r.figures.firstStage,
    itt: r.figures.itt,
    effect: r.figures.effect,
    bandwidth: r.figures.bandwidth,
    n: r.figures.n,
    pooling: r.figures.pooling,
    limits: r.figures.limits ?? null,
    caveats: r.caveats,
    stale: r.stale,
    staleReason: r.staleReason,
    deviationCount,
    preRegistered: r.preRegistered,
    provenance: r.provenance,
  };
}

function changeFromPrevious(latest: OutcomeResultDto | null, previous: OutcomeResultDto | null): OutcomeOverviewDto['changeFromPrevious'] {
  if (!latest || !previous) return null;
  const diff = (a: { conventional: { estimate: number } } | null, b: { conventional: { estimate: number } } | null) =>
    a && b ? a.conventional.estimate - b.conventional.estimate : null;
  return { effect: diff(latest.effect, previous.effect), firstStage: diff(latest.firstStage, previous.firstStage), itt: diff(latest.itt, previous.itt) };
}

function worstSeverity(d: OutcomeResultDto): CaveatSeverity | null {
  let worst: CaveatSeverity | null = null;
  for (const c of d.caveats) if (worst === null || SEVERITY_RANK[c.severity] > SEVERITY_RANK[worst]) worst = c.severity;
  return worst;
}

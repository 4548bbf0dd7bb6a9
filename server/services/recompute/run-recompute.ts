import { In, type EntityManager } from 'typeorm';
import type { ProvenanceDto } from '@shared/api/results';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import { CovariateDefinition } from '../../entities/covariate-definition.entity';
import { CutoffChange } from '../../entities/cutoff-change.entity';
import { EstimateResult } from '../../entities/estimate-result.entity';
import { EstimateResultDetail } from '../../entities/estimate-result-detail.entity';
import type { EvaluationDesign } from '../../entities/evaluation-design.entity';
import { Program } from '../../entities/program.entity';
import { RecomputeRun } from '../../entities/recompute-run.entity';
import { AppError } from '../../lib/errors';
import { primaryDesign } from '../designs.service';
import type { AnalyzedOutcome } from './analyzer';
import { acceptedExtracts } from './accepted-extracts';
import { backoffMs } from './backoff';
import { recomputeLockName, tryNamedLock } from './named-lock';
import type { RecomputeDeps } from './recompute-deps';
import { dueRuns, failAttempt, recoverInterruptedRuns } from './run-queue';
import { planScopes, type CohortInput, type PlannedScope } from './scope-plan';
import { sliceScope } from './slice-scope';

/** How one attempt of a run ended, with where the time went (for the log and the benchmark). */
export interface RunReport {
  runId: number;
  outcome: 'succeeded' | 'up-to-date' | 'failed' | 'retrying' | 'skipped';
  scopesComputed: number;
  resultsWritten: number;
  loadMs: number;
  computeMs: number;
  writeMs: number;
}

/**
 * Works through the queue once: first recovers runs a dead process left `running`, then runs each
 * due run. Runs of a program another instance is working on stay queued for later.
 */
export async function processRecomputeQueue(deps: RecomputeDeps, limit = 20): Promise<RunReport[]> {
  const backoff = (attempt: number) => backoffMs(attempt, deps.retryBaseMs);
  await recoverInterruptedRuns(deps.dataSource, deps.now(), backoff);
  const reports: RunReport[] = [];
  for (const run of await dueRuns(deps.dataSource, deps.now(), limit)) reports.push(await executeRun(deps, run.id));
  return reports;
}

/**
 * One attempt of one run, under the program's named lock (`GET_LOCK`, so one recompute per
 * program across every app instance):
 * 1. claim the queued run (`running`; new triggers from now on queue a fresh run);
 * 2. plan the scopes and their input signatures; mark stale every stored result whose inputs changed;
 * 3. compute only the scopes whose signature changed, recording progress after each;
 * 4. write all new results and the run's success in one transaction.
 * A failure anywhere before 4 commits leaves the previous results as they were (stale), and the
 * run is retried after a back-off until its attempts are used up.
 */
export async function executeRun(deps: RecomputeDeps, runId: number): Promise<RunReport> {
  const ds = deps.dataSource;
  const report: RunReport = { runId, outcome: 'skipped', scopesComputed: 0, resultsWritten: 0, loadMs: 0, computeMs: 0, writeMs: 0 };
  const queued = await ds.getRepository(RecomputeRun).findOneBy({ id: runId });
  if (!queued || queued.status !== 'queued') return report;
  const lock = await tryNamedLock(ds, recomputeLockName(ds, queued.programId));
  if (!lock) return report;
  let run: RecomputeRun | null = null;
  try {
    const startedAt = deps.now();
    const claimed = await ds
      .createQueryBuilder()
      .update(RecomputeRun)
      .set({ status: 'running', queuedProgramId: null, startedAt, finishedAt: null, progressDone: 0, progressTotal: 0, progressCurrent: null, errorCode: null, errorMessage: null, attempts: () => 'attempts + 1' })
      .where('id = :id AND status = :status', { id: runId, status: 'queued' })
      .execute();
    if (claimed.affected !== 1) return report;
    run = await ds.getRepository(RecomputeRun).findOneByOrFail({ id: runId });
    await compute(deps, run, report);
    deps.logger.info({ runId, programId: run.programId, outcome: report.outcome, scopes: report.scopesComputed, results: report.resultsWritten, loadMs: report.loadMs, computeMs: report.computeMs }, 'recompute finished');
    return report;
  } catch (err) {
    const error = describeError(err);
    deps.logger.error({ runId, code: error.code, err: err instanceof AppError ? undefined : err }, 'recompute attempt failed');
    if (run) {
      const permanent = err instanceof AppError && err.code === 'no_primary_design';
      if (permanent) run.attempts = run.maxAttempts;
      await failAttempt(ds, run, error, deps.now(), (a) => backoffMs(a, deps.retryBaseMs));
      const after = await ds.getRepository(RecomputeRun).findOneByOrFail({ id: runId });
      report.outcome = after.status === 'queued' ? 'retrying' : 'failed';
    }
    return report;
  } finally {
    await lock.release();
  }
}

async function compute(deps: RecomputeDeps, run: RecomputeRun, report: RunReport): Promise<void> {
  const ds = deps.dataSource;
  const runs = ds.getRepository(RecomputeRun);
  const program = await ds.getRepository(Program).findOneByOrFail({ id: run.programId });
  const primary = await primaryDesign(ds.manager, program.id);
  if (!primary) throw new AppError('no_primary_design', 'This program has no evaluation design yet. An analyst creates one under Designs; the recompute then runs by itself.');
  const { design, version } = primary;
  await runs.update({ id: run.id }, { designId: design.id });

  const schedule = await ds.getRepository(CutoffChange).findBy({ programId: program.id });
  const cohorts: CohortInput[] = [];
  for (const e of await acceptedExtracts(ds.manager, program.id)) {
    const cutoff = cutoffForPeriod(schedule, e.period);
    if (cutoff !== null) cohorts.push({ ...e, cutoff });
  }
  const basis = {
    designVersionId: version.id,
    settings: version.settings,
    eligibleSide: program.eligibleSide,
    engineVersion: deps.analyzer.engineVersion,
    diagnosticsVersion: deps.analyzer.diagnosticsVersion,
  };
  const planned = planScopes(cohorts, basis);
  const existing = await ds.getRepository(EstimateResult).find({ where: { designId: design.id }, select: { id: true, scopeKey: true, outcomeKey: true, inputSignature: true, designVersion: true, stale: true, provenance: true } });
  const plannedByKey = new Map(planned.map((p) => [p.scope.key, p]));
  const outcomes = version.settings.outcomes;

  // Stale: stored results whose inputs no longer match. They stay visible until replaced.
  const staleIds: Array<{ id: number; reason: string }> = [];
  for (const r of existing) {
    const p = plannedByKey.get(r.scopeKey);
    if (r.stale) continue;
    if (!p) staleIds.push({ id: r.id, reason: 'This cohort’s extract is no longer the accepted one.' });
    else if (r.inputSignature !== p.signature) staleIds.push({ id: r.id, reason: staleReason(r, version.version, p, deps.analyzer.engineVersion) });
  }
  for (const s of staleIds) await ds.getRepository(EstimateResult).update({ id: s.id }, { stale: true, staleReason: s.reason.slice(0, 300) });

  const todo = planned.filter((p) => {
    const rows = existing.filter((r) => r.scopeKey === p.scope.key);
    return outcomes.some((o) => !rows.some((r) => r.outcomeKey === o && r.inputSignature === p.signature));
  });
  const removedScopes = [...new Set(existing.filter((r) => !plannedByKey.has(r.scopeKey)).map((r) => r.scopeKey))];
  const removedOutcomes = existing.filter((r) => plannedByKey.has(r.scopeKey) && !outcomes.includes(r.outcomeKey)).map((r) => r.id);
  if (todo.length === 0 && removedScopes.length === 0 && removedOutcomes.length === 0) {
    await finish(ds.manager, run, deps.now(), 'up-to-date', 0);
    report.outcome = 'up-to-date';
    return;
  }
  await runs.update({ id: run.id }, { progressTotal: todo.length });

  const needed = [...new Map(todo.flatMap((p) => p.cohorts).map((c) => [c.period, c])).values()].sort((a, b) => a.period.localeCompare(b.period));
  const loadStart = performance.now();
  const loaded = needed.length > 0 ? await deps.loadCohorts(ds, program.id, needed) : null;
  report.loadMs = performance.now() - loadStart;

  const covariateDefs = await ds.getRepository(CovariateDefinition).findBy({ programId: program.id });
  const labels = { population: program.populationLabel, covariates: Object.fromEntries(covariateDefs.map((c) => [c.key, c.label.toLowerCase()])) };
  const computed: Array<{ plan: PlannedScope; outcomes: AnalyzedOutcome[] }> = [];
  const computeStart = performance.now();
  let done = 0;
  // Scopes are independent: as many are analysed at once as the analyzer has workers.
  await forEachAtOnce(todo, deps.analyzer.parallelism ?? 1, async (plan) => {
    await runs.update({ id: run.id }, { progressCurrent: plan.scope.key });
    const data = sliceScope(loaded!, plan.scope.periods.map((p) => p.period));
    computed.push({ plan, outcomes: await deps.analyzer.analyze({ scope: plan, data, settings: version.settings, eligibleSide: program.eligibleSide, labels }) });
    done += 1;
    await runs.update({ id: run.id }, { progressDone: done });
    await deps.afterScope?.({ runId: run.id, done, total: todo.length, scopeKey: plan.scope.key });
  });
  report.computeMs = performance.now() - computeStart;

  const writeStart = performance.now();
  const computedAt = deps.now();
  const written = await ds.transaction(async (tx) => {
    const keys = [...computed.map((c) => c.plan.scope.key), ...removedScopes];
    if (keys.length > 0) await tx.getRepository(EstimateResult).delete({ designId: design.id, scopeKey: In(keys) });
    if (removedOutcomes.length > 0) await tx.getRepository(EstimateResult).delete({ id: In(removedOutcomes) });
    let count = 0;
    for (const { plan, outcomes: results } of computed) {
      const provenance: ProvenanceDto = {
        runId: run.id,
        computedAt: computedAt.toISOString(),
        designId: design.id,
        designVersion: version.version,
        designVersionId: version.id,
        engineVersion: deps.analyzer.engineVersion,
        diagnosticsVersion: deps.analyzer.diagnosticsVersion,
        appVersion: deps.config.version,
        extracts: plan.cohorts.map((c) => ({ period: c.period, extractId: c.extractId, sha256: c.sha256 })),
      };
      for (const r of results) {
        const saved = await tx.getRepository(EstimateResult).insert({
          programId: program.id,
          designId: design.id,
          designVersionId: version.id,
          designVersion: version.version,
          scopeKey: plan.scope.key,
          scopeKind: plan.scope.kind,
          firstPeriod: plan.scope.firstPeriod,
          lastPeriod: plan.scope.lastPeriod,
          outcomeKey: r.outcomeKey,
          status: r.status,
          scope: plan.scope,
          figures: r.figures,
          caveats: r.caveats,
          provenance,
          inputSignature: plan.signature,
          runId: run.id,
          computedAt,
          stale: false,
          staleReason: null,
          preRegistered: isPreRegistered(design, plan),
        });
        const resultId = Number((saved.identifiers[0] as { id: number }).id);
        await tx.getRepository(EstimateResultDetail).save(tx.getRepository(EstimateResultDetail).create({ resultId, diagnostics: r.diagnostics, bins: r.bins }));
        count++;
      }
    }
    await finish(tx, run, deps.now(), 'succeeded', count);
    return count;
  });
  report.writeMs = performance.now() - writeStart;
  report.outcome = 'succeeded';
  report.scopesComputed = computed.length;
  report.resultsWritten = written;
}

async function finish(manager: EntityManager, run: RecomputeRun, now: Date, status: 'succeeded' | 'up-to-date', written: number): Promise<void> {
  const durationMs = run.startedAt ? Math.max(0, now.getTime() - run.startedAt.getTime()) : null;
  await manager.getRepository(RecomputeRun).update({ id: run.id }, { status, finishedAt: now, durationMs, resultsWritten: written, progressCurrent: null, errorCode: null, errorMessage: null });
}

/** Every cohort of the scope was accepted after the lock (its outcomes were unseen when the plan was fixed). */
function isPreRegistered(design: EvaluationDesign, plan: PlannedScope): boolean {
  if (!design.lockedAt) return false;
  const seen = new Set(design.periodsSeenBeforeLock ?? []);
  return plan.cohorts.every((c) => !seen.has(c.period) && c.acceptedAt > design.lockedAt!);
}

function staleReason(r: Pick<EstimateResult, 'designVersion' | 'provenance'>, designVersion: number, p: PlannedScope, engineVersion: string): string {
  if (r.designVersion !== designVersion) return `The design changed (now version ${designVersion}).`;
  const before = new Map(r.provenance.extracts.map((e) => [e.period, e.sha256]));
  const changed = p.cohorts.filter((c) => before.get(c.period) !== c.sha256).map((c) => c.period);
  if (changed.length > 0) return `A new extract was accepted for ${changed.join(', ')}.`;
  if (r.provenance.engineVersion !== engineVersion) return `The estimation engine was updated (now ${engineVersion}).`;
  return 'The inputs of this result changed.';
}

function describeError(err: unknown): { code: string; message: string } {
  if (err instanceof AppError) return { code: err.code, message: err.message };
  return { code: 'recompute_failed', message: 'The recompute failed; the previous results were kept and marked stale. It is retried automatically; the error has been logged.' };
}

/** Runs `work` on every item, at most `limit` at a time, in order of the items; the first failure rejects (after the started ones end). */
async function forEachAtOnce<T>(items: readonly T[], limit: number, work: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  let failure: unknown = null;
  const lane = async () => {
    while (next < items.length && failure === null) {
      const item = items[next++]!;
      try {
        await work(item);
      } catch (err) {
        failure ??= err;
      }
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(limit, items.length)) }, lane));
  if (failure !== null) throw failure;
}

import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { EstimateResult } from '@server/entities/estimate-result.entity';
import { EstimateResultDetail } from '@server/entities/estimate-result-detail.entity';
import { Program } from '@server/entities/program.entity';
import { RecomputeRun } from '@server/entities/recompute-run.entity';
import { APP_VERSION } from '@server/config/env';
import type { ScopeData } from '@server/services/recompute/analyzer';
import { acceptedExtracts } from '@server/services/recompute/accepted-extracts';
import { engineAnalyzer } from '@server/services/recompute/engine-analyzer';
import type { LoadedCohorts } from '@server/services/recompute/recompute-deps';
import { planScopes, type CohortInput } from '@server/services/recompute/scope-plan';
import { sliceScope } from '@server/services/recompute/slice-scope';
import type { ProvenanceDto } from '@shared/api/results';
import type { DesignSettings } from '@shared/schemas/design';

/** One applicant as a test or benchmark hands it over (outcomes and covariates by key; NaN when missing). */
export interface ApplicantRow {
  score: number;
  takeUp: number;
  outcomes: Record<string, number>;
  covariates: Record<string, number>;
}

export interface CohortRows {
  period: string;
  cutoff: number;
  rows: ApplicantRow[];
}

/**
 * Computes and stores a design version's results for the given cohorts the way a recompute run
 * does: the same scope plan, the app's own analyzer (`engineAnalyzer`: the estimation engine and
 * the diagnostics it runs), and the same rows in `estimate_result` and `estimate_result_detail`.
 * For tests and benchmarks that need many cohorts or outcomes without loading extracts; nothing is
 * made up: every figure is the analyzer's. A cohort with an accepted extract is stamped with it;
 * otherwise the extract id is a position past the real ones and the SHA-256 is of the rows.
 */
export async function storeAnalyzedResults(
  ds: DataSource,
  input: { programId: number; designId: number; designVersionId: number; designVersion: number; settings: DesignSettings; cohorts: readonly CohortRows[] },
): Promise<{ runId: number; written: number }> {
  const program = await ds.getRepository(Program).findOneByOrFail({ id: input.programId });
  const now = new Date();
  const run = await ds.getRepository(RecomputeRun).save(
    ds.getRepository(RecomputeRun).create({
      programId: input.programId,
      queuedProgramId: null,
      designId: input.designId,
      trigger: 'on-demand',
      requestedByUserId: null,
      requestedByLabel: 'Test set-up',
      status: 'succeeded',
      attempts: 1,
      maxAttempts: 3,
      nextAttemptAt: now,
      startedAt: now,
      finishedAt: now,
      durationMs: 0,
      progressDone: 0,
      progressTotal: 0,
      progressCurrent: null,
      resultsWritten: 0,
      errorCode: null,
      errorMessage: null,
    }),
  );
  const extracts = new Map((await acceptedExtracts(ds.manager, input.programId)).map((e) => [e.period, e]));
  const { loaded, cohorts } = toLoadedCohorts(input.cohorts, input.settings, extracts);
  const basis = { designVersionId: input.designVersionId, settings: input.settings, eligibleSide: program.eligibleSide, engineVersion: engineAnalyzer.engineVersion, diagnosticsVersion: engineAnalyzer.diagnosticsVersion };
  let written = 0;
  for (const plan of planScopes(cohorts, basis)) {
    const data = sliceScope(loaded, plan.scope.periods.map((p) => p.period));
    const outcomes = engineAnalyzer.analyze({ scope: plan, data, settings: input.settings, eligibleSide: program.eligibleSide });
    const provenance: ProvenanceDto = {
      runId: run.id,
      computedAt: now.toISOString(),
      designId: input.designId,
      designVersion: input.designVersion,
      designVersionId: input.designVersionId,
      engineVersion: engineAnalyzer.engineVersion,
      diagnosticsVersion: engineAnalyzer.diagnosticsVersion,
      appVersion: APP_VERSION,
      extracts: plan.cohorts.map((c) => ({ period: c.period, extractId: c.extractId, sha256: c.sha256 })),
    };
    for (const r of outcomes) {
      const saved = await ds.getRepository(EstimateResult).insert({
        programId: input.programId,
        designId: input.designId,
        designVersionId: input.designVersionId,
        designVersion: input.designVersion,
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
        computedAt: now,
        stale: false,
        staleReason: null,
        preRegistered: false,
      });
      const resultId = Number((saved.identifiers[0] as { id: number }).id);
      await ds.getRepository(EstimateResultDetail).save(ds.getRepository(EstimateResultDetail).create({ resultId, diagnostics: r.diagnostics, bins: r.bins }));
      written++;
    }
  }
  await ds.getRepository(RecomputeRun).update({ id: run.id }, { resultsWritten: written });
  return { runId: run.id, written };
}

/** The cohorts end to end in one set of arrays, scores centred on each cohort's cutoff (as the recompute loads them). */
function toLoadedCohorts(input: readonly CohortRows[], settings: DesignSettings, extracts: ReadonlyMap<string, { extractId: number; sha256: string }>): { loaded: LoadedCohorts; cohorts: CohortInput[] } {
  const firstFreeId = Math.max(0, ...[...extracts.values()].map((e) => e.extractId)) + 1;
  const n = input.reduce((s, c) => s + c.rows.length, 0);
  const column = () => new Float64Array(n);
  const covariateKeys = [...new Set(input.flatMap((c) => c.rows.flatMap((r) => Object.keys(r.covariates))))];
  const data: ScopeData = {
    n,
    centred: column(),
    cutoffOf: column(),
    takeUp: column(),
    outcomes: Object.fromEntries(settings.outcomes.map((k) => [k, column()])),
    covariates: Object.fromEntries(covariateKeys.map((k) => [k, column()])),
    cluster: null,
  };
  const segments: LoadedCohorts['segments'] = [];
  const cohorts: CohortInput[] = [];
  let at = 0;
  for (const [i, c] of input.entries()) {
    segments.push({ period: c.period, offset: at, length: c.rows.length });
    const hash = createHash('sha256');
    for (const row of c.rows) {
      data.centred[at] = row.score - c.cutoff;
      data.cutoffOf[at] = c.cutoff;
      data.takeUp![at] = row.takeUp;
      for (const k of settings.outcomes) data.outcomes[k]![at] = row.outcomes[k] ?? Number.NaN;
      for (const k of covariateKeys) data.covariates[k]![at] = row.covariates[k] ?? Number.NaN;
      hash.update(`${row.score},${row.takeUp},${JSON.stringify(row.outcomes)}\n`);
      at++;
    }
    const real = extracts.get(c.period);
    const sha256 = hash.digest('hex');
    cohorts.push({ extractId: real?.extractId ?? firstFreeId + i, period: c.period, sha256: real?.sha256 ?? sha256, acceptedAt: new Date(), rows: c.rows.length, cutoff: c.cutoff });
  }
  return { loaded: { data, segments }, cohorts };
}

import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { EstimateResult } from '@server/entities/estimate-result.entity';
import { EstimateResultDetail } from '@server/entities/estimate-result-detail.entity';
import { Program } from '@server/entities/program.entity';
import { RecomputeRun } from '@server/entities/recompute-run.entity';
import { createDesign } from '@server/services/designs.service';
import type { ScopeData } from '@server/services/recompute/analyzer';
import { engineAnalyzer } from '@server/services/recompute/engine-analyzer';
import { planScopes, type CohortInput } from '@server/services/recompute/scope-plan';
import { sliceScope } from '@server/services/recompute/slice-scope';
import type { LoadedCohorts } from '@server/services/recompute/recompute-deps';
import type { ProvenanceDto } from '@shared/api/results';
import { DEMO_COVARIATES, DEMO_OUTCOMES, demoPeriods, generateDemoCohort } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';

/**
 * Results of the demo scenario computed by the app's own analyzer (the estimation engine, the
 * diagnostics and the caveat rules) over the demo's 24 generated cohorts, written as the recompute
 * writes them. For screens, browser tests and the API benchmark, so they do not depend on the
 * extract path; the figures are the analyzer's, nothing is made up here.
 * The extract ids in the provenance are positions (1…24), not rows of an extract table.
 */
export async function installDemoResults(ds: DataSource, programId: number): Promise<{ designId: number; runId: number; periods: string[] }> {
  const program = await ds.getRepository(Program).findOneByOrFail({ id: programId });
  const design = await createDesign(ds, programId, { userId: null, label: 'Demo analyst' }, {
    name: 'Main analysis plan',
    settings: defaultDesignSettings(DEMO_OUTCOMES.map((o) => o.key), DEMO_COVARIATES.map((c) => c.key)),
    primary: true,
  });
  const version = design.currentVersion;
  const now = new Date();
  const runRepo = ds.getRepository(RecomputeRun);
  const run = await runRepo.save(
    runRepo.create({
      programId,
      queuedProgramId: null,
      designId: design.id,
      trigger: 'on-demand',
      requestedByUserId: null,
      requestedByLabel: 'Demo analyst',
      status: 'succeeded',
      attempts: 1,
      maxAttempts: 3,
      nextAttemptAt: now,
      requestedAt: now,
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

  const { loaded, cohorts } = demoCohorts();
  const labels = { population: program.populationLabel, covariates: Object.fromEntries(DEMO_COVARIATES.map((c) => [c.key, c.label.toLowerCase()])) };
  const planned = planScopes(cohorts, {
    designVersionId: version.id,
    settings: version.settings,
    eligibleSide: program.eligibleSide,
    engineVersion: engineAnalyzer.engineVersion,
    diagnosticsVersion: engineAnalyzer.diagnosticsVersion,
  });
  let written = 0;
  for (const plan of planned) {
    const data = sliceScope(loaded, plan.scope.periods.map((p) => p.period));
    const outcomes = engineAnalyzer.analyze({ scope: plan, data, settings: version.settings, eligibleSide: program.eligibleSide, labels });
    const provenance: ProvenanceDto = {
      runId: run.id,
      computedAt: now.toISOString(),
      designId: design.id,
      designVersion: version.version,
      designVersionId: version.id,
      engineVersion: engineAnalyzer.engineVersion,
      diagnosticsVersion: engineAnalyzer.diagnosticsVersion,
      appVersion: 'demo-results',
      extracts: plan.cohorts.map((c) => ({ period: c.period, extractId: c.extractId, sha256: c.sha256 })),
    };
    for (const r of outcomes) {
      const saved = await ds.getRepository(EstimateResult).insert({
        programId,
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
        computedAt: now,
        stale: false,
        staleReason: null,
        preRegistered: false,
      });
      const resultId = Number((saved.identifiers[0] as { id: number }).id);
      const details = ds.getRepository(EstimateResultDetail);
      await details.save(details.create({ resultId, diagnostics: r.diagnostics, bins: r.bins }));
      written++;
    }
  }
  await runRepo.update({ id: run.id }, { progressDone: planned.length, progressTotal: planned.length, resultsWritten: written });
  return { designId: design.id, runId: run.id, periods: cohorts.map((c) => c.period) };
}

/** The 24 demo cohorts end to end in one set of arrays, scores centred on each cohort's cutoff. */
function demoCohorts(): { loaded: LoadedCohorts; cohorts: CohortInput[] } {
  const generated = demoPeriods().map((p) => generateDemoCohort(p));
  const n = generated.reduce((s, c) => s + c.households.length, 0);
  const col = () => new Float64Array(n);
  const data: ScopeData = {
    n,
    centred: col(),
    cutoffOf: col(),
    takeUp: col(),
    outcomes: Object.fromEntries(DEMO_OUTCOMES.map((o) => [o.key, col()])),
    covariates: Object.fromEntries(DEMO_COVARIATES.map((c) => [c.key, col()])),
    cluster: null,
  };
  const segments: LoadedCohorts['segments'] = [];
  const cohorts: CohortInput[] = [];
  let at = 0;
  for (const [i, c] of generated.entries()) {
    segments.push({ period: c.period, offset: at, length: c.households.length });
    const hash = createHash('sha256');
    for (const h of c.households) {
      data.centred[at] = h.score - c.cutoff;
      data.cutoffOf[at] = c.cutoff;
      data.takeUp![at] = h.takeUp;
      data.outcomes.shutoff_6m![at] = h.shutoff_6m;
      data.outcomes.arrears_months![at] = h.arrears_months;
      data.covariates.household_size![at] = h.household_size;
      data.covariates.prior_arrears![at] = h.prior_arrears;
      hash.update(`${h.caseNumber},${h.score},${h.takeUp}\n`);
      at++;
    }
    cohorts.push({ extractId: i + 1, period: c.period, sha256: hash.digest('hex'), acceptedAt: new Date(), rows: c.households.length, cutoff: c.cutoff });
  }
  return { loaded: { data, segments }, cohorts };
}

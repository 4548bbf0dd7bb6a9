import { applyCaveats } from '../caveats/apply-caveats';
import type { CheckNotRun, EstimateSummary } from '../caveats/types';
import { estimateDiscontinuity, isEstimationError, type DiscontinuityEstimate } from '../estimation';
import { covariateBalance } from './balance';
import { binnedMeans } from './bins';
import { centredScore } from './centred-score';
import { fittedLines } from './chart-fit';
import { localPolynomialDensityTest } from './density-local-polynomial';
import { mccraryTest } from './density-mccrary';
import { densityPlot } from './density-plot';
import { donutEstimates, donutRadii } from './donut';
import { isDiagnosticError } from './errors';
import { scoreHeaping } from './heaping';
import { localRandomization, newLocalRandomizationShare } from './local-randomization';
import { createDiagnosticsMemo, remember, type DiagnosticsMemo } from './memo';
import { placeboCutoffs } from './placebo';
import { localLinearDesignEffect, minimumDetectableEffect, sampleForEffect } from './power';
import { bandwidthSensitivity } from './sensitivity';
import type { ChartSeries, DiagnosticsData, DiagnosticsOptions, DiagnosticsReport, PowerDiagnostics } from './types';
import { weakFirstStage } from './weak-first-stage';

/**
 * Every diagnostic of one analysis, and the caveats they imply, as one JSON-serialisable object
 * (`DiagnosticsReport`). The estimator is the engine's (`estimateDiscontinuity`), called for the
 * main estimate and again for balance, placebo cutoffs, bandwidth sensitivity and donuts; the
 * density tests, heaping, bins, local randomization and power need no estimator.
 *
 * A diagnostic the data do not allow (too few observations, no variation, …) is null or empty and
 * named in a `check_not_run` caveat, so one failure never hides the rest. Argument mistakes
 * (wrong types, bad options) throw as in the engine.
 *
 * `memo` (optional) shares the outcome-independent work between calls on the same applicants
 * (`createDiagnosticsMemo`, one per scope); results are the same with or without it.
 *
 * @example runDiagnostics({ score, outcome, takeUp, covariates: [{ name: 'household_size', values }] }, { cutoff: 60, eligibleSide: 'at-or-above', population: 'households' })
 */
export function runDiagnostics(data: DiagnosticsData, options: DiagnosticsOptions, scopeMemo?: DiagnosticsMemo): DiagnosticsReport {
  // Without a scope's memo, one for this call still spares the charts re-sorting the same scores.
  const memo = scopeMemo ?? createDiagnosticsMemo();
  const notRun: CheckNotRun[] = [];
  const attempt = <T>(check: string, run: () => T): T | null => {
    try {
      return run();
    } catch (error) {
      if (isDiagnosticError(error) || isEstimationError(error)) {
        notRun.push({ check, code: error.code, reason: error.message });
        return null;
      }
      throw error;
    }
  };
  const { population = 'applicants', outcomesTested = 1, targetEffect, permutations, start, centredFrom, ...estimation } = options;
  const placement = { cutoff: estimation.cutoff, eligibleSide: estimation.eligibleSide };
  const engineData = { score: data.score, outcome: data.outcome, ...(data.takeUp ? { takeUp: data.takeUp } : {}), ...(data.cluster ? { cluster: data.cluster } : {}) };
  const covariates = data.covariates ?? [];

  const main = attempt('main estimate', () => estimateDiscontinuity(engineData, estimation));
  const t = remember(memo, 'centred score', [data.score, estimation.cutoff, estimation.eligibleSide], () => centredScore(data.score, estimation.cutoff, estimation.eligibleSide));
  const covariateArrays = covariates.flatMap((c) => [c.name, c.label, c.values]);

  const window = main?.bandwidth.h ?? spread(data.score) / 4;
  // "Round" means round in the agency's units, so one cohort's distances are turned back into scores.
  const agencyScore = typeof centredFrom === 'number' ? remember(memo, 'agency score', [data.score, centredFrom], () => data.score.map((x) => x + centredFrom)) : data.score;
  const heaping = attempt('score heaping check', () => scoreHeaping(agencyScore, estimation.cutoff + (typeof centredFrom === 'number' ? centredFrom : 0), estimation.eligibleSide, window));
  const gridStep = heaping?.step ?? 0;
  const density = attempt('score density check', () =>
    remember(memo, 'density', [t, gridStep], () => {
      const mccrary = mccraryTest(t, undefined, gridStep);
      return { mccrary, localPolynomial: localPolynomialDensityTest(t, mccrary.h), plot: densityPlot(t, mccrary.h, placement, gridStep) };
    }),
  );

  const balance =
    covariates.length > 0
      ? remember(memo, 'balance', [data.score, data.cluster, JSON.stringify(estimation), ...covariateArrays], () => covariateBalance(data.score, covariates, estimation, data.cluster))
      : { rows: [], failures: [] };
  for (const f of balance.failures) {
    if (isEstimationError(f.error)) notRun.push({ check: `balance check of ${covariates.find((c) => c.name === f.covariate)?.label ?? f.covariate}`, code: f.error.code, reason: f.error.message });
    else throw f.error;
  }
  const placebo = placeboCutoffs(engineData, estimation);
  const sensitivity = main ? bandwidthSensitivity(engineData, estimation, main) : [];
  const donut = main ? donutEstimates(engineData, estimation, donutRadii(heaping?.step ?? null, main.bandwidth.h)) : [];

  const localRandom = attempt('local-randomization comparison', () =>
    localRandomization(
      { t, outcome: data.outcome, ...(data.takeUp ? { takeUp: data.takeUp } : {}), covariates: covariates.map((c) => c.values) },
      {
        ...(main ? { maxWindow: main.bandwidth.h } : {}),
        ...(permutations ? { permutations } : {}),
        ...(start !== undefined ? { start } : {}),
        level: main?.options.level ?? 0.95,
        share: remember(memo, 'local randomization', [t, permutations, start, ...covariateArrays], newLocalRandomizationShare),
      },
    ),
  );
  const chart = (values: Float64Array): ChartSeries => ({
    evenlySpaced: binnedMeans(t, values, 'evenly-spaced', placement, undefined, memo),
    quantileSpaced: binnedMeans(t, values, 'quantile-spaced', placement, undefined, memo),
    fit: main ? fittedLines(data.score, values, main) : { ineligible: [], eligible: [] },
  });
  const bins = attempt('chart of binned means', () => ({ outcome: chart(data.outcome), takeUp: data.takeUp ? chart(data.takeUp) : null }));
  const power = main ? attempt('power calculation', () => powerFor(t, data.outcome, main, targetEffect)) : null;

  const findings: Omit<DiagnosticsReport, 'caveats'> = {
    density,
    heaping,
    balance: balance.rows,
    placebo,
    sensitivity,
    donut,
    weakFirstStage: main ? weakFirstStage(main) : null,
    localRandomization: localRandom,
    bins,
    power,
  };
  const caveats = applyCaveats({
    design: data.takeUp ? 'fuzzy' : 'sharp',
    cutoff: estimation.cutoff,
    ...(centredFrom !== undefined ? { centredFrom } : {}),
    eligibleSide: estimation.eligibleSide,
    population,
    outcomesTested,
    covariateLabels: Object.fromEntries(covariates.map((c) => [c.name, c.label ?? c.name])),
    estimate: main ? summarise(main) : null,
    findings,
    notRun,
  });
  return { ...findings, caveats };
}

function summarise(main: DiscontinuityEstimate): EstimateSummary {
  return {
    itt: main.itt.jump,
    effect: main.effect.estimate,
    effectCiLow: main.effect.robust.ciLow,
    effectCiHigh: main.effect.robust.ciHigh,
    effectP: main.effect.robust.p,
    firstStage: main.firstStage?.jump ?? null,
  };
}

/**
 * Power for the next cohorts of the same size: n and the eligible share inside the main bandwidth,
 * the outcome's pooled within-side standard deviation there, the estimated take-up jump, and the
 * kernel's local-linear design effect.
 */
function powerFor(t: Float64Array, outcome: Float64Array, main: DiscontinuityEstimate, targetEffect: number | undefined): PowerDiagnostics {
  const h = main.bandwidth.h;
  const sums = [
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (let i = 0; i < t.length; i++) {
    if (Math.abs(t[i]!) > h) continue;
    const s = sums[t[i]! >= 0 ? 1 : 0]!;
    s[0]! += 1;
    s[1]! += outcome[i]!;
    s[2]! += outcome[i]! ** 2;
  }
  const [n0, y0, yy0] = sums[0]! as [number, number, number];
  const [n1, y1, yy1] = sums[1]! as [number, number, number];
  const within = yy0 - (y0 * y0) / n0 + (yy1 - (y1 * y1) / n1);
  const outcomeSd = Math.sqrt(Math.max(0, within / Math.max(1, n0 + n1 - 2)));
  const kernel = main.options.kernel;
  const input = {
    eligibleShare: n1 / (n0 + n1),
    outcomeSd,
    designEffect: localLinearDesignEffect(kernel),
    takeUpJump: main.firstStage ? main.firstStage.jump : null,
  };
  return {
    ...minimumDetectableEffect({ ...input, n: n0 + n1 }),
    designEffectBasis: `local-linear boundary variance constant of the ${kernel} kernel (METHODS §3a), conventional variance`,
    kernel,
    targetEffect: targetEffect ?? null,
    nForTarget: targetEffect === undefined ? null : Math.ceil(sampleForEffect(input, targetEffect)),
  };
}

function spread(score: Float64Array): number {
  let min = Infinity;
  let max = -Infinity;
  for (const v of score) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return max > min ? max - min : 1;
}

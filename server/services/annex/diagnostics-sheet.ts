import type { AnnexContent, AnnexResult, StoredDiagnostics } from './annex-content';
import { NUMBER_FORMATS as F, SheetBuilder, type ColumnSpec } from './sheet-model';

/** A diagnostic row with the result it belongs to. */
interface Row<T> {
  r: AnnexResult;
  d: T;
}

const scopeColumns = <T>(): Array<ColumnSpec<Row<T>>> => [
  { header: 'Scope', value: (x) => x.r.result.scope.key },
  { header: 'Outcome', value: (x) => x.r.result.outcome.key },
];

/**
 * Diagnostics: one block per check, each a table over every cohort and outcome that has stored
 * diagnostics (`StoredDiagnostics`, `shared/diagnostics/types.ts`), pooled windows included.
 * Score positions are measured from each cohort's cutoff (score − cutoff), as the recompute
 * analyses them. Estimates are the engine's conventional ones with robust bias-corrected intervals
 * and p, unless a header says otherwise. A check the data did not allow is absent here and named in a `check_not_run` caveat.
 */
export function diagnosticsSheet(content: AnnexContent): SheetBuilder {
  const sheet = new SheetBuilder('Diagnostics');
  const withReport = content.results.filter((r): r is AnnexResult & { diagnostics: StoredDiagnostics } => r.diagnostics !== null);
  sheet.title('Diagnostics');
  sheet.note('Score positions are measured from each cohort’s own cutoff (score − cutoff), in pooled windows too. Intervals are robust bias-corrected and p-values robust unless a header says otherwise.');
  sheet.note('A check the data did not allow is absent and named on the Caveats sheet (code check_not_run).');
  if (withReport.length === 0) {
    sheet.blank().note('No diagnostics are stored for these results yet.');
    return sheet;
  }
  const rows = <T>(pick: (d: StoredDiagnostics) => T | null | undefined): Array<Row<T>> =>
    withReport.flatMap((r) => {
      const d = pick(r.diagnostics);
      return d === null || d === undefined ? [] : [{ r, d }];
    });
  const many = <T>(pick: (d: StoredDiagnostics) => readonly T[] | null | undefined): Array<Row<T>> =>
    withReport.flatMap((r) => (pick(r.diagnostics) ?? []).map((d) => ({ r, d })));
  const block = <T>(title: string, columns: Array<ColumnSpec<Row<T>>>, items: Array<Row<T>>) => {
    sheet.blank().heading(title);
    if (items.length === 0) sheet.note('Not available for these results.');
    else sheet.table([...scopeColumns<T>(), ...columns], items);
  };

  block(
    'Score density at the cutoff: McCrary (2008) and a local-polynomial test (in the spirit of Cattaneo, Jansson & Ma 2020)',
    [
      { header: 'McCrary log difference θ', value: (x) => x.d.mccrary.theta, numFmt: F.estimate },
      { header: 'θ SE', value: (x) => x.d.mccrary.se, numFmt: F.estimate },
      { header: 'z', value: (x) => x.d.mccrary.z, numFmt: F.statistic },
      { header: 'p', value: (x) => x.d.mccrary.p, numFmt: F.p },
      { header: 'Density ineligible side', value: (x) => x.d.mccrary.densityIneligible, numFmt: F.estimate },
      { header: 'Density eligible side', value: (x) => x.d.mccrary.densityEligible, numFmt: F.estimate },
      { header: 'Bin width (score)', value: (x) => x.d.mccrary.binWidth, numFmt: F.score },
      { header: 'Smoothing h (score)', value: (x) => x.d.mccrary.h, numFmt: F.score },
      { header: 'Local-polynomial statistic', value: (x) => x.d.localPolynomial.statistic, numFmt: F.statistic },
      { header: 'Local-polynomial p', value: (x) => x.d.localPolynomial.p, numFmt: F.p },
      { header: 'LP density ineligible', value: (x) => x.d.localPolynomial.densityIneligible, numFmt: F.estimate },
      { header: 'LP density eligible', value: (x) => x.d.localPolynomial.densityEligible, numFmt: F.estimate },
      { header: 'LP h (score)', value: (x) => x.d.localPolynomial.h, numFmt: F.score },
      { header: 'LP n ineligible', value: (x) => x.d.localPolynomial.usedIneligible, numFmt: F.count },
      { header: 'LP n eligible', value: (x) => x.d.localPolynomial.usedEligible, numFmt: F.count },
    ],
    rows((d) => d.density),
  );

  block(
    'Score heaping (common practice, no source for the thresholds; Kolesár & Rothe 2018 on discrete scores)',
    [
      { header: 'Distinct scores', value: (x) => x.d.distinctValues, numFmt: F.count },
      { header: 'Grid step (score)', value: (x) => x.d.step, numFmt: F.score },
      { header: 'Distinct near cutoff, ineligible', value: (x) => x.d.distinctNearCutoff.ineligible, numFmt: F.count },
      { header: 'Distinct near cutoff, eligible', value: (x) => x.d.distinctNearCutoff.eligible, numFmt: F.count },
      { header: 'Window (score)', value: (x) => x.d.window, numFmt: F.score },
      { header: 'Discrete near cutoff', value: (x) => x.d.discrete },
      { header: 'At the cutoff: count', value: (x) => x.d.atCutoff?.count, numFmt: F.count },
      { header: 'Neighbours’ mean count', value: (x) => x.d.atCutoff?.neighbourMean, numFmt: F.statistic },
      { header: 'Ratio', value: (x) => x.d.atCutoff?.ratio, numFmt: F.statistic },
      { header: 'p (one-sided)', value: (x) => x.d.atCutoff?.p, numFmt: F.p },
    ],
    rows((d) => d.heaping),
  );

  block(
    'Heaping on round numbers',
    [
      { header: 'Round number (score)', value: (x) => x.d.base, numFmt: F.score },
      { header: 'Share on multiples', value: (x) => x.d.share, numFmt: F.share },
      { header: 'Count', value: (x) => x.d.count, numFmt: F.count },
      { header: 'Expected from neighbours', value: (x) => x.d.expected, numFmt: F.statistic },
      { header: 'Ratio', value: (x) => x.d.ratio, numFmt: F.statistic },
      { header: 'p (one-sided)', value: (x) => x.d.p, numFmt: F.p },
    ],
    many((d) => d.heaping?.roundValues),
  );

  block(
    'Covariate balance: each pre-determined covariate as the outcome (Lee & Lemieux 2010; Holm adjustment)',
    [
      { header: 'Covariate', value: (x) => x.d.covariate },
      { header: 'Jump', value: (x) => x.d.jump, numFmt: F.estimate },
      { header: 'CI low', value: (x) => x.d.ciLow, numFmt: F.estimate },
      { header: 'CI high', value: (x) => x.d.ciHigh, numFmt: F.estimate },
      { header: 'Robust t', value: (x) => x.d.t, numFmt: F.statistic },
      { header: 'p', value: (x) => x.d.p, numFmt: F.p },
      { header: 'Holm-adjusted p', value: (x) => x.d.pAdjusted, numFmt: F.p },
      { header: 'h (score)', value: (x) => x.d.h, numFmt: F.score },
    ],
    many((d) => d.balance),
  );

  block(
    'Placebo cutoffs: jumps at false cutoffs, one side’s data only (Imbens & Lemieux 2008)',
    [
      { header: 'False cutoff (score − cutoff)', value: (x) => x.d.cutoff, numFmt: F.score },
      { header: 'Side', value: (x) => x.d.side },
      { header: 'Jump', value: (x) => x.d.estimate, numFmt: F.estimate },
      { header: 'CI low', value: (x) => x.d.ciLow, numFmt: F.estimate },
      { header: 'CI high', value: (x) => x.d.ciHigh, numFmt: F.estimate },
      { header: 'p', value: (x) => x.d.p, numFmt: F.p },
      { header: 'Holm-adjusted p', value: (x) => x.d.pAdjusted, numFmt: F.p },
      { header: 'h (score)', value: (x) => x.d.h, numFmt: F.score },
    ],
    many((d) => d.placebo),
  );

  block(
    'Bandwidth sensitivity grid (multiples of the main h; coverage-error-optimal row: Calonico, Cattaneo & Farrell)',
    [
      { header: 'h (score)', value: (x) => x.d.h, numFmt: F.score },
      { header: 'Multiple of main h', value: (x) => x.d.multiple, numFmt: F.statistic },
      { header: 'Rule', value: (x) => x.d.rule },
      { header: 'Estimate', value: (x) => x.d.estimate, numFmt: F.estimate },
      { header: 'CI low', value: (x) => x.d.ciLow, numFmt: F.estimate },
      { header: 'CI high', value: (x) => x.d.ciHigh, numFmt: F.estimate },
      { header: 'p', value: (x) => x.d.p, numFmt: F.p },
    ],
    many((d) => d.sensitivity),
  );

  block(
    'Donut grid: scores nearest the cutoff left out',
    [
      { header: 'Radius (score)', value: (x) => x.d.radius, numFmt: F.score },
      { header: 'Left out', value: (x) => x.d.dropped, numFmt: F.count },
      { header: 'Estimate', value: (x) => x.d.estimate, numFmt: F.estimate },
      { header: 'CI low', value: (x) => x.d.ciLow, numFmt: F.estimate },
      { header: 'CI high', value: (x) => x.d.ciHigh, numFmt: F.estimate },
      { header: 'p', value: (x) => x.d.p, numFmt: F.p },
      { header: 'h (score)', value: (x) => x.d.h, numFmt: F.score },
    ],
    many((d) => d.donut),
  );

  block(
    'Weak take-up jump: F, tF interval (Lee, McCrary, Moreira & Porter 2022) and Anderson–Rubin set',
    [
      { header: 'First-stage F', value: (x) => x.d.f, numFmt: F.statistic },
      { header: 'Take-up jump', value: (x) => x.d.firstStage, numFmt: F.estimate },
      { header: 'F below 10 (Staiger–Stock)', value: (x) => x.d.belowRuleOfThumb },
      { header: 'F below 16.38 (Stock–Yogo, from memory)', value: (x) => x.d.belowStockYogo },
      { header: 'tF critical value', value: (x) => x.d.tfCritical, numFmt: F.statistic },
      { header: 'tF factor (× 1.96)', value: (x) => x.d.tfFactor, numFmt: F.statistic },
      { header: 'tF basis', value: (x) => x.d.tfBasis },
      { header: 'tF CI low (empty: unbounded)', value: (x) => x.d.tfCiLow, numFmt: F.estimate },
      { header: 'tF CI high (empty: unbounded)', value: (x) => x.d.tfCiHigh, numFmt: F.estimate },
      { header: 'Anderson–Rubin set shape', value: (x) => x.d.arShape },
      { header: 'AR low', value: (x) => x.d.arCiLow, numFmt: F.estimate },
      { header: 'AR high', value: (x) => x.d.arCiHigh, numFmt: F.estimate },
    ],
    rows((d) => d.weakFirstStage),
  );

  block(
    'Local randomization: permutation inference in a window (Cattaneo, Frandsen & Titiunik 2015)',
    [
      { header: 'Window rule', value: (x) => x.d.windowRule },
      { header: 'Half-window (score)', value: (x) => x.d.window, numFmt: F.score },
      { header: 'n ineligible', value: (x) => x.d.nIneligible, numFmt: F.count },
      { header: 'n eligible', value: (x) => x.d.nEligible, numFmt: F.count },
      { header: 'Difference in means (ITT)', value: (x) => x.d.itt, numFmt: F.estimate },
      { header: 'Permutation p', value: (x) => x.d.ittP, numFmt: F.p },
      { header: 'Take-up difference', value: (x) => x.d.firstStage, numFmt: F.estimate },
      { header: 'Effect (Wald ratio)', value: (x) => x.d.effect, numFmt: F.estimate },
      { header: 'CI low (empty: unbounded)', value: (x) => x.d.ciLow, numFmt: F.estimate },
      { header: 'CI high (empty: unbounded)', value: (x) => x.d.ciHigh, numFmt: F.estimate },
      { header: 'Permutations', value: (x) => x.d.permutations, numFmt: F.count },
      { header: 'Exact', value: (x) => x.d.exact },
    ],
    rows((d) => d.localRandomization),
  );

  block(
    'Power and minimum detectable effect (Schochet 2008; design effect of the local-linear fit)',
    [
      { header: 'Size α', value: (x) => x.d.alpha, numFmt: F.p },
      { header: 'Power', value: (x) => x.d.power, numFmt: F.level },
      { header: 'Multiplier M', value: (x) => x.d.multiplier, numFmt: F.statistic },
      { header: 'Design effect', value: (x) => x.d.designEffect, numFmt: F.statistic },
      { header: 'Design effect basis', value: (x) => x.d.designEffectBasis },
      { header: 'n inside h', value: (x) => x.d.n, numFmt: F.count },
      { header: 'Eligible share', value: (x) => x.d.eligibleShare, numFmt: F.share },
      { header: 'Outcome SD', value: (x) => x.d.outcomeSd, numFmt: F.estimate },
      { header: 'Take-up jump', value: (x) => x.d.takeUpJump, numFmt: F.estimate },
      { header: 'SE of ITT', value: (x) => x.d.seItt, numFmt: F.estimate },
      { header: 'MDE of ITT', value: (x) => x.d.mdeItt, numFmt: F.estimate },
      { header: 'MDE of complier effect', value: (x) => x.d.mdeEffect, numFmt: F.estimate },
      { header: 'Target effect', value: (x) => x.d.targetEffect, numFmt: F.estimate },
      { header: 'n for target', value: (x) => x.d.nForTarget, numFmt: F.count },
    ],
    rows((d) => d.power),
  );
  return sheet;
}

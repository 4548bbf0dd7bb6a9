import type { AnnexContent } from './annex-content';
import { reproduceCommand } from './reproduce-command';
import { PROSE_COLUMN_WIDTH, SheetBuilder } from './sheet-model';

/** The method in plain words, section by section (sources named in each paragraph and listed at the end). */
const SECTIONS: ReadonlyArray<readonly [string, readonly string[]]> = [
  [
    'The design',
    [
      'Applicants are scored, and those on one side of a cutoff qualify. Applicants just either side of the cutoff are alike in everything but eligibility, so comparing them is a natural experiment: a regression discontinuity (Imbens & Lemieux 2008; Lee & Lemieux 2010).',
      'Not everyone who qualifies takes part, and some who do not qualify take part anyway, so the design is fuzzy. Three jumps at the cutoff are estimated, each as the eligible side’s limit minus the ineligible side’s: the take-up jump (first stage), the jump in the outcome (ITT, the effect of being eligible), and their ratio, the complier effect: the effect of taking part for those who take part because they qualify (Hahn, Todd & van der Klaauw 2001; Imbens & Angrist 1994). A score exactly at the cutoff counts as eligible.',
    ],
  ],
  [
    'The estimator',
    [
      'On each side of the cutoff, separately, a straight line (order p = 1) or a parabola (p = 2) is fitted by weighted least squares to the applicants within a bandwidth h of the cutoff; the kernel gives applicants nearer the cutoff more weight (triangular: weight 1 − |distance|/h). The fitted value at the cutoff is that side’s limit. Take-up and the outcome use the same h and kernel, so the ratio equals a weighted two-stage least squares estimate with eligibility as the instrument (Imbens & Lemieux 2008, §4.3).',
      'The bandwidth is chosen from the data to make the point estimate’s mean squared error small (rule mse: Calonico, Cattaneo & Titiunik 2014; mse-per-side: one h a side; ik: Imbens & Kalyanaraman 2012; coverage: the MSE bandwidth shrunk for intervals, Calonico, Cattaneo & Farrell 2020), or fixed by the design. The bias bandwidth b is used to estimate and remove the leading bias.',
    ],
  ],
  [
    'Inference',
    [
      'Conventional columns give the estimate at h with its standard error and interval. At an MSE-optimal h those intervals are too narrow because the fit’s bias is of the same order as its noise. The robust bias-corrected columns subtract an estimate of that bias (from a fit of order p + 1 at bandwidth b) and widen the standard error to include the correction’s own noise (Calonico, Cattaneo & Titiunik 2014). Cutline’s headline figures are the conventional point estimate with the robust interval.',
      'Standard errors come from the design’s variance estimator: nearest-neighbour residuals (3 neighbours, the same side), or the sandwich forms HC0–HC3 (MacKinnon & White 1985), cluster-robust when the design clusters. The complier effect’s variance is the delta method on the ITT and take-up jumps including their covariance. Intervals are at the design’s confidence level; p-values are two-sided against zero.',
      'The first-stage F is the squared t of the take-up jump. Below 10 (Staiger–Stock rule of thumb) the take-up jump is weak and the complier effect unreliable; even up to 104.7 the usual interval is too narrow, which the tF interval corrects (Lee, McCrary, Moreira & Porter 2022). The Anderson–Rubin set is valid at any F.',
    ],
  ],
  [
    'Pooled windows',
    [
      'A window pools the last 3, 6 or 12 cohorts (previous-3: the three before the latest, the baseline of change alerts). Each cohort’s score is measured from its own cutoff and the pooled jump is estimated at 0; it is a weighted average of the effects at the cutoffs in force, weighted by how many applicants score near each (Cattaneo, Keele, Titiunik & Vazquez-Bare 2016).',
    ],
  ],
  [
    'Diagnostics',
    [
      'Score density: a jump in how many applicants score just either side would suggest scores were moved across the cutoff (McCrary 2008; a binning-free local-polynomial test in the spirit of Cattaneo, Jansson & Ma 2020). Heaping counts piles on round numbers and at the cutoff. Balance re-estimates the jump with each pre-determined characteristic as the outcome, with Holm’s adjustment (Holm 1979). Placebo cutoffs look for jumps where there should be none, using one side’s data only. Sensitivity repeats the estimate over a grid of bandwidths; the donut leaves out the scores nearest the cutoff. Local randomization compares means in a small window by permutation (Cattaneo, Frandsen & Titiunik 2015). Power gives the smallest effect the next cohort of the same size would detect with 80% power (Schochet 2008). Binned charts use evenly and quantile-spaced bins (Calonico, Cattaneo & Titiunik 2015).',
    ],
  ],
  [
    'What the figures do not say',
    [
      'The estimates are local to the cutoff and to compliers; they describe groups and are not for judging or deciding about any individual. The agency’s evaluation standards, data-protection rules and local law prevail over anything in this workbook.',
    ],
  ],
];

const SOURCES: readonly string[] = [
  'Calonico, S., Cattaneo, M. D. & Farrell, M. H. (2020). Optimal bandwidth choice for robust bias-corrected inference in regression discontinuity designs. Econometrics Journal.',
  'Calonico, S., Cattaneo, M. D. & Titiunik, R. (2014). Robust nonparametric confidence intervals for regression-discontinuity designs. Econometrica 82(6), 2295–2326.',
  'Calonico, S., Cattaneo, M. D. & Titiunik, R. (2015). Optimal data-driven regression discontinuity plots. Journal of the American Statistical Association 110(512), 1753–1769.',
  'Cattaneo, M. D., Frandsen, B. R. & Titiunik, R. (2015). Randomization inference in the regression discontinuity design. Journal of Causal Inference 3(1), 1–24.',
  'Cattaneo, M. D., Jansson, M. & Ma, X. (2020). Simple local polynomial density estimators. Journal of the American Statistical Association.',
  'Cattaneo, M. D., Keele, L., Titiunik, R. & Vazquez-Bare, G. (2016). Interpreting regression discontinuity designs with multiple cutoffs.',
  'Hahn, J., Todd, P. & van der Klaauw, W. (2001). Identification and estimation of treatment effects with a regression-discontinuity design. Econometrica 69(1).',
  'Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics 6(2).',
  'Imbens, G. W. & Angrist, J. D. (1994). Identification and estimation of local average treatment effects. Econometrica 62(2), 467–475.',
  'Imbens, G. W. & Kalyanaraman, K. (2012). Optimal bandwidth choice for the regression discontinuity estimator. Review of Economic Studies.',
  'Imbens, G. W. & Lemieux, T. (2008). Regression discontinuity designs: a guide to practice. Journal of Econometrics 142, 615–635.',
  'Kolesár, M. & Rothe, C. (2018). Inference in regression discontinuity designs with a discrete running variable. American Economic Review.',
  'Lee, D. S. & Lemieux, T. (2010). Regression discontinuity designs in economics. Journal of Economic Literature 48, 281–355.',
  'Lee, D. S., McCrary, J., Moreira, M. J. & Porter, J. (2022). Valid t-ratio inference for IV. American Economic Review 112(10), 3260–3290.',
  'MacKinnon, J. G. & White, H. (1985). Some heteroskedasticity-consistent covariance matrix estimators with improved finite sample properties. Journal of Econometrics.',
  'McCrary, J. (2008). Manipulation of the running variable in the regression discontinuity design: a density test. Journal of Econometrics 142(2), 698–714.',
  'Schochet, P. Z. (2008). Technical methods report: statistical power for regression discontinuity designs in education evaluations (NCEE 2008-4026).',
  'Stock, J. H. & Yogo, M. (2005). Testing for weak instruments in linear IV regression.',
];

/** Where each Summary figure is in the command's JSON output. */
const OUTPUT_FIELDS: ReadonlyArray<readonly [string, string]> = [
  ['Take-up jump, SE, F', 'firstStage.jump, firstStage.se, firstStage.f'],
  ['ITT jump, SE, CI', 'itt.jump, itt.se, itt.ciLow, itt.ciHigh (robust: itt.robust.*)'],
  ['Complier effect (conventional)', 'effect.estimate, effect.se, effect.ciLow, effect.ciHigh, effect.p'],
  ['Complier effect robust bias-corrected', 'effect.robust.estimate, effect.robust.se, effect.robust.ciLow, effect.robust.ciHigh, effect.robust.p'],
  ['Bandwidths h and b, per side', 'bandwidth.h, bandwidth.b, bandwidth.sides.ineligible.h, bandwidth.sides.eligible.h'],
  ['n per side, effective n', 'n.ineligible, n.eligible, n.usedIneligible, n.usedEligible'],
];

/** Method notes: the estimator and inference in plain words, sources, and how to reproduce a figure. */
export function methodNotesSheet(content: AnnexContent): SheetBuilder {
  const sheet = new SheetBuilder('Method notes');
  sheet.printFitToWidth = true;
  sheet.wrapNotes = true;
  sheet.fixedWidths.set(0, PROSE_COLUMN_WIDTH);
  sheet.title('Method notes');
  for (const [heading, paragraphs] of SECTIONS) {
    sheet.blank().heading(heading);
    for (const p of paragraphs) sheet.note(p);
  }

  sheet.blank().heading('Reproducing a figure with the command line');
  sheet.note(
    'An evaluator granted the program downloads the de-identified rows of the cohorts behind a result (Cutline: Download de-identified data, for one cohort or a range of cohorts; the file name is the one in the command). The columns are described on the Data dictionary sheet. Then, in a copy of Cutline at the engine version on the Cover sheet, run the command in the last column of that result’s Summary row. It prints one JSON object.',
  );
  sheet.note(
    'The command carries the settings of the design version that produced the result (Cover sheet, Evaluation design): kernel, order, bandwidth rule or fixed bandwidth, variance estimator, confidence level, clusters and donut. A cohort is estimated on its score and cutoff; a pooled window on score_centred at cutoff 0, as Cutline pools cohorts. --missing skip leaves out applicants with a missing value in a column the estimate uses, as Cutline does.',
  );
  sheet.note(
    'The figures agree with the Summary to about ten significant digits rather than to the last bit: the export lists applicants in order of their values, not in the order of the uploaded file (so no row can be traced back to it), sums taken in another order round differently in their last digits, and the data-driven bandwidth carries those tiny differences into every figure. Every figure agrees to all the decimals the Summary shows.',
  );
  const example = content.results.map((r) => reproduceCommand(content.program, r)).find((c): c is string => c !== null);
  if (example) {
    sheet.blank().heading('Example (the first estimable row of the Summary)');
    sheet.note(example);
  }
  sheet.blank().heading('Where each Summary figure is in the output');
  for (const [figure, field] of OUTPUT_FIELDS) sheet.note(`${figure}: ${field}`);

  sheet.blank().heading('Sources');
  for (const s of SOURCES) sheet.note(s);
  return sheet;
}

/** The annex's sheets in order, with what each holds (listed on the Cover sheet). */
export const SHEET_PURPOSES: ReadonlyArray<readonly [string, string]> = [
  ['Cover', 'What the workbook covers, who generated it and when, every version behind the figures, the design, the extracts’ checksums and the standing cautions.'],
  ['Summary', 'One row per outcome and cohort or pooled window: take-up jump, ITT, complier effect (conventional and robust bias-corrected), bandwidths, settings, sample sizes, and the command that reproduces it.'],
  ['Diagnostics', 'Per cohort and outcome: score density tests, heaping, covariate balance, placebo cutoffs, bandwidth sensitivity, donut, weak take-up jump (tF, Anderson–Rubin), local randomization, power.'],
  ['Binned data', 'Every point and line the charts draw (plot bins, binned means, fitted lines, density histogram and curves), so each chart can be redrawn.'],
  ['Caveats', 'Every caveat with its code, severity, the figures that triggered it, the rule and the message.'],
  ['Method notes', 'The estimator and inference in plain words, with published sources, and how to reproduce a figure with the command line.'],
  ['Data dictionary', 'Each column of the de-identified export and the extract mapping it came from.'],
];

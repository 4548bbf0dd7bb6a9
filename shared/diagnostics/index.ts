/**
 * The diagnostics' public surface: `runDiagnostics` composes everything; each diagnostic is also
 * callable alone. See DEVELOPERS.md, "Diagnostics and caveats".
 */
export { runDiagnostics } from './run-diagnostics';
export { createDiagnosticsMemo, type DiagnosticsMemo } from './memo';
export { DIAGNOSTICS_VERSION } from './version';
export { DiagnosticError, DIAGNOSTIC_ERROR_CODES, isDiagnosticError, type DiagnosticErrorCode } from './errors';
export { centredScore, scoreAt } from './centred-score';
export { mccraryTest, mccraryBandwidth, mccrarySe, densityHistogram, type McCraryResult, type DensityHistogram, type DensityBin } from './density-mccrary';
export { localPolynomialDensityTest, type LocalPolynomialDensityResult } from './density-local-polynomial';
export { densityPlot } from './density-plot';
export { scoreHeaping, gridStep, FEW_DISTINCT_VALUES, type HeapingResult, type RoundValueHeaping, type CutoffHeaping, type ValueCount } from './heaping';
export { covariateBalance, countImbalanced } from './balance';
export { placeboCutoffs, PLACEBO_QUANTILES } from './placebo';
export { bandwidthSensitivity, SENSITIVITY_MULTIPLES } from './sensitivity';
export { donutEstimates, donutRadii } from './donut';
export { weakFirstStage, andersonRubin } from './weak-first-stage';
export { tfCriticalValue, tfInterval, TF_POINTS, TF_NO_ADJUSTMENT_F, TF_ASYMPTOTE_F, type TfBasis, type TfInterval, type TfPoint } from './tf-adjustment';
export { optimalBinCounts, binnedMeans, type BinCounts, type BinnedMean, type BinnedSeries, type BinSpacing, type SideBinCount } from './bins';
export { localRandomization, WINDOW_BALANCE_P, type LocalRandomizationOptions, type LocalRandomizationResult, type WindowBalance } from './local-randomization';
export { minimumDetectableEffect, sampleForEffect, powerAt, schochetDesignEffect, localLinearDesignEffect, type PowerInput, type PowerResult } from './power';
export { holmAdjust, bonferroniAdjust } from './multiple-testing';
export type * from './types';

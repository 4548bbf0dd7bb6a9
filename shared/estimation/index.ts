/**
 * The estimation engine's public surface. Callers (server, jobs, command line, diagnostics) import
 * from here; the files behind it are one concern each (see DEVELOPERS.md, "Estimation engine").
 */
export { estimateDiscontinuity, selectBandwidth } from './estimate';
export { EstimationError, ESTIMATION_ERROR_CODES, isEstimationError, type EstimationErrorCode } from './errors';
export { ENGINE_VERSION } from './version';
export { RULE_OF_THUMB_F, STOCK_YOGO_10_PERCENT_F, firstStageF, weakFirstStageFlags } from './first-stage';
export { BANDWIDTH_RULES, VARIANCE_KINDS, DEFAULT_LEVEL, DEFAULT_NEIGHBOURS } from './resolve-options';
export { KERNELS, boundaryConstants, kernelWeight, kernelCode } from './kernels';
export { fitLocalPolynomial, type FitSide, type LocalPolynomialFit } from './local-polynomial';
export { normalCdf, normalQuantile, twoSidedP } from './normal-distribution';
export { coverageShrink } from './bandwidth';
export { minimumObservationsPerSide } from './minimums';
export type * from './types';

/**
 * Fewest observations with positive weight a fit of polynomial order k needs on a side: k + 1
 * coefficients plus two residual degrees of freedom (so leverages stay below 1). An
 * identifiability floor, not a recommendation: common practice, no source.
 */
export function minimumObservationsForFit(order: number): number {
  return order + 3;
}

/**
 * Fewest observations per side an analysis of order p needs inside its bandwidths: its order
 * p + 1 bias-correction fit needs p + 4.
 */
export function minimumObservationsPerSide(order: number): number {
  return minimumObservationsForFit(order + 1);
}

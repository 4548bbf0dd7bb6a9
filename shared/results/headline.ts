import type { EstimateDto, InferenceDto } from '../api/results';

/**
 * The headline figure of an estimate: the conventional point estimate with the robust
 * bias-corrected interval, the reporting practice of Calonico, Cattaneo & Titiunik (2014).
 * @example headline({ conventional: { estimate: -0.1, … }, robust: { ciLow: -0.2, ciHigh: 0, … } }) // => { estimate: -0.1, ciLow: -0.2, ciHigh: 0, … }
 */
export function headline(e: EstimateDto | null): InferenceDto | null {
  if (!e) return null;
  return { estimate: e.conventional.estimate, se: e.robust.se, ciLow: e.robust.ciLow, ciHigh: e.robust.ciHigh, p: e.robust.p };
}

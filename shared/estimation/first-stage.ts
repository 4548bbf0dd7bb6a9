/**
 * First-stage strength thresholds for one instrument and one endogenous regressor.
 * - Staiger–Stock rule of thumb F < 10 (Staiger & Stock 1997; METHODS §6, verified in Stock &
 *   Watson's textbook appendix).
 * - Stock–Yogo (2005) critical value 16.38 for a 10% maximal size of a nominal 5% Wald test
 *   (METHODS §6: from memory, high confidence; not read in the paper's table).
 */
export const RULE_OF_THUMB_F = 10;
export const STOCK_YOGO_10_PERCENT_F = 16.38;

/**
 * The first-stage F in RD: the squared robust t of the take-up jump, F = (jump / se)² (METHODS §6).
 * Infinite precision (se = 0) is reported as Number.MAX_VALUE so results stay JSON-serialisable.
 */
export function firstStageF(jump: number, se: number): number {
  if (se > 0) return (jump / se) ** 2;
  return jump === 0 ? 0 : Number.MAX_VALUE;
}

/** Flags of a first-stage F against the two thresholds. */
export function weakFirstStageFlags(f: number): { belowRuleOfThumb: boolean; belowStockYogo: boolean } {
  return { belowRuleOfThumb: f < RULE_OF_THUMB_F, belowStockYogo: f < STOCK_YOGO_10_PERCENT_F };
}

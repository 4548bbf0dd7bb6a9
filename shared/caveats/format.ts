/**
 * Numbers as they appear in caveat messages: short and plain. Values are kept unrounded in
 * `values`; only the sentence rounds.
 */

/** Two significant digits below 10, one decimal below 100, whole numbers above: 0.013, 6.2, 48.3, 1,204. */
export function plainNumber(value: number): string {
  const a = Math.abs(value);
  if (a === 0) return '0';
  if (a >= 100) return Math.round(value).toLocaleString('en-US');
  if (a >= 10) return value.toFixed(1);
  const digits = Math.max(1, 1 - Math.floor(Math.log10(a)));
  return Number(value.toFixed(digits)).toString();
}

/** "p = 0.012", "p < 0.001". */
export function plainP(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${plainNumber(p)}`;
}

/** A score as the agency writes it (up to two decimals). */
export function plainScore(score: number): string {
  return Number(score.toFixed(2)).toString();
}

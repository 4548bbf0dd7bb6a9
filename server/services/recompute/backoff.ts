/**
 * Delay before retry number `attempt` (1 = after the first failure): base × 4^(attempt − 1),
 * capped. With the default base of 30 s: 30 s, 2 min, 8 min. Common practice, no source.
 * @example backoffMs(2, 30_000) // => 120000
 */
export function backoffMs(attempt: number, baseMs: number, capMs = 60 * 60_000): number {
  if (!Number.isInteger(attempt) || attempt < 1) throw new RangeError('backoffMs: attempt must be a whole number from 1');
  return Math.min(capMs, baseMs * 4 ** (attempt - 1));
}

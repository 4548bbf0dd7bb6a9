import type { EligibleSide } from '../schemas/program';

/**
 * The score in the diagnostics' own coordinates: t = score − cutoff when eligibility is at or above
 * the cutoff, cutoff − score when it is at or below. So t ≥ 0 ⇔ eligible (a score at the cutoff is
 * eligible), and every jump is "eligible minus ineligible", the engine's sign convention. Distances
 * keep score units.
 */
export function centredScore(score: Float64Array, cutoff: number, eligibleSide: EligibleSide): Float64Array {
  const sign = eligibleSide === 'at-or-above' ? 1 : -1;
  const t = new Float64Array(score.length);
  // "+ 0" turns −0 into +0, so a score exactly at the cutoff lands on the eligible side.
  for (let i = 0; i < score.length; i++) t[i] = sign * (score[i]! - cutoff) + 0;
  return t;
}

/** Back from centred coordinates to the score scale (for plotting). */
export function scoreAt(t: number, cutoff: number, eligibleSide: EligibleSide): number {
  return eligibleSide === 'at-or-above' ? cutoff + t : cutoff - t;
}

/** Throws RangeError unless every entry is finite (messages name the function and the entry). */
export function requireFinite(fn: string, name: string, values: Float64Array): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) throw new RangeError(`${fn}: ${name}[${i}] is not a finite number`);
  }
}

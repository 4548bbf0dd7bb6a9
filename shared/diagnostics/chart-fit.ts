import { fitLocalPolynomial, type DiscontinuityEstimate, type FitSide } from '../estimation';

/** Points per side of the fitted line. */
const LINE_POINTS = 20;

/**
 * The estimate's own local polynomial on each side, drawn over the bandwidth: the engine's
 * one-sided fit at the cutoff (same kernel, order and h as the estimate), expanded as
 * m̂(x) = Σₖ m̂⁽ᵏ⁾(c)·(x − c)ᵏ/k!. A score at the cutoff belongs to the eligible side.
 */
export function fittedLines(score: Float64Array, values: Float64Array, main: DiscontinuityEstimate): { ineligible: { score: number; value: number }[]; eligible: { score: number; value: number }[] } {
  const { cutoff, eligibleSide, kernel, order } = main.options;
  const sides: Record<'ineligible' | 'eligible', { fit: FitSide; h: number; direction: 1 | -1 }> =
    eligibleSide === 'at-or-above'
      ? { eligible: { fit: 'at-or-above', h: main.bandwidth.sides.eligible.h, direction: 1 }, ineligible: { fit: 'below', h: main.bandwidth.sides.ineligible.h, direction: -1 } }
      : { eligible: { fit: 'at-or-below', h: main.bandwidth.sides.eligible.h, direction: -1 }, ineligible: { fit: 'above', h: main.bandwidth.sides.ineligible.h, direction: 1 } };
  const line = (side: 'ineligible' | 'eligible') => {
    const { fit, h, direction } = sides[side];
    const result = fitLocalPolynomial(score, [values], { at: cutoff, side: fit, h, kernel, order });
    if (!result.ok) return [];
    const derivatives = result.derivatives[0]!;
    const points: { score: number; value: number }[] = [];
    for (let k = 0; k < LINE_POINTS; k++) {
      const dx = direction * (k / (LINE_POINTS - 1)) * h;
      let value = 0;
      let factorial = 1;
      for (let j = 0; j < derivatives.length; j++) {
        if (j > 0) factorial *= j;
        value += (derivatives[j]! * dx ** j) / factorial;
      }
      points.push({ score: cutoff + dx, value });
    }
    return points;
  };
  return { ineligible: line('ineligible'), eligible: line('eligible') };
}

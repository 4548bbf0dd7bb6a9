import { EstimationError } from './errors';
import type { SideFit } from './local-polynomial';
import { minimumObservationsForFit } from './minimums';

const SIDE_WORD = ['ineligible', 'eligible'] as const;

/**
 * Throws `EstimationError` unless both fits have enough weighted observations and an invertible
 * moment matrix. `what` names the bandwidth in the message, e.g. "the bandwidth h = 2.5".
 */
export function requireUsableFits(fits: readonly [SideFit, SideFit], what: string): void {
  for (const fit of fits) {
    const needed = minimumObservationsForFit(fit.order);
    const side = SIDE_WORD[fit.side];
    if (fit.used < needed) {
      throw new EstimationError(
        'too_few_observations',
        `Only ${fit.used} observation${fit.used === 1 ? '' : 's'} on the ${side} side fall inside ${what}; at least ${needed} are needed.`,
        { side, used: fit.used, needed, bandwidth: fit.h },
      );
    }
    if (!fit.inverse) {
      throw new EstimationError(
        'singular_fit',
        `The ${side} side has too few distinct scores inside ${what} to fit a polynomial of order ${fit.order}.`,
        { side, used: fit.used, order: fit.order, bandwidth: fit.h },
      );
    }
  }
}

/** Tries a fit; returns whether both sides are usable (for widening a pilot bandwidth). */
export function fitsUsable(fits: readonly [SideFit, SideFit]): boolean {
  return fits.every((f) => f.inverse !== null && f.used >= minimumObservationsForFit(f.order));
}

/**
 * Names a bandwidth for messages, 4 significant digits in score units: `h` and `b` as such, any
 * other label as "the <label> bandwidth", e.g. "the pilot bandwidth 3.35".
 */
export function formatBandwidth(name: string, value: number): string {
  const v = Number(value.toPrecision(4));
  return name === 'h' || name === 'b' ? `the bandwidth ${name} = ${v}` : `the ${name} bandwidth ${v}`;
}

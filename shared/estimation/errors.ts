/**
 * Numerical conditions under which no estimate exists. Argument mistakes (wrong types, values out
 * of range) throw TypeError or RangeError instead; these are properties of the data.
 */
export const ESTIMATION_ERROR_CODES = [
  /** A side has fewer observations with positive weight inside the bandwidth than the fit needs. */
  'too_few_observations',
  /** A moment matrix is singular: too few distinct scores inside the bandwidth. */
  'singular_fit',
  /** Take-up is the same for everyone near the cutoff. */
  'no_take_up_variation',
  /** Take-up varies but does not jump at the cutoff, so the ratio is undefined. */
  'no_first_stage',
  /** A data-driven bandwidth rule has nothing to work with (e.g. the outcome does not vary). */
  'bandwidth_undefined',
] as const;

export type EstimationErrorCode = (typeof ESTIMATION_ERROR_CODES)[number];

/** Thrown by the engine when the data admit no estimate; `message` is one plain sentence. */
export class EstimationError extends Error {
  override name = 'EstimationError';
  constructor(
    readonly code: EstimationErrorCode,
    message: string,
    readonly details: Record<string, number | string> = {},
  ) {
    super(message);
  }
}

export function isEstimationError(value: unknown): value is EstimationError {
  return value instanceof EstimationError;
}

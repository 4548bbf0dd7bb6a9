/**
 * Conditions of the data under which a diagnostic cannot be computed (too few observations, no
 * variation, …). Argument mistakes throw TypeError/RangeError instead. `runDiagnostics` catches
 * these and reports the diagnostic as unavailable with the code and message, so one failing check
 * never hides the others.
 */
export const DIAGNOSTIC_ERROR_CODES = [
  /** Too few observations on a side (or in a window) for the calculation. */
  'too_few_observations',
  /** The score does not vary enough (e.g. too few histogram bins or distinct values). */
  'too_little_variation',
  /** An estimated density at the cutoff came out zero or negative, so its logarithm is undefined. */
  'density_not_positive',
  /** A least-squares fit was singular. */
  'singular_fit',
] as const;

export type DiagnosticErrorCode = (typeof DIAGNOSTIC_ERROR_CODES)[number];

/** Thrown when the data admit no value for a diagnostic; `message` is one plain sentence. */
export class DiagnosticError extends Error {
  override name = 'DiagnosticError';
  constructor(
    readonly code: DiagnosticErrorCode,
    message: string,
  ) {
    super(message);
  }
}

export function isDiagnosticError(value: unknown): value is DiagnosticError {
  return value instanceof DiagnosticError;
}

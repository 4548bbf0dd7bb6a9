/**
 * Stable error codes shared by the API, the client and the command line. A code never changes
 * meaning once released; add new ones rather than reuse. Messages are plain sentences for the user.
 */
export const ERROR_CODES = [
  'bad_request',
  'validation_failed',
  'not_found',
  'unauthenticated',
  'session_expired',
  'forbidden',
  'csrf_invalid',
  'conflict',
  'payload_too_large',
  'rate_limited',
  'service_unavailable',
  'internal',
  // Designs, recomputes and results.
  'design_locked',
  'design_unchanged',
  'deviation_reason_required',
  'design_setting_unknown',
  'no_primary_design',
  'result_not_found',
  // E-mail.
  'mail_not_sent',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

/** The body of every non-2xx JSON response. */
export interface ApiErrorBody {
  error: {
    code: ErrorCode;
    /** One or two plain sentences a user can act on; never contains personal data. */
    message: string;
    /** Machine-readable detail, e.g. the failing field paths of a validation error. */
    details?: unknown;
  };
}

/** Narrowing helper for values parsed from JSON. */
export function isApiErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

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
  // Extracts: refused at upload (the HTTP answer carries the code; nothing is stored).
  'extract_format_unsupported',
  'extract_empty',
  'extract_unreadable',
  'extract_encoding_invalid',
  'extract_header_invalid',
  'extract_sheet_not_found',
  'extract_period_invalid',
  'extract_too_many_rows',
  // Extracts: whole-file problems found by validation (shown on the report; the extract cannot be accepted).
  'extract_column_missing',
  'extract_mapping_invalid',
  'extract_wrong_period',
  'extract_duplicate_subject',
  'extract_scores_one_side',
  'extract_take_up_constant',
  // Extracts: row problems (each rejected row carries one; too many of one kind stop the file).
  'extract_row_malformed',
  'extract_subject_missing',
  'extract_value_missing',
  'extract_value_not_numeric',
  'extract_value_not_finite',
  'extract_value_not_binary',
  'extract_take_up_unknown',
  'extract_score_out_of_range',
  'extract_date_invalid',
  'extract_date_outside_period',
  'extract_period_mismatch',
  // Extracts: decisions and processing.
  'extract_state_conflict',
  'extract_observations_purged',
  'extract_processing_failed',
  // Annex and exports.
  'export_no_observations',
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

import type { ErrorCode } from '@shared/errors';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  session_expired: 401,
  forbidden: 403,
  csrf_invalid: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  rate_limited: 429,
  internal: 500,
  service_unavailable: 503,
  design_locked: 409,
  design_unchanged: 409,
  deviation_reason_required: 422,
  design_setting_unknown: 422,
  no_primary_design: 409,
  result_not_found: 404,
  mail_not_sent: 502,
  extract_format_unsupported: 415,
  extract_empty: 422,
  extract_unreadable: 422,
  extract_encoding_invalid: 422,
  extract_header_invalid: 422,
  extract_sheet_not_found: 422,
  extract_period_invalid: 422,
  extract_too_many_rows: 413,
  extract_column_missing: 422,
  extract_mapping_invalid: 422,
  extract_wrong_period: 422,
  extract_duplicate_subject: 422,
  extract_scores_one_side: 422,
  extract_take_up_constant: 422,
  extract_row_malformed: 422,
  extract_subject_missing: 422,
  extract_value_missing: 422,
  extract_value_not_numeric: 422,
  extract_value_not_finite: 422,
  extract_value_not_binary: 422,
  extract_take_up_unknown: 422,
  extract_score_out_of_range: 422,
  extract_date_invalid: 422,
  extract_date_outside_period: 422,
  extract_period_mismatch: 422,
  extract_state_conflict: 409,
  extract_observations_purged: 410,
  extract_processing_failed: 500,
  export_no_observations: 404,
};

/**
 * The one error type services throw. The error middleware turns it into `ApiErrorBody` with the
 * code's HTTP status. `message` is shown to the user as is: plain words, no personal data.
 */
export class AppError extends Error {
  override name = 'AppError';
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly options: { details?: unknown; cause?: unknown; status?: number } = {},
  ) {
    super(message, { cause: options.cause });
    this.status = options.status ?? STATUS[code];
  }
  get details(): unknown {
    return this.options.details;
  }
}

export const notFound = (what: string): AppError => new AppError('not_found', `${what} was not found.`);
export const badRequest = (message: string, details?: unknown): AppError => new AppError('bad_request', message, { details });
export const conflict = (message: string, details?: unknown): AppError => new AppError('conflict', message, { details });
export const forbidden = (message = 'You do not have permission to do this.'): AppError => new AppError('forbidden', message);
export const unauthenticated = (message = 'Please sign in first.'): AppError => new AppError('unauthenticated', message);
export const sessionExpired = (message = 'Your session has ended. Please sign in again.'): AppError => new AppError('session_expired', message);
export const csrfInvalid = (): AppError =>
  new AppError('csrf_invalid', 'This request did not carry the security token of your session. Reload the page and try again.');

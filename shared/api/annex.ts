import type { Role } from '../schemas/roles';

/**
 * Who may download a program's technical annex (workbook of results, diagnostics, bins and
 * method): evaluators, whose job it is; analysts, who define the designs behind the figures; and
 * administrators. Managers read the dashboards and directors receive the annex only by e-mail,
 * when they opt in. Each download is recorded in the audit trail (`annex.download`).
 */
export const ANNEX_ROLES: readonly Role[] = ['evaluator', 'analyst', 'admin'];

/**
 * Who may download the row-level de-identified export: evaluators only (it holds one row per
 * applicant, without identifiers). Each download is recorded in the audit trail (`export.download`).
 */
export const DEIDENTIFIED_EXPORT_ROLES: readonly Role[] = ['evaluator'];

/** `GET /api/programs/:programId/annex[?period=YYYY-MM]`: the workbook (whole program, or one cohort). */
export function annexPath(programId: number, period?: string): string {
  return `/api/programs/${programId}/annex${period ? `?period=${encodeURIComponent(period)}` : ''}`;
}

/** `GET /api/programs/:programId/exports/deidentified[?from=YYYY-MM&to=YYYY-MM]`: CSV, one row per applicant. */
export function deidentifiedExportPath(programId: number, range?: { from: string; to: string }): string {
  const query = range ? `?from=${encodeURIComponent(range.from)}&to=${encodeURIComponent(range.to)}` : '';
  return `/api/programs/${programId}/exports/deidentified${query}`;
}

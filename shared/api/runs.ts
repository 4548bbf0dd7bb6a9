/** Why a recompute was asked for. */
export const RUN_TRIGGERS = ['extract-accepted', 'nightly', 'on-demand', 'design-changed'] as const;
export type RunTrigger = (typeof RUN_TRIGGERS)[number];

/**
 * - `queued`: waiting (possibly for its back-off after a failed attempt, see `nextAttemptAt`);
 * - `running`: holds the program's lock;
 * - `succeeded`: results written; `up-to-date`: nothing had changed, nothing written;
 * - `failed`: gave up after its attempts; previous results were kept and marked stale.
 */
export const RUN_STATUSES = ['queued', 'running', 'succeeded', 'up-to-date', 'failed'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

/** A row of the job-run log (`GET /api/programs/:programId/runs`). */
export interface RunDto {
  id: number;
  programId: number;
  designId: number | null;
  trigger: RunTrigger;
  requestedBy: string;
  status: RunStatus;
  /** Scopes (cohorts and windows) done / to do in the current attempt. */
  progress: { done: number; total: number; current: string | null };
  attempts: number;
  maxAttempts: number;
  nextAttemptAt: string | null;
  requestedAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  /** Wall-clock seconds of the last attempt. */
  durationS: number | null;
  /** Results written (succeeded) — scopes × outcomes. */
  resultsWritten: number;
  /** Plain error text of the last failed attempt. */
  error: string | null;
}

import { useState } from 'react';
import type { RunDto } from '@shared/api/runs';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { formatDateTime, formatNumber } from '@/lib/format';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { useRuns, useStartRecompute } from '../api/runs';
import { buttonPrimary } from '@/components/ui/styles';

const STATUS_WORDS: Record<RunDto['status'], string> = {
  queued: 'Queued',
  running: 'Running',
  succeeded: 'Done',
  'up-to-date': 'Nothing new',
  failed: 'Failed',
};
const TRIGGER_WORDS: Record<RunDto['trigger'], string> = {
  'extract-accepted': 'Extract accepted',
  nightly: 'Nightly check',
  'on-demand': 'On demand',
  'design-changed': 'Design changed',
};

function Progress({ run }: { run: RunDto }) {
  if (run.status !== 'running' || run.progress.total === 0) return null;
  const pct = Math.round((100 * run.progress.done) / run.progress.total);
  return (
    <div className="mt-1 w-40">
      <div className="h-1.5 rounded bg-rule" role="progressbar" aria-valuemin={0} aria-valuemax={run.progress.total} aria-valuenow={run.progress.done} aria-label="Recompute progress">
        <div className="h-1.5 rounded bg-accent-500" style={{ width: `${pct}%` }} />
      </div>
      <p className="mt-1 text-xs text-ink-500">
        {run.progress.done} of {run.progress.total} cohorts and windows{run.progress.current ? ` · ${run.progress.current.replace(/^cohort:|^window:/, '')}` : ''}
      </p>
    </div>
  );
}

/** The job-run log of a program, with the on-demand recompute; it refreshes itself while a run is active. */
export function RunLog({ programId }: { programId: number }) {
  const [page, setPage] = useState(1);
  const runs = useRuns(programId, page);
  const start = useStartRecompute(programId);
  // Analysts start recomputes; administrators read the log (the server checks the same rule).
  const mayStart = holdsRoleForProgram(useSignedInUser(), ['analyst'], programId);
  return (
    <div className="grid gap-4">
      <div className={mayStart ? 'flex flex-wrap items-center gap-3' : 'hidden'}>
        <button type="button" className={buttonPrimary} disabled={start.isPending} onClick={() => start.mutate()}>
          Recompute now
        </button>
        {start.data ? <span className="text-sm text-ink-700">{start.data.joined ? 'A recompute was already queued; your request joined it.' : 'Recompute queued.'}</span> : null}
      </div>
      {start.isError ? <ErrorState error={start.error} /> : null}
      {runs.isPending ? <Loading label="Loading the run log…" /> : null}
      {runs.isError ? <ErrorState error={runs.error} onRetry={() => void runs.refetch()} /> : null}
      {runs.data && runs.data.items.length === 0 ? <Empty title="No runs yet">A recompute runs by itself when an extract is accepted or a design changes, and nightly for anything stale.</Empty> : null}
      {runs.data && runs.data.items.length > 0 ? (
        <>
          <DataTable
            label="Recompute runs"
            rows={runs.data.items}
            rowKey={(r) => r.id}
            columns={[
              { header: 'Run', cell: ({ row }) => `#${row.original.id}` },
              { header: 'Why', cell: ({ row }) => `${TRIGGER_WORDS[row.original.trigger]} · ${row.original.requestedBy}` },
              {
                header: 'Status',
                cell: ({ row }) => (
                  <div>
                    <span className={row.original.status === 'failed' ? 'font-medium text-serious' : 'font-medium'}>{STATUS_WORDS[row.original.status]}</span>
                    {row.original.status === 'queued' && row.original.attempts > 0 ? <span className="text-ink-500"> · retry after {formatDateTime(row.original.nextAttemptAt)}</span> : null}
                    <Progress run={row.original} />
                  </div>
                ),
              },
              { header: 'Attempts', cell: ({ row }) => `${row.original.attempts} of ${row.original.maxAttempts}` },
              { header: 'Requested', cell: ({ row }) => formatDateTime(row.original.requestedAt) },
              { header: 'Duration', cell: ({ row }) => (row.original.durationS === null ? '—' : `${formatNumber(row.original.durationS, 1)} s`) },
              { header: 'Results', cell: ({ row }) => row.original.resultsWritten },
              { header: 'Error', cell: ({ row }) => (row.original.error ? <span className="text-serious">{row.original.error}</span> : '—') },
            ]}
          />
          <Pager label="Pages" page={runs.data.page} pageSize={runs.data.pageSize} total={runs.data.total} onPage={setPage} />
        </>
      ) : null}
    </div>
  );
}

import type { SummaryScheduleRowDto } from '@shared/api/schedules';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { buttonSecondary } from '@/components/ui/styles';
import { formatDateTime } from '@/lib/format';
import { useSchedules, useSetSummaryPaused } from '../api/schedules';

const column = createColumnHelper<SummaryScheduleRowDto>();

/** What Cutline does by itself and when: recomputes, and every director's summary e-mail. */
export function SchedulesPage() {
  const schedules = useSchedules();
  const pause = useSetSummaryPaused();
  const columns = [
    column.accessor('person', { header: 'Director', cell: (c) => <span>{c.getValue()}{c.row.original.active ? '' : ' (switched off)'}</span> }),
    column.accessor('scheduleText', { header: 'When' }),
    column.accessor('programs', { header: 'Programs', cell: (c) => (c.getValue().length ? c.getValue().join(', ') : 'All granted programs') }),
    column.accessor('nextDueAt', { header: 'Next', cell: (c) => (c.row.original.paused ? 'Paused' : c.getValue() ? formatDateTime(c.getValue()) : 'Not sent (account switched off)') }),
    column.accessor('lastSentAt', { header: 'Last sent', cell: (c) => (c.getValue() ? formatDateTime(c.getValue()) : 'Never') }),
    column.display({
      id: 'pause',
      header: 'Action',
      cell: ({ row }) => (
        <button
          type="button"
          className={buttonSecondary}
          disabled={pause.isPending}
          onClick={() => pause.mutate({ id: row.original.subscriptionId, paused: !row.original.paused })}
          aria-label={`${row.original.paused ? 'Resume' : 'Pause'} the summary of ${row.original.person}`}
        >
          {row.original.paused ? 'Resume' : 'Pause'}
        </button>
      ),
    }),
  ];
  return (
    <>
      <section className="mb-8 rounded-lg border border-rule bg-panel p-5 text-sm text-ink-700" aria-label="Recomputes">
        <h2 className="mb-2 font-semibold text-ink-900">Recomputes</h2>
        <p>
          Results are recomputed by themselves when an extract is accepted, when an evaluation design or a cutoff schedule changes, and every night for anything out of date. Analysts can start one at any time
          from a program’s run log; failed runs retry after 30 seconds, 2 minutes and 8 minutes.
        </p>
      </section>
      <h2 className="mb-3 text-lg font-semibold text-ink-900">Directors’ summary e-mails</h2>
      {schedules.isPending ? (
        <Loading label="Loading schedules…" />
      ) : schedules.isError ? (
        <ErrorState error={schedules.error} onRetry={() => void schedules.refetch()} />
      ) : schedules.data.summaries.length === 0 ? (
        <Empty title="No directors yet">Grant someone the director role under People and roles; their summary starts on the default schedule.</Empty>
      ) : (
        <DataTable columns={columns} rows={schedules.data.summaries} label="Summary e-mail schedules" rowKey={(r) => r.subscriptionId} />
      )}
      {pause.isError ? <ErrorState error={pause.error} /> : null}
      <p className="mt-3 text-xs text-ink-500">Directors choose their own schedule and programs under “My summary”. Times are in each schedule’s own time zone; dates here in the agency’s.</p>
    </>
  );
}

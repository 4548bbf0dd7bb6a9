import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ExtractSummaryDto } from '@shared/api/extracts';
import { EXTRACT_STATUSES, type ExtractStatus } from '@shared/schemas/extract';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { formatDateTime, formatPeriod } from '@/lib/format';
import { useExtracts } from '../api/get-extracts';
import { STATUS_LABELS, StatusBadge } from './extract-status';

const column = createColumnHelper<ExtractSummaryDto>();
const PAGE_SIZE = 20;

/** The program's extracts, newest upload first, paged and filterable by status. */
export function ExtractsTable({ programId, timeZone }: { programId: number; timeZone: string }) {
  const [page, setPage] = useState(1);
  const [status, setStatus] = useState<ExtractStatus | ''>('');
  const extracts = useExtracts(programId, { page, pageSize: PAGE_SIZE, status: status || undefined });
  const columns = [
    column.accessor('period', {
      header: 'Month',
      cell: (c) => (
        <Link to={`/programs/${programId}/extracts/${c.row.original.id}`} className="font-medium text-accent-700 underline underline-offset-4">
          {formatPeriod(c.getValue())}
        </Link>
      ),
    }),
    column.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} /> }),
    column.accessor('fileName', { header: 'File', cell: (c) => <span className="break-all">{c.getValue()}</span> }),
    column.accessor((e) => e.source?.name ?? '—', { id: 'source', header: 'Data source' }),
    column.accessor('rowsAccepted', { header: 'Rows kept', meta: { numeric: true }, cell: (c) => c.getValue()?.toLocaleString() ?? '—' }),
    column.accessor('rowsRejected', { header: 'Rejected', meta: { numeric: true }, cell: (c) => c.getValue()?.toLocaleString() ?? '—' }),
    column.accessor((e) => e.uploaded, {
      id: 'uploaded',
      header: 'Uploaded',
      cell: (c) => (
        <span>
          {formatDateTime(c.getValue().at, timeZone)}
          <span className="block text-xs text-ink-500">{c.getValue().by}</span>
        </span>
      ),
    }),
  ];
  return (
    <section aria-labelledby="extracts-heading">
      <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
        <h2 id="extracts-heading" className="text-lg font-semibold text-ink-900">
          Extracts
        </h2>
        <label className="text-sm text-ink-700">
          Show{' '}
          <select
            className="ml-1 rounded border border-ink-300 bg-panel px-2 py-1"
            value={status}
            onChange={(e) => {
              setStatus(e.target.value as ExtractStatus | '');
              setPage(1);
            }}
          >
            <option value="">all statuses</option>
            {EXTRACT_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s].toLowerCase()}
              </option>
            ))}
          </select>
        </label>
      </div>
      {extracts.isPending ? (
        <Loading label="Loading extracts…" />
      ) : extracts.isError ? (
        <ErrorState error={extracts.error} onRetry={() => void extracts.refetch()} />
      ) : extracts.data.items.length === 0 ? (
        <Empty title={status ? 'No extracts with this status' : 'No extracts yet'}>Upload the month’s file above; it appears here with its status.</Empty>
      ) : (
        <>
          <DataTable columns={columns as never} rows={extracts.data.items} label="Extracts of this program" rowKey={(e) => String(e.id)} />
          <Pager page={page} pageSize={PAGE_SIZE} total={extracts.data.total} onPage={setPage} label="Extract pages" />
        </>
      )}
    </section>
  );
}

import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import type { ExtractDetailDto, RejectedRowDto, RejectionGroupDto } from '@shared/api/extracts';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { ErrorState, Loading } from '@/components/ui/states';
import { formatNumber, formatShare } from '@/lib/format';
import { rejectedCsvHref, useRejectedRows } from '../api/get-rejected-rows';

const PAGE_SIZE = 25;
const reasonColumn = createColumnHelper<RejectionGroupDto>();
const rowColumn = createColumnHelper<RejectedRowDto>();

/** The validation report: counts, the whole-file problem if any, reasons, and the rejected rows. */
export function ExtractReport({ extract, programId }: { extract: ExtractDetailDto; programId: number }) {
  const report = extract.report;
  return (
    <section aria-labelledby="report-heading" className="rounded-lg border border-rule bg-panel p-6">
      <h2 id="report-heading" className="text-lg font-semibold text-ink-900">
        Validation report
      </h2>
      {extract.problem && extract.status !== 'failed' ? (
        <div role="alert" className="mt-4 rounded-md border-l-4 border-serious bg-serious-50 px-4 py-3">
          <p className="font-medium text-ink-900">This file cannot be accepted as it is.</p>
          <p className="mt-1 text-sm text-ink-700">{extract.problem.message}</p>
          <p className="mt-1 text-xs text-ink-500">Code: {extract.problem.code}</p>
        </div>
      ) : null}
      {report ? (
        <>
          <dl className="figures mt-5 grid grid-cols-2 gap-4 text-sm sm:grid-cols-4">
            <Figure label="Rows read" value={report.rowsRead.toLocaleString()} />
            <Figure label="Rows kept" value={report.rowsAccepted.toLocaleString()} />
            <Figure
              label="Rows rejected"
              value={`${report.rowsRejected.toLocaleString()} (${formatShare(report.rejectedShare)})`}
              note={`The program accepts up to ${formatShare(report.maxRejectedShare, 0)}.`}
            />
            <Figure label="Cutoff this month" value={formatNumber(report.cutoff, 1)} />
            <Figure label="Kept rows on the eligible side" value={report.eligibleRows.toLocaleString()} />
            <Figure label="Kept rows on the other side" value={report.ineligibleRows.toLocaleString()} />
            <Figure label="Took part" value={report.takeUpShare === null ? 'not mapped' : formatShare(report.takeUpShare)} />
            <Figure label="Scores" value={report.score ? `${formatNumber(report.score.min, 1)} to ${formatNumber(report.score.max, 1)}` : '—'} />
          </dl>
          {report.byReason.length > 0 ? (
            <div className="mt-6">
              <h3 className="text-sm font-semibold text-ink-900">Why rows were rejected</h3>
              <div className="mt-2">
                <DataTable
                  label="Rejected rows by reason"
                  rowKey={(g) => `${g.code}:${g.column ?? ''}`}
                  rows={report.byReason}
                  columns={
                    [
                      reasonColumn.accessor('message', { header: 'Reason' }),
                      reasonColumn.accessor('column', { header: 'Column', cell: (c) => c.getValue() ?? '—' }),
                      reasonColumn.accessor('count', { header: 'Rows', meta: { numeric: true }, cell: (c) => c.getValue().toLocaleString() }),
                      reasonColumn.accessor('code', { header: 'Code', cell: (c) => <code className="text-xs">{c.getValue()}</code> }),
                    ] as never
                  }
                />
              </div>
              <RejectedRows extract={extract} programId={programId} />
            </div>
          ) : (
            <p className="mt-5 text-sm text-ink-700">Every row passed the checks.</p>
          )}
        </>
      ) : extract.problem ? null : (
        <p className="mt-4 text-sm text-ink-500">The report appears here once the file has been checked.</p>
      )}
    </section>
  );
}

function Figure({ label, value, note }: { label: string; value: string; note?: string }) {
  return (
    <div>
      <dt className="text-ink-500">{label}</dt>
      <dd className="mt-1 font-medium text-ink-900">{value}</dd>
      {note ? <dd className="mt-0.5 text-xs text-ink-500">{note}</dd> : null}
    </div>
  );
}

function RejectedRows({ extract, programId }: { extract: ExtractDetailDto; programId: number }) {
  const [page, setPage] = useState(1);
  const rows = useRejectedRows(programId, extract.id, page, PAGE_SIZE, true);
  const kept = extract.report?.rejectedRowsKept ?? 0;
  const all = extract.report?.rowsRejected ?? 0;
  return (
    <div className="mt-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h3 className="text-sm font-semibold text-ink-900">Rejected rows</h3>
        <a href={rejectedCsvHref(programId, extract.id)} download className="text-sm text-accent-700 underline underline-offset-4">
          Download rejected.csv
        </a>
      </div>
      {kept < all ? <p className="mt-1 text-xs text-ink-500">The first {kept.toLocaleString()} of {all.toLocaleString()} rejected rows are kept for this list.</p> : null}
      <div className="mt-2">
        {rows.isPending ? (
          <Loading label="Loading rejected rows…" />
        ) : rows.isError ? (
          <ErrorState error={rows.error} onRetry={() => void rows.refetch()} />
        ) : (
          <>
            <DataTable
              label="Rejected rows"
              rowKey={(r) => String(r.line)}
              rows={rows.data.items}
              columns={
                [
                  rowColumn.accessor('line', { header: 'Line', meta: { numeric: true } }),
                  rowColumn.accessor('column', { header: 'Column', cell: (c) => c.getValue() ?? '—' }),
                  rowColumn.accessor('reason', { header: 'Reason' }),
                  rowColumn.accessor('value', { header: 'Value in the file', cell: (c) => <span className="break-all font-mono text-xs">{c.getValue() ?? '—'}</span> }),
                ] as never
              }
            />
            <Pager page={page} pageSize={PAGE_SIZE} total={rows.data.total} onPage={setPage} label="Rejected row pages" />
          </>
        )}
      </div>
    </div>
  );
}

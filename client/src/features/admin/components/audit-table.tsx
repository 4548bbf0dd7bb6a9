import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import type { AuditEventDto } from '@shared/api/audit';
import { AUDIT_ACTIONS, type AuditAction } from '@shared/schemas/audit';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { buttonSecondary, field, fieldLabel } from '@/components/ui/styles';
import { formatDateTime } from '@/lib/format';
import { useAuditTrail, type AuditFilters } from '../api/get-audit';
import { useProgramChoices } from '../api/users';
import { AUDIT_ACTION_LABELS, describeDetails } from '../audit-labels';

const column = createColumnHelper<AuditEventDto>();
const columnsWith = (programName: (id: number) => string) => [
  column.accessor('occurredAt', { header: 'When', cell: (c) => <span className="whitespace-nowrap">{formatDateTime(c.getValue())}</span> }),
  column.accessor('actorLabel', { header: 'Who', cell: (c) => c.getValue() }),
  column.accessor('action', { header: 'What', cell: (c) => <span className="font-medium">{AUDIT_ACTION_LABELS[c.getValue()]}</span> }),
  column.accessor('programId', { header: 'Program', cell: (c) => (c.getValue() === null ? '—' : programName(c.getValue()!)) }),
  column.accessor('subjectId', { header: 'Record', cell: (c) => (c.row.original.subjectType ? `${c.row.original.subjectType} #${c.getValue()}` : '—') }),
  column.accessor('details', { header: 'Details', cell: (c) => <span className="font-mono text-xs text-ink-700">{describeDetails(c.getValue())}</span> }),
];

export function AuditTable() {
  const [filters, setFilters] = useState<AuditFilters>({ page: 1 });
  const trail = useAuditTrail(filters);
  const programs = useProgramChoices();
  const names = new Map((programs.data?.items ?? []).map((p) => [p.id, p.name]));
  const columns = columnsWith((id) => names.get(id) ?? `Program #${id}`);
  const set = (patch: Partial<AuditFilters>) => setFilters((f) => ({ ...f, ...patch, page: patch.page ?? 1 }));
  return (
    <section aria-label="Audit trail">
      <form className="mb-4 grid gap-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end" aria-label="Filter the audit trail" onSubmit={(e) => e.preventDefault()}>
        <div>
          <label htmlFor="audit-action" className={fieldLabel}>
            What
          </label>
          <select id="audit-action" className={field} value={filters.action ?? ''} onChange={(e) => set({ action: (e.target.value || undefined) as AuditAction | undefined })}>
            <option value="">Everything</option>
            {AUDIT_ACTIONS.map((a) => (
              <option key={a} value={a}>
                {AUDIT_ACTION_LABELS[a]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="audit-from" className={fieldLabel}>
            From (UTC)
          </label>
          <input id="audit-from" type="date" className={field} value={filters.from ?? ''} onChange={(e) => set({ from: e.target.value || undefined })} />
        </div>
        <div>
          <label htmlFor="audit-to" className={fieldLabel}>
            To (UTC)
          </label>
          <input id="audit-to" type="date" className={field} value={filters.to ?? ''} onChange={(e) => set({ to: e.target.value || undefined })} />
        </div>
        <button type="button" className={buttonSecondary} onClick={() => setFilters({ page: 1 })}>
          Clear
        </button>
      </form>
      {trail.isPending ? (
        <Loading label="Loading the audit trail…" />
      ) : trail.isError ? (
        <ErrorState error={trail.error} onRetry={() => void trail.refetch()} />
      ) : trail.data.items.length === 0 ? (
        <Empty title="Nothing recorded for these filters">Widen the dates or choose “Everything”.</Empty>
      ) : (
        <>
          <DataTable columns={columns} rows={trail.data.items} label="Audit events, newest first" rowKey={(e) => e.id} />
          <Pager page={filters.page} pageSize={trail.data.pageSize} total={trail.data.total} onPage={(page) => set({ page })} label="Pages of the audit trail" />
        </>
      )}
    </section>
  );
}

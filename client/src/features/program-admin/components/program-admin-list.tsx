import type { ProgramSummaryDto } from '@shared/api/programs';
import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { usePrograms } from '@/features/programs/api/get-programs';
import { formatNumber, formatPeriod } from '@/lib/format';

const column = createColumnHelper<ProgramSummaryDto>();
const columns = [
  column.accessor('name', { header: 'Program', cell: (c) => <Link className="text-accent-700 underline underline-offset-2" to={`/admin/programs/${c.row.original.id}`}>{c.getValue()}</Link> }),
  column.accessor('slug', { header: 'Short name' }),
  column.accessor('currentCutoff', { header: 'Cutoff now', cell: (c) => `${formatNumber(c.getValue(), 0)} ${c.row.original.scoreUnit}` }),
  column.accessor('eligibleSide', { header: 'Who qualifies', cell: (c) => (c.getValue() === 'at-or-above' ? 'at or above' : 'at or below') }),
  column.accessor('cohortCount', { header: 'Months on record' }),
  column.accessor('latestPeriod', { header: 'Latest month', cell: (c) => formatPeriod(c.getValue()) }),
];

/** Every program, for administrators, with a link to its settings. */
export function ProgramAdminList() {
  const [page, setPage] = useState(1);
  const programs = usePrograms(page);
  if (programs.isPending) return <Loading label="Loading programs…" />;
  if (programs.isError) return <ErrorState error={programs.error} onRetry={() => void programs.refetch()} />;
  if (programs.data.items.length === 0) return <Empty title="No programs yet">Create the first program with “New program”.</Empty>;
  return (
    <>
      <DataTable columns={columns} rows={programs.data.items} label="Programs" rowKey={(p) => p.id} />
      <Pager page={page} pageSize={programs.data.pageSize} total={programs.data.total} onPage={setPage} label="Pages of programs" />
    </>
  );
}

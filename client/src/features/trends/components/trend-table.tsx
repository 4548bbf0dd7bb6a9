import type { OutcomeRefDto, TrendPointDto } from '@shared/api/results';
import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { formatCount, formatInterval, formatJump, formatNumber, formatPeriod, formatShare } from '@/lib/format';

const column = createColumnHelper<TrendPointDto>();
const SHARE = { unit: 'share' };

/** The figures behind the charts, one month a row (also what prints and what screen readers read). */
export function TrendTable({ programId, points, outcome, canOpenMonths, level }: { programId: number; points: readonly TrendPointDto[]; outcome: OutcomeRefDto; canOpenMonths: boolean; level: number }) {
  const pct = `${Math.round(level * 100)}%`;
  const columns = [
    column.accessor('period', {
      header: 'Month',
      cell: (c) =>
        canOpenMonths ? (
          <Link className="text-accent-700 underline underline-offset-2" to={`/programs/${programId}/cohorts/${c.getValue()}?outcome=${outcome.key}`}>
            {formatPeriod(c.getValue())}
          </Link>
        ) : (
          formatPeriod(c.getValue())
        ),
    }),
    column.accessor('cutoff', { header: 'Cutoff', cell: (c) => formatNumber(c.getValue(), 0) }),
    column.display({
      id: 'takeUp',
      header: 'Took part (below / eligible)',
      cell: ({ row }) => (row.original.takeUp ? `${formatShare(row.original.takeUp.ineligible, 0)} / ${formatShare(row.original.takeUp.eligible, 0)}` : '—'),
    }),
    column.display({ id: 'fs', header: 'Take-up jump', cell: ({ row }) => <Figure v={row.original.firstStage} m={SHARE} pct={pct} /> }),
    column.display({ id: 'itt', header: 'Effect of being eligible', cell: ({ row }) => <Figure v={row.original.itt} m={outcome} pct={pct} /> }),
    column.display({
      id: 'effect',
      header: 'Effect on participants',
      cell: ({ row }) => (row.original.status === 'ok' ? <Figure v={row.original.effect} m={outcome} pct={pct} /> : <span className="text-ink-500">Not estimable</span>),
    }),
    column.accessor('nUsed', { header: 'Near the cutoff', cell: (c) => formatCount(c.getValue()) }),
    column.accessor('worstCaveat', {
      header: 'Caveats',
      cell: (c) => {
        const v = c.getValue();
        return (
          <span className="flex flex-wrap gap-1">
            {v ? <SeverityBadge severity={v} /> : <span className="text-ink-500">None</span>}
            {c.row.original.stale ? <span className="rounded border border-dashed border-ink-300 px-1.5 text-xs">Out of date</span> : null}
          </span>
        );
      },
    }),
  ];
  return <DataTable columns={columns} rows={[...points].reverse()} label={`${outcome.label}, month by month, latest first`} rowKey={(p) => p.period} />;
}

function Figure({ v, m, pct }: { v: TrendPointDto['effect']; m: { unit: string }; pct: string }) {
  if (!v) return <span className="text-ink-500">—</span>;
  return (
    <span className="whitespace-nowrap">
      <span className="font-medium text-ink-900">{formatJump(v.estimate, m)}</span>
      <span className="block text-xs text-ink-500">
        {pct}: {formatInterval(v.ciLow, v.ciHigh, m)}
      </span>
    </span>
  );
}

import type { OutcomeRefDto, OutcomeResultDto } from '@shared/api/results';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { Empty } from '@/components/ui/states';
import { formatCount, formatNumber, formatPeriod, formatSigned, jumpUnit } from '@/lib/format';
import { windowRows, type BandPoint, type WindowRow } from '../trend-series';

const column = createColumnHelper<WindowRow>();

/** The pooled windows (last 3, 6, 12 months), with how they were pooled. */
export function WindowTable({ windows, outcome, level }: { windows: readonly OutcomeResultDto[]; outcome: OutcomeRefDto; level: number }) {
  const rows = windowRows(windows, outcome);
  if (rows.length === 0) return <Empty title="No pooled months yet">Pooled figures appear once at least three months have results.</Empty>;
  const pct = `${Math.round(level * 100)}%`;
  const unit = jumpUnit(outcome);
  const columns = [
    column.accessor('months', { header: 'Months pooled', cell: (c) => `Last ${c.getValue()} (${formatPeriod(c.row.original.firstPeriod)} – ${formatPeriod(c.row.original.lastPeriod)})` }),
    column.accessor('cutoffs', { header: 'Cutoffs', cell: (c) => c.getValue().map((v) => formatNumber(v, 0)).join(', ') }),
    column.accessor('firstStage', { header: 'Take-up jump (pp)', cell: (c) => <Band p={c.getValue()} digits={1} pct={pct} /> }),
    column.accessor('itt', { header: `Effect of being eligible (${unit})`, cell: (c) => <Band p={c.getValue()} digits={outcome.unit === 'share' ? 1 : 2} pct={pct} /> }),
    column.accessor('effect', { header: `Effect on participants (${unit})`, cell: (c) => (c.row.original.status === 'ok' ? <Band p={c.getValue()} digits={outcome.unit === 'share' ? 1 : 2} pct={pct} /> : <span className="text-ink-500">{c.row.original.problem ?? 'Not estimable'}</span>) }),
    column.accessor('nUsed', { header: 'Near the cutoff', cell: (c) => formatCount(c.getValue()) }),
    column.accessor('serious', { header: 'Caveats', cell: (c) => (c.getValue() ? <SeverityBadge severity="serious" /> : <span className="text-ink-500">None serious</span>) }),
  ];
  const statement = windows.find((w) => w.pooling)?.pooling?.statement;
  return (
    <>
      <DataTable columns={columns} rows={rows} label={`${outcome.label}, pooled months`} rowKey={(r) => r.key} />
      {statement ? <p className="mt-3 max-w-4xl text-sm text-ink-500">{statement}</p> : null}
    </>
  );
}

function Band({ p, digits, pct }: { p: BandPoint; digits: number; pct: string }) {
  if (p.estimate === null) return <span className="text-ink-500">—</span>;
  return (
    <span className="whitespace-nowrap">
      <span className="font-medium text-ink-900">{formatSigned(p.estimate, digits)}</span>
      <span className="block text-xs text-ink-500">
        {pct}: {formatSigned(p.low, digits)} to {formatSigned(p.high, digits)}
      </span>
    </span>
  );
}

import type { EstimateDto, OutcomeResultDetailDto } from '@shared/api/results';
import { createColumnHelper } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { formatCount, formatInterval, formatJump, formatNumber, formatP, isShareUnit, type Measure } from '@/lib/format';

interface Row {
  key: string;
  name: string;
  technical: string;
  estimate: EstimateDto | null;
  measure: Measure;
}
const column = createColumnHelper<Row>();

/** First stage, ITT and complier effect with conventional and robust inference, then bandwidths and n per side. */
export function EstimatesTable({ result }: { result: OutcomeResultDetailDto }) {
  const pct = `${Math.round(result.level * 100)}%`;
  const o = result.outcome;
  const rows: Row[] = [
    { key: 'fs', name: 'Take-up jump', technical: 'first stage', estimate: result.firstStage, measure: { unit: 'share' } },
    { key: 'itt', name: 'Effect of being eligible', technical: 'ITT (reduced form)', estimate: result.itt, measure: o },
    { key: 'effect', name: 'Effect on participants at the cutoff', technical: 'complier effect (LATE)', estimate: result.effect, measure: o },
  ];
  const se = (v: number | undefined, m: Measure) => (v === undefined ? '—' : `${formatNumber(isShareUnit(m) ? v * 100 : v, isShareUnit(m) ? 1 : 3)}`);
  const columns = [
    column.accessor('name', {
      header: 'Quantity',
      cell: (c) => (
        <span>
          <span className="font-medium text-ink-900">{c.getValue()}</span>
          <span className="block text-xs text-ink-500">{c.row.original.technical}</span>
        </span>
      ),
    }),
    column.display({ id: 'est', header: 'Estimate', cell: ({ row }) => <span data-figure={`${row.original.key}-estimate`}>{formatJump(row.original.estimate?.conventional.estimate, row.original.measure)}</span> }),
    column.display({ id: 'se', header: 'Std. error (conv. / robust)', cell: ({ row }) => `${se(row.original.estimate?.conventional.se, row.original.measure)} / ${se(row.original.estimate?.robust.se, row.original.measure)}` }),
    column.display({ id: 'cci', header: `Conventional ${pct} interval`, cell: ({ row }) => formatInterval(row.original.estimate?.conventional.ciLow, row.original.estimate?.conventional.ciHigh, row.original.measure) }),
    column.display({
      id: 'rci',
      header: `Robust ${pct} interval`,
      cell: ({ row }) => <span data-figure={`${row.original.key}-robust-ci`}>{formatInterval(row.original.estimate?.robust.ciLow, row.original.estimate?.robust.ciHigh, row.original.measure)}</span>,
    }),
    column.display({ id: 'p', header: 'Robust p', cell: ({ row }) => formatP(row.original.estimate?.robust.p) }),
  ];
  const bw = result.bandwidth;
  const n = result.n;
  return (
    <>
      <DataTable columns={columns} rows={rows} label={`Estimates for ${o.label}`} rowKey={(r) => r.key} />
      <dl className="figures mt-4 grid gap-4 text-sm sm:grid-cols-2 lg:grid-cols-4">
        <Item term="First-stage F" value={result.firstStage ? `${formatNumber(result.firstStage.f, 1)}${result.firstStage.weak ? ' (below 10: weak)' : ''}` : '—'} />
        <Item term="Bandwidth h (rule)" value={bw ? `${formatNumber(bw.h, 2)} score units (${bw.rule})` : '—'} />
        <Item term="Bias bandwidth b" value={bw ? `${formatNumber(bw.b, 2)} score units` : '—'} />
        <Item term="h below / at or above" value={bw ? `${formatNumber(bw.hIneligible, 2)} / ${formatNumber(bw.hEligible, 2)}` : '—'} />
        <Item term="Applicants below / eligible" value={n ? `${formatCount(n.ineligible)} / ${formatCount(n.eligible)}` : '—'} />
        <Item term="Within h (effective n) below / eligible" value={n ? `${formatCount(n.usedIneligible)} / ${formatCount(n.usedEligible)}` : '—'} />
        <Item term="Left out by the donut" value={n ? formatCount(n.droppedByDonut) : '—'} />
        <Item term="Clusters" value={n?.clusters ? formatCount(n.clusters) : 'none'} />
      </dl>
      <p className="mt-3 text-xs text-ink-500">
        Jumps are the eligible side minus the side just below. Headline figures elsewhere are the conventional estimate with the robust (bias-corrected) interval.
      </p>
    </>
  );
}

function Item({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-ink-500">{term}</dt>
      <dd className="mt-0.5 text-ink-900">{value}</dd>
    </div>
  );
}

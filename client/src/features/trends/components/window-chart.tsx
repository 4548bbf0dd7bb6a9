import type { OutcomeRefDto, OutcomeResultDto } from '@shared/api/results';
import IntervalChart from '@/components/charts/interval-chart';
import { formatNumber, formatPeriod, jumpUnit } from '@/lib/format';
import { windowRows } from '../trend-series';

/** Pooled windows as estimates with interval whiskers (lazy chunk, with the chart library). */
export default function WindowChart({ windows, outcome, level }: { windows: readonly OutcomeResultDto[]; outcome: OutcomeRefDto; level: number }) {
  const rows = windowRows(windows, outcome).filter((r) => r.effect.estimate !== null);
  if (rows.length === 0) return null;
  const unit = jumpUnit(outcome);
  return (
    <figure className="rounded-lg border border-rule bg-panel p-4">
      <figcaption>
        <span className="font-medium text-ink-900">Effect on participants at the cutoff, pooled</span>
        <span className="mt-0.5 block text-xs text-ink-500">
          {outcome.label}, {unit}; whiskers: {Math.round(level * 100)}% interval.
        </span>
      </figcaption>
      <IntervalChart
        items={rows.map((r) => ({ id: r.key, label: `Last ${r.months} (${formatPeriod(r.firstPeriod)}–${formatPeriod(r.lastPeriod)})`, estimate: r.effect.estimate!, low: r.effect.low, high: r.effect.high, flagged: r.serious }))}
        xLegend={unit}
        formatX={(v) => formatNumber(v, outcome.unit === 'share' ? 0 : 1)}
      />
    </figure>
  );
}

import type { OutcomeRefDto, TrendPointDto } from '@shared/api/results';
import BandLineChart from '@/components/charts/band-line-chart';
import { formatNumber, formatPeriod, jumpUnit } from '@/lib/format';
import { bandSeries, cutoffChanges, displayScale, seriousPeriods, takeUpSides, valueRange } from '../trend-series';

/**
 * The manager's four trend charts (lazy chunk: it carries the chart library): take-up either side
 * of the cutoff, the take-up jump, the effect of being eligible and the effect on participants,
 * each jump with its hatched interval band; cutoff changes as labelled rules; serious months ringed.
 */
export default function TrendCharts({ points, outcome, level, scoreUnit }: { points: readonly TrendPointDto[]; outcome: OutcomeRefDto; level: number; scoreUnit: string }) {
  const periods = points.map((p) => formatPeriod(p.period));
  const label = (period: string) => formatPeriod(period);
  const rules = cutoffChanges(points).map((c) => ({ at: label(c.period), label: `Cutoff ${formatNumber(c.from, 0)} → ${formatNumber(c.to, 0)}${scoreUnit ? ` ${scoreUnit}` : ''}` }));
  const flagged = seriousPeriods(points).map(label);
  const sides = takeUpSides(points);
  const fs = bandSeries(points, 'firstStage', 100);
  const itt = bandSeries(points, 'itt', displayScale(outcome, 'itt'));
  const effect = bandSeries(points, 'effect', displayScale(outcome, 'effect'));
  const unit = jumpUnit(outcome);
  const digits = outcome.unit === 'share' ? 0 : 1;
  const pct = `${Math.round(level * 100)}%`;
  const band = (s: typeof fs) => ({ low: s.map((p) => p.low), high: s.map((p) => p.high) });
  const values = (s: typeof fs) => s.map((p) => p.estimate);
  const takeUpRange = { min: 0, max: 100 };
  return (
    <div className="grid gap-8 lg:grid-cols-2">
      <Figure title="Take-up either side of the cutoff" note="Solid: just eligible. Dashed, open points: just below the cutoff. Percent who took part.">
        <BandLineChart
          periods={periods}
          lines={[
            { id: 'eligible', label: 'Just eligible', values: sides.eligible.map((p) => p.value) },
            { id: 'ineligible', label: 'Just below the cutoff', values: sides.ineligible.map((p) => p.value), dashed: true },
          ]}
          range={takeUpRange}
          yLegend="took part (%)"
          formatY={(v) => `${formatNumber(v, 0)}%`}
          rules={rules}
          flagged={flagged}
        />
      </Figure>
      <Figure title="Take-up jump at the cutoff" note={`Percentage points; hatched band: ${pct} interval.`}>
        <BandLineChart periods={periods} lines={[{ id: 'fs', label: 'Take-up jump', values: values(fs), band: band(fs) }]} range={valueRange([fs], [0])} yLegend="jump (pp)" formatY={(v) => formatNumber(v, 0)} rules={rules} flagged={flagged} zeroLine />
      </Figure>
      <Figure title="Effect of being eligible" note={`${outcome.label}, ${unit}; hatched band: ${pct} interval.`}>
        <BandLineChart periods={periods} lines={[{ id: 'itt', label: 'Effect of being eligible', values: values(itt), band: band(itt) }]} range={valueRange([itt])} yLegend={unit} formatY={(v) => formatNumber(v, digits)} rules={rules} flagged={flagged} zeroLine />
      </Figure>
      <Figure title="Effect on participants at the cutoff" note={`${outcome.label}, ${unit}, for those who take part because they qualify; hatched band: ${pct} interval.`}>
        <BandLineChart periods={periods} lines={[{ id: 'effect', label: 'Effect on participants', values: values(effect), band: band(effect) }]} range={valueRange([effect])} yLegend={unit} formatY={(v) => formatNumber(v, digits)} rules={rules} flagged={flagged} zeroLine />
      </Figure>
    </div>
  );
}

function Figure({ title, note, children }: { title: string; note: string; children: React.ReactNode }) {
  return (
    <figure className="break-inside-avoid rounded-lg border border-rule bg-panel p-4">
      <figcaption>
        <span className="font-medium text-ink-900">{title}</span>
        <span className="mt-0.5 block text-xs text-ink-500">{note}</span>
      </figcaption>
      {children}
    </figure>
  );
}

import type { OutcomeResultDetailDto } from '@shared/api/results';
import BinnedScatterChart from '@/components/charts/binned-scatter-chart';
import DensityChart from '@/components/charts/density-chart';
import IntervalChart from '@/components/charts/interval-chart';
import { formatNumber, jumpUnit } from '@/lib/format';
import { binPoints, densitySeries, fitLines, limitPoints } from '../chart-data';
import type { DiagnosticsView } from '../diagnostics-view';

/** The month's charts (lazy chunk with the chart library). */

export function OutcomeScatter({ result, cutoff, scoreLabel, fit }: { result: OutcomeResultDetailDto; cutoff: number; scoreLabel: string; fit: DiagnosticsView['fits']['outcome'] }) {
  const share = result.outcome.unit === 'share';
  const scale = share ? 100 : 1;
  return (
    <BinnedScatterChart
      bins={binPoints(result.bins, 'outcome', cutoff, scale)}
      fits={fitLines(fit, cutoff, scale)}
      limits={limitPoints(result.limits, 'outcome', cutoff, scale)}
      cutoff={cutoff}
      xLegend={scoreLabel}
      yLegend={share ? `${result.outcome.label} (%)` : `${result.outcome.unit}`}
      formatY={(v) => (share ? `${formatNumber(v, 0)}%` : formatNumber(v, 1))}
    />
  );
}

export function TakeUpScatter({ result, cutoff, scoreLabel, fit }: { result: OutcomeResultDetailDto; cutoff: number; scoreLabel: string; fit: DiagnosticsView['fits']['takeUp'] }) {
  return (
    <BinnedScatterChart
      bins={binPoints(result.bins, 'takeUp', cutoff, 100)}
      fits={fitLines(fit, cutoff, 100)}
      limits={limitPoints(result.limits, 'takeUp', cutoff, 100)}
      cutoff={cutoff}
      xLegend={scoreLabel}
      yLegend="took part (%)"
      formatY={(v) => `${formatNumber(v, 0)}%`}
      yRange={{ min: 0, max: 100 }}
    />
  );
}

export function DensityPlot({ density, cutoff, scoreLabel }: { density: NonNullable<DiagnosticsView['density']>; cutoff: number; scoreLabel: string }) {
  const s = densitySeries(density, cutoff);
  return <DensityChart bars={s.bars} curves={s.curves} binWidth={s.binWidth} cutoff={cutoff} xLegend={scoreLabel} />;
}

/** Placebo cutoffs, bandwidths or donut radii against the estimate with intervals. */
export function AlternativesPlot({
  kind,
  diagnostics,
  result,
  cutoff,
}: {
  kind: 'placebo' | 'sensitivity' | 'donut';
  diagnostics: DiagnosticsView;
  result: OutcomeResultDetailDto;
  cutoff: number;
}) {
  const share = result.outcome.unit === 'share';
  const scale = share ? 100 : 1;
  const digits = share ? 0 : 1;
  const unit = jumpUnit(result.outcome);
  const at = (v: number | null) => (v === null ? null : v * scale);
  if (kind === 'placebo') {
    return (
      <IntervalChart
        items={diagnostics.placebo.map((r) => ({ id: `p${r.cutoff}`, label: `false cutoff ${r.cutoff}`, position: cutoff + r.cutoff, estimate: r.estimate * scale, low: at(r.ciLow), high: at(r.ciHigh), flagged: (r.pAdjusted ?? 1) < 0.05 }))}
        xLegend="false cutoff (score)"
        yLegend={`jump (${unit})`}
        formatX={(v) => formatNumber(v, 0)}
        formatY={(v) => formatNumber(v, digits)}
        reference={{ at: cutoff, label: 'real cutoff' }}
      />
    );
  }
  const rows = kind === 'sensitivity' ? diagnostics.sensitivity.map((r) => ({ key: r.h, r })) : diagnostics.donut.map((r) => ({ key: r.radius, r }));
  return (
    <IntervalChart
      items={rows.map(({ key, r }) => ({ id: `${kind}${key}`, label: String(key), position: key, estimate: r.estimate * scale, low: at(r.ciLow), high: at(r.ciHigh), highlight: kind === 'sensitivity' && 'multiple' in r && r.multiple === 1 }))}
      xLegend={kind === 'sensitivity' ? 'bandwidth (score units)' : 'donut radius (score units)'}
      yLegend={`effect (${unit})`}
      formatX={(v) => formatNumber(v, 1)}
      formatY={(v) => formatNumber(v, digits)}
      reference={kind === 'sensitivity' && result.bandwidth ? { at: result.bandwidth.h, label: 'chosen bandwidth' } : undefined}
    />
  );
}

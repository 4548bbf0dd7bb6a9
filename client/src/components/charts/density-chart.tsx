import { ResponsiveScatterPlot, type ScatterPlotLayerProps } from '@nivo/scatterplot';
import { ACCENT, CHART_THEME, INK } from './chart-theme';

type XY = { x: number; y: number };
type AnyScale = (v: number) => number;

/** The score's histogram around the cutoff (bars) with the smoothed density on each side (lines). */
export default function DensityChart({
  bars,
  curves,
  binWidth,
  cutoff,
  xLegend,
  height = 260,
}: {
  bars: Array<{ x: number; height: number; side: 'ineligible' | 'eligible' }>;
  curves: { ineligible: XY[]; eligible: XY[] };
  binWidth: number;
  cutoff: number;
  xLegend: string;
  height?: number;
}) {
  if (bars.length === 0) return <p className="py-8 text-sm text-ink-500">No density histogram was stored for this month.</p>;
  const yMax = Math.max(...bars.map((b) => b.height), ...curves.ineligible.map((c) => c.y), ...curves.eligible.map((c) => c.y));
  const Custom = ({ xScale, yScale }: ScatterPlotLayerProps<XY>) => {
    const x = xScale as unknown as AnyScale;
    const y = yScale as unknown as AnyScale;
    const path = (pts: XY[]) => pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.x)},${y(p.y)}`).join(' ');
    return (
      <g>
        {bars.map((b) => (
          <rect
            key={b.x}
            x={x(b.x - binWidth / 2)}
            y={y(b.height)}
            width={Math.max(1, x(b.x + binWidth / 2) - x(b.x - binWidth / 2) - 1)}
            height={y(0) - y(b.height)}
            fill={b.side === 'eligible' ? ACCENT : 'white'}
            fillOpacity={b.side === 'eligible' ? 0.35 : 1}
            stroke={b.side === 'eligible' ? ACCENT : INK}
            strokeOpacity={0.6}
          />
        ))}
        <path d={path(curves.ineligible)} fill="none" stroke={INK} strokeWidth={2} strokeDasharray="6 4" />
        <path d={path(curves.eligible)} fill="none" stroke={ACCENT} strokeWidth={2.25} />
      </g>
    );
  };
  const xs = bars.map((b) => b.x);
  return (
    <div style={{ height }}>
      <ResponsiveScatterPlot<XY>
        data={[{ id: 'd', data: [] }]}
        theme={CHART_THEME}
        margin={{ top: 24, right: 20, bottom: 48, left: 64 }}
        xScale={{ type: 'linear', min: Math.min(...xs) - binWidth, max: Math.max(...xs) + binWidth }}
        yScale={{ type: 'linear', min: 0, max: yMax * 1.1 }}
        axisBottom={{ tickSize: 4, tickValues: 7, legend: xLegend, legendPosition: 'middle', legendOffset: 38 }}
        axisLeft={{ tickSize: 4, tickValues: 5, format: (v: number) => v.toFixed(3), legend: 'density per score unit', legendPosition: 'middle', legendOffset: -54 }}
        markers={[{ axis: 'x', value: cutoff, legend: `cutoff ${cutoff}`, legendPosition: 'top-left', lineStyle: { stroke: INK, strokeWidth: 1.5, strokeDasharray: '2 2' } }]}
        layers={['grid', 'axes', 'markers', Custom]}
        animate={false}
        isInteractive={false}
      />
    </div>
  );
}

import { ResponsiveScatterPlot, type ScatterPlotLayerProps } from '@nivo/scatterplot';
import { ACCENT, CHART_THEME, INK } from './chart-theme';

type XY = { x: number; y: number };
type Side<T> = { ineligible: T[]; eligible: T[] };
type Datum = XY & { n?: number };
type AnyScale = (v: number) => number;

/**
 * Bin means against the score either side of the cutoff, the fitted local polynomials and the
 * cutoff line. Sides differ by shape (open circles below the cutoff, filled squares eligible) and
 * line style, not only colour.
 */
export default function BinnedScatterChart({
  bins,
  fits,
  limits,
  cutoff,
  xLegend,
  yLegend,
  formatY,
  yRange,
  height = 300,
}: {
  bins: Side<Datum>;
  fits: Side<XY>;
  limits: { ineligible: XY | null; eligible: XY | null };
  cutoff: number;
  xLegend: string;
  yLegend: string;
  formatY: (v: number) => string;
  yRange?: { min: number; max: number };
  height?: number;
}) {
  const all = [...bins.ineligible, ...bins.eligible, ...fits.ineligible, ...fits.eligible];
  if (all.length === 0) return <p className="py-8 text-sm text-ink-500">No binned data were stored for this month.</p>;
  const ys = all.map((p) => p.y);
  const yMin = yRange?.min ?? Math.min(...ys);
  const yMax = yRange?.max ?? Math.max(...ys);
  const yPad = yRange ? 0 : (yMax - yMin || 1) * 0.08;
  const Custom = ({ xScale, yScale }: ScatterPlotLayerProps<Datum>) => {
    const x = xScale as unknown as AnyScale;
    const y = yScale as unknown as AnyScale;
    const path = (pts: XY[]) => pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.x)},${y(p.y)}`).join(' ');
    return (
      <g>
        <path d={path(fits.ineligible)} fill="none" stroke={INK} strokeWidth={2} strokeDasharray="6 4" />
        <path d={path(fits.eligible)} fill="none" stroke={ACCENT} strokeWidth={2.25} />
        {bins.ineligible.map((p) => (
          <circle key={`i${p.x}`} cx={x(p.x)} cy={y(p.y)} r={3.5} fill="white" stroke={INK} strokeWidth={1.5} />
        ))}
        {bins.eligible.map((p) => (
          <rect key={`e${p.x}`} x={x(p.x) - 3.5} y={y(p.y) - 3.5} width={7} height={7} fill={ACCENT} />
        ))}
        {limits.ineligible ? <circle cx={x(limits.ineligible.x)} cy={y(limits.ineligible.y)} r={5} fill="white" stroke={INK} strokeWidth={2} /> : null}
        {limits.eligible ? <circle cx={x(limits.eligible.x)} cy={y(limits.eligible.y)} r={5} fill={ACCENT} stroke="white" strokeWidth={1.5} /> : null}
      </g>
    );
  };
  return (
    <div style={{ height }}>
      <ResponsiveScatterPlot<Datum>
        data={[{ id: 'bins', data: [...bins.ineligible, ...bins.eligible] }]}
        theme={CHART_THEME}
        margin={{ top: 24, right: 20, bottom: 48, left: 64 }}
        xScale={{ type: 'linear', min: 'auto', max: 'auto' }}
        yScale={{ type: 'linear', min: yMin - yPad, max: yMax + yPad }}
        axisBottom={{ tickSize: 4, tickValues: 7, legend: xLegend, legendPosition: 'middle', legendOffset: 38 }}
        axisLeft={{ tickSize: 4, tickValues: 5, format: (v: number) => formatY(v), legend: yLegend, legendPosition: 'middle', legendOffset: -54 }}
        markers={[{ axis: 'x', value: cutoff, legend: `cutoff ${cutoff}`, legendPosition: 'top-left', lineStyle: { stroke: INK, strokeWidth: 1.5, strokeDasharray: '2 2' } }]}
        layers={['grid', 'axes', 'markers', Custom]}
        animate={false}
        isInteractive={false}
      />
    </div>
  );
}

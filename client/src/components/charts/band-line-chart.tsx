import { ResponsiveLine, type LineCustomSvgLayerProps, type LineSeries } from '@nivo/line';
import { useId } from 'react';
import { ACCENT, BandPattern, CHART_THEME, INK, SERIOUS } from './chart-theme';

/** One line of a chart over months; an optional interval band drawn hatched behind it. */
export interface ChartLine {
  id: string;
  label: string;
  values: ReadonlyArray<number | null>;
  dashed?: boolean;
  band?: { low: ReadonlyArray<number | null>; high: ReadonlyArray<number | null> };
}

export interface BandLineChartProps {
  /** Month labels on the x axis (already formatted), one per value. */
  periods: readonly string[];
  lines: readonly ChartLine[];
  range: { min: number; max: number };
  yLegend: string;
  formatY: (v: number) => string;
  /** Vertical rules with a label, e.g. where the cutoff moved. */
  rules?: ReadonlyArray<{ at: string; label: string }>;
  /** Months to ring and mark "!" (also listed in words beside the chart). */
  flagged?: readonly string[];
  height?: number;
  /** Draw a horizontal rule at zero (jumps and effects). */
  zeroLine?: boolean;
}

type Series = LineSeries & { id: string; data: Array<{ x: string; y: number | null }> };

/**
 * Month-by-month lines with hatched interval bands, vertical rules and marked months (nivo line,
 * point x scale). Lines, bands and marks are custom layers so gaps stay gaps and dashes carry meaning.
 */
export default function BandLineChart({ periods, lines, range, yLegend, formatY, rules = [], flagged = [], height = 260, zeroLine = false }: BandLineChartProps) {
  const hatch = `hatch-${useId().replace(/:/g, '')}`;
  const data: Series[] = lines.map((l) => ({ id: l.id, data: periods.map((x, i) => ({ x, y: l.values[i] ?? null })) }));
  const everyNth = Math.max(1, Math.ceil(periods.length / 8));

  const Bands = ({ xScale, yScale }: LineCustomSvgLayerProps<Series>) => (
    <g>
      <BandPattern id={hatch} />
      {lines.map((l) => {
        if (!l.band) return null;
        return runs(periods.length, (i) => l.band!.low[i] != null && l.band!.high[i] != null).map(([a, b]) => {
          const top = [];
          const bottom = [];
          for (let i = a; i <= b; i++) {
            top.push(`${xScale(periods[i]!)},${yScale(l.band!.high[i]!)}`);
            bottom.unshift(`${xScale(periods[i]!)},${yScale(l.band!.low[i]!)}`);
          }
          if (a === b) {
            const x = xScale(periods[a]!);
            return <line key={`${l.id}-${a}`} x1={x} x2={x} y1={yScale(l.band!.low[a]!)} y2={yScale(l.band!.high[a]!)} stroke={ACCENT} strokeWidth={6} strokeOpacity={0.25} />;
          }
          return <polygon key={`${l.id}-${a}`} points={[...top, ...bottom].join(' ')} fill={`url(#${hatch})`} stroke={ACCENT} strokeOpacity={0.25} />;
        });
      })}
    </g>
  );
  const Zero = ({ yScale, innerWidth }: LineCustomSvgLayerProps<Series>) =>
    zeroLine && range.min < 0 && range.max > 0 ? <line x1={0} x2={innerWidth} y1={yScale(0)} y2={yScale(0)} stroke={INK} strokeWidth={1} /> : null;
  const Lines = ({ xScale, yScale }: LineCustomSvgLayerProps<Series>) => (
    <g>
      {lines.map((l, k) =>
        runs(periods.length, (i) => l.values[i] != null).map(([a, b]) => {
          const d = Array.from({ length: b - a + 1 }, (_, j) => `${j === 0 ? 'M' : 'L'}${xScale(periods[a + j]!)},${yScale(l.values[a + j]!)}`).join(' ');
          return <path key={`${l.id}-${a}`} d={d} fill="none" stroke={k === 0 ? ACCENT : INK} strokeWidth={2} strokeDasharray={l.dashed ? '5 4' : undefined} />;
        }),
      )}
      {lines.map((l, k) =>
        periods.map((p, i) =>
          l.values[i] == null ? null : (
            <circle key={`${l.id}-${p}`} cx={xScale(p)} cy={yScale(l.values[i]!)} r={3} fill={l.dashed ? 'white' : k === 0 ? ACCENT : INK} stroke={k === 0 ? ACCENT : INK} strokeWidth={1.5} />
          ),
        ),
      )}
    </g>
  );
  const Flags = ({ xScale, yScale }: LineCustomSvgLayerProps<Series>) => {
    const main = lines[0];
    if (!main) return null;
    return (
      <g>
        {flagged.map((p) => {
          const i = periods.indexOf(p);
          const v = main.values[i];
          if (i < 0 || v == null) return null;
          const x = xScale(p);
          const y = yScale(v);
          return (
            <g key={p}>
              <circle cx={x} cy={y} r={7} fill="none" stroke={SERIOUS} strokeWidth={2} />
              <text x={x} y={y - 11} textAnchor="middle" fontSize={12} fontWeight={600} fill={SERIOUS}>
                !
              </text>
            </g>
          );
        })}
      </g>
    );
  };
  return (
    <div style={{ height }}>
      <ResponsiveLine<Series>
        data={data}
        theme={CHART_THEME}
        margin={{ top: 24, right: 16, bottom: 44, left: 64 }}
        xScale={{ type: 'point' }}
        yScale={{ type: 'linear', min: range.min, max: range.max }}
        axisBottom={{ tickValues: periods.filter((_, i) => i % everyNth === 0), tickSize: 4, tickPadding: 6 }}
        axisLeft={{ tickSize: 4, tickPadding: 6, tickValues: 5, format: (v: number) => formatY(v), legend: yLegend, legendPosition: 'middle', legendOffset: -54 }}
        enableGridX={false}
        gridYValues={5}
        markers={rules.map((r) => ({ axis: 'x' as const, value: r.at, legend: r.label, legendPosition: 'top-right' as const, lineStyle: { stroke: INK, strokeDasharray: '2 3', strokeWidth: 1 } }))}
        layers={['grid', 'markers', 'axes', Bands, Zero, Lines, Flags, 'mesh']}
        useMesh
        animate={false}
        tooltip={({ point }) => (
          <div className="rounded border border-rule bg-white px-2 py-1 text-xs shadow">
            <strong>{String(point.data.x)}</strong> · {lines.find((l) => l.id === point.seriesId)?.label}: {point.data.y == null ? '—' : formatY(Number(point.data.y))}
          </div>
        )}
        role="img"
      />
    </div>
  );
}

/** Maximal runs [first, last] of consecutive indices where `ok` holds. */
function runs(n: number, ok: (i: number) => boolean): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  let start = -1;
  for (let i = 0; i <= n; i++) {
    if (i < n && ok(i)) {
      if (start < 0) start = i;
    } else if (start >= 0) {
      out.push([start, i - 1]);
      start = -1;
    }
  }
  return out;
}

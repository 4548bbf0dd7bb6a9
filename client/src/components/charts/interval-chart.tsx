import { ResponsiveScatterPlot, type ScatterPlotLayerProps } from '@nivo/scatterplot';
import { ACCENT, CHART_THEME, INK, SERIOUS } from './chart-theme';

/** An estimate with its interval; `flagged` ones are drawn open with a "!" (and say so in `label`). */
export interface IntervalItem {
  id: string;
  label: string;
  estimate: number;
  low: number | null;
  high: number | null;
  /** Horizontal position in vertical mode (e.g. a placebo cutoff or a bandwidth), score units. */
  position?: number;
  flagged?: boolean;
  /** Drawn in the accent, e.g. the main estimate among alternatives. */
  highlight?: boolean;
}

type Datum = { x: number; y: number; item: IntervalItem };
type AnyScale = (v: number) => number;

/**
 * Estimates with interval whiskers. Without positions: one row per item (a forest plot, value on
 * x). With positions: value on y against the position on x (placebo cutoffs, bandwidths, donuts),
 * with an optional reference rule (the real cutoff, the chosen bandwidth).
 */
export default function IntervalChart({
  items,
  xLegend,
  yLegend,
  formatX,
  formatY = formatX,
  reference,
  height,
}: {
  items: readonly IntervalItem[];
  xLegend: string;
  yLegend?: string;
  formatX: (v: number) => string;
  formatY?: (v: number) => string;
  reference?: { at: number; label: string };
  height?: number;
}) {
  const vertical = items.every((i) => i.position !== undefined);
  const data: Datum[] = items.map((item, k) => (vertical ? { x: item.position!, y: item.estimate, item } : { x: item.estimate, y: items.length - k, item }));
  const values = items.flatMap((i) => [i.estimate, i.low, i.high]).filter((v): v is number => v !== null && Number.isFinite(v));
  const vMin = Math.min(0, ...values);
  const vMax = Math.max(0, ...values);
  const pad = (vMax - vMin || 1) * 0.08;
  const positions = items.map((i) => i.position ?? 0);
  const pMin = Math.min(...positions, reference?.at ?? Infinity);
  const pMax = Math.max(...positions, reference?.at ?? -Infinity);
  const pPad = (pMax - pMin || 1) * 0.08;

  const Whiskers = ({ xScale, yScale }: ScatterPlotLayerProps<Datum>) => {
    const xs = xScale as unknown as AnyScale;
    const ys = yScale as unknown as AnyScale;
    return (
      <g>
        {data.map((d) => {
          const color = d.item.flagged ? SERIOUS : d.item.highlight ? ACCENT : INK;
          const lo = d.item.low;
          const hi = d.item.high;
          const [x, y] = [xs(d.x), ys(d.y)];
          const whisker =
            lo === null || hi === null ? null : vertical ? (
              <line x1={x} x2={x} y1={ys(lo)} y2={ys(hi)} stroke={color} strokeWidth={1.5} />
            ) : (
              <line x1={xs(lo)} x2={xs(hi)} y1={y} y2={y} stroke={color} strokeWidth={1.5} />
            );
          return (
            <g key={d.item.id}>
              {whisker}
              {d.item.flagged ? <circle cx={x} cy={y} r={5} fill="white" stroke={color} strokeWidth={2} /> : <rect x={x - 4} y={y - 4} width={8} height={8} fill={color} />}
              {d.item.flagged ? (
                <text x={x} y={y - 9} textAnchor="middle" fontSize={12} fontWeight={600} fill={SERIOUS}>
                  !
                </text>
              ) : null}
            </g>
          );
        })}
      </g>
    );
  };
  const Zero = ({ xScale, yScale, innerWidth, innerHeight }: ScatterPlotLayerProps<Datum>) => {
    const xs = xScale as unknown as AnyScale;
    const ys = yScale as unknown as AnyScale;
    return vertical ? <line x1={0} x2={innerWidth} y1={ys(0)} y2={ys(0)} stroke={INK} /> : <line x1={xs(0)} x2={xs(0)} y1={0} y2={innerHeight} stroke={INK} />;
  };
  const labels = new Map(data.map((d) => [d.y, d.item.label]));
  return (
    <div style={{ height: height ?? (vertical ? 240 : 60 + 44 * items.length) }}>
      <ResponsiveScatterPlot<Datum>
        data={[{ id: 'estimates', data }]}
        theme={CHART_THEME}
        margin={{ top: 20, right: 24, bottom: 48, left: vertical ? 64 : 190 }}
        xScale={vertical ? { type: 'linear', min: pMin - pPad, max: pMax + pPad } : { type: 'linear', min: vMin - pad, max: vMax + pad }}
        yScale={vertical ? { type: 'linear', min: vMin - pad, max: vMax + pad } : { type: 'linear', min: 0.4, max: items.length + 0.6 }}
        axisBottom={{ tickSize: 4, tickValues: 6, format: (v: number) => formatX(v), legend: xLegend, legendPosition: 'middle', legendOffset: 38 }}
        axisLeft={
          vertical
            ? { tickSize: 4, tickValues: 5, format: (v: number) => formatY(v), legend: yLegend, legendPosition: 'middle', legendOffset: -54 }
            : { tickSize: 0, tickPadding: 8, tickValues: data.map((d) => d.y), format: (v: number) => labels.get(v) ?? '' }
        }
        enableGridX={!vertical}
        enableGridY={vertical}
        markers={reference ? [{ axis: 'x', value: reference.at, legend: reference.label, lineStyle: { stroke: INK, strokeDasharray: '3 3' }, legendPosition: 'top-left' }] : []}
        layers={['grid', 'axes', 'markers', Zero, Whiskers]}
        animate={false}
        isInteractive={false}
      />
    </div>
  );
}

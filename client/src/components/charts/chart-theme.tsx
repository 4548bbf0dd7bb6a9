import type { PartialTheme } from '@nivo/theming';

/** The charts' calm look: ink on paper, IBM Plex, thin rules; the one accent carries the estimate. */
export const CHART_THEME: PartialTheme = {
  text: { fontFamily: 'IBM Plex Sans, ui-sans-serif, sans-serif', fontSize: 11, fill: 'oklch(0.38 0.012 85)' },
  axis: {
    domain: { line: { stroke: 'oklch(0.78 0.008 85)', strokeWidth: 1 } },
    ticks: { line: { stroke: 'oklch(0.78 0.008 85)' }, text: { fill: 'oklch(0.38 0.012 85)' } },
    legend: { text: { fill: 'oklch(0.38 0.012 85)', fontSize: 11 } },
  },
  grid: { line: { stroke: 'oklch(0.93 0.006 85)', strokeWidth: 1 } },
  markers: { lineColor: 'oklch(0.38 0.012 85)', lineStrokeWidth: 1 },
  tooltip: { container: { background: 'white', fontSize: 12, borderRadius: 4, boxShadow: '0 1px 4px rgba(0,0,0,0.15)' } },
};

export const ACCENT = 'oklch(0.42 0.07 180)';
export const INK = 'oklch(0.38 0.012 85)';
export const SERIOUS = 'oklch(0.5 0.16 30)';

/** Hatched fill for interval bands: the pattern (not only the tint) says "interval". */
export function BandPattern({ id, color = ACCENT }: { id: string; color?: string }) {
  return (
    <defs>
      <pattern id={id} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
        <rect width="6" height="6" fill={color} fillOpacity={0.08} />
        <line x1="0" y1="0" x2="0" y2="6" stroke={color} strokeOpacity={0.35} strokeWidth="1.5" />
      </pattern>
    </defs>
  );
}

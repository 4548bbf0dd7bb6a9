/**
 * A small trend line without axes (plain SVG, so the first screen needs no chart library). Gaps
 * where a value is missing; a dashed zero line when zero is in range; months marked `flagged`
 * get a ring (their months are also named in `label`, so the mark is not the only signal).
 */
export function Sparkline({ values, flagged = [], label, width = 160, height = 36 }: { values: ReadonlyArray<number | null>; flagged?: readonly number[]; label: string; width?: number; height?: number }) {
  const known = values.filter((v): v is number => v !== null && Number.isFinite(v));
  if (known.length < 2) return <span className="text-xs text-ink-500">Too few months for a trend line.</span>;
  const min = Math.min(...known, 0);
  const max = Math.max(...known, 0);
  const pad = 4;
  const x = (i: number) => pad + (i * (width - 2 * pad)) / Math.max(1, values.length - 1);
  const y = (v: number) => pad + ((max - v) * (height - 2 * pad)) / (max - min || 1);
  const segments: string[] = [];
  let current = '';
  values.forEach((v, i) => {
    if (v === null || !Number.isFinite(v)) {
      if (current) segments.push(current);
      current = '';
      return;
    }
    current += `${current ? ' L' : 'M'}${x(i).toFixed(1)},${y(v).toFixed(1)}`;
  });
  if (current) segments.push(current);
  return (
    <svg role="img" aria-label={label} width={width} height={height} viewBox={`0 0 ${width} ${height}`} className="overflow-visible">
      {min < 0 && max > 0 ? <line x1={pad} x2={width - pad} y1={y(0)} y2={y(0)} stroke="var(--color-ink-300)" strokeDasharray="2 3" /> : null}
      {segments.map((d) => (
        <path key={d} d={d} fill="none" stroke="var(--color-accent-700)" strokeWidth={1.75} strokeLinejoin="round" />
      ))}
      {flagged.map((i) => {
        const v = values[i];
        return v === null || v === undefined ? null : <circle key={i} cx={x(i)} cy={y(v)} r={3.5} fill="white" stroke="var(--color-serious)" strokeWidth={1.5} />;
      })}
      {(() => {
        const last = values.length - 1;
        const v = values[last];
        return v === null || v === undefined ? null : <circle cx={x(last)} cy={y(v)} r={2.5} fill="var(--color-accent-700)" />;
      })()}
    </svg>
  );
}

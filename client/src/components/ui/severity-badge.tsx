import type { CaveatSeverity } from '@shared/api/results';

const LABEL: Record<CaveatSeverity, string> = { info: 'Note', caution: 'Caution', serious: 'Serious' };

/** Never colour alone: each severity has its word, a glyph and a border style (solid, dashed, double). */
const STYLE: Record<CaveatSeverity, string> = {
  info: 'border border-info text-ink-700',
  caution: 'border border-dashed border-caution bg-caution-50 text-ink-900',
  serious: 'border-[3px] border-double border-serious bg-serious-50 text-ink-900',
};
const GLYPH: Record<CaveatSeverity, string> = { info: 'i', caution: '△', serious: '!' };

export const severityLabel = (s: CaveatSeverity): string => LABEL[s];

export function SeverityBadge({ severity }: { severity: CaveatSeverity }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-xs font-medium whitespace-nowrap ${STYLE[severity]}`}>
      <span aria-hidden className="font-semibold">
        {GLYPH[severity]}
      </span>
      {LABEL[severity]}
    </span>
  );
}

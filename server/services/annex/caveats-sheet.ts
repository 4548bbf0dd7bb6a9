import type { CaveatDto } from '@shared/api/results';
import { CAVEAT_RULES } from '@shared/caveats';
import type { AnnexContent, AnnexResult } from './annex-content';
import { SheetBuilder, type ColumnSpec } from './sheet-model';

interface CaveatRow {
  r: AnnexResult;
  c: CaveatDto;
}

/** The figures that fired a caveat, as `name = value; …` (the same numbers its message uses). */
export function triggerValues(values: CaveatDto['values']): string {
  return Object.entries(values)
    .map(([k, v]) => `${k} = ${v === null ? 'none' : String(v)}`)
    .join('; ');
}

const ruleOf = (code: string) => CAVEAT_RULES.find((rule) => rule.code === code);

const COLUMNS: Array<ColumnSpec<CaveatRow>> = [
  { header: 'Scope', value: (x) => x.r.result.scope.key },
  { header: 'Outcome', value: (x) => x.r.result.outcome.key },
  { header: 'Code', value: (x) => x.c.code },
  { header: 'Severity', value: (x) => x.c.severity },
  { header: 'Standing (always shown)', value: (x) => ruleOf(x.c.code)?.standing ?? null },
  { header: 'Trigger values', value: (x) => triggerValues(x.c.values), wrap: true },
  { header: 'Rule (when it fires)', value: (x) => ruleOf(x.c.code)?.trigger ?? null, wrap: true },
  { header: 'Message', value: (x) => x.c.message, wrap: true },
  {
    header: 'Acknowledged by a manager',
    wrap: true,
    value: (x) =>
      (x.r.result.acknowledgements ?? [])
        .filter((a) => a.caveatCode === x.c.code)
        .map((a) => `${a.acknowledgedAt.slice(0, 10)} ${a.acknowledgedBy}: ${a.comment}`)
        .join(' | ') || null,
  },
];

/** Caveats: every caveat of every result, with its code, severity, the figures behind it, the rule and the text. */
export function caveatsSheet(content: AnnexContent): SheetBuilder {
  const rows = content.results.flatMap((r) => r.result.caveats.map((c) => ({ r, c })));
  return new SheetBuilder('Caveats').singleTable(COLUMNS, rows, 3);
}

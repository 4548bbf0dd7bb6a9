import type { ColumnMapping } from '../schemas/extract';
import { findColumn, normaliseColumnName } from './column-names';

interface Definition {
  key: string;
  label: string;
}

/**
 * Names that usually mark a role's column (English exports; a guess, always shown for review):
 * `exact` names first, then `partial` fragments of a name.
 */
const HINTS: Record<'subjectId' | 'score' | 'takeUp' | 'applicationDate' | 'periodColumn' | 'cluster', { exact: string[]; partial: string[] }> = {
  subjectId: { exact: ['id', 'case', 'case number', 'case no', 'case no.'], partial: ['case number', 'case no', 'case_number', 'case id', 'case_id', 'case ref', 'applicant id', 'subject id', 'household id'] },
  score: { exact: ['score'], partial: ['score', 'index', 'points', 'rank'] },
  takeUp: { exact: ['take-up', 'take up', 'take_up', 'takeup'], partial: ['take up', 'take_up', 'takeup', 'enrolled', 'received', 'taken', 'participat', 'paid'] },
  applicationDate: { exact: ['date'], partial: ['application date', 'application_date', 'date applied', 'applied', 'date'] },
  // "month" alone is too common inside other names ("months in arrears") to be a fragment.
  periodColumn: { exact: ['period', 'cohort', 'month', 'cohort month'], partial: ['period', 'cohort'] },
  cluster: { exact: ['office', 'cluster', 'site'], partial: ['office', 'cluster', 'caseworker', 'region', 'site'] },
};

/**
 * A first guess of the mapping from column names, for a header Cutline has not seen before:
 * outcome and covariate keys or labels matched by name, roles by common name fragments. Columns
 * are used at most once. The analyst reviews every choice before anything is checked.
 */
export function guessMapping(
  columns: readonly string[],
  outcomes: readonly Definition[],
  covariates: readonly Definition[],
): Partial<ColumnMapping> {
  const used = new Set<number>();
  const take = (index: number): string | undefined => {
    if (index < 0 || used.has(index)) return undefined;
    used.add(index);
    return columns[index];
  };
  const byDefinition = (d: Definition) => {
    const exact = findColumn(columns, d.key);
    return take(exact >= 0 ? exact : findColumn(columns, d.label));
  };
  const outcomeMap: Record<string, string> = {};
  for (const o of outcomes) {
    const c = byDefinition(o);
    if (c) outcomeMap[o.key] = c;
  }
  const covariateMap: Record<string, string> = {};
  for (const c of covariates) {
    const col = byDefinition(c);
    if (col) covariateMap[c.key] = col;
  }
  const byHint = (hints: { exact: string[]; partial: string[] }) => {
    const names = columns.map(normaliseColumnName);
    for (const hint of hints.exact) {
      const exact = names.findIndex((n, i) => !used.has(i) && n === hint);
      if (exact >= 0) return take(exact);
    }
    for (const hint of hints.partial) {
      const partial = names.findIndex((n, i) => !used.has(i) && n.includes(hint));
      if (partial >= 0) return take(partial);
    }
    return undefined;
  };
  const guess: Partial<ColumnMapping> = { outcomes: outcomeMap, covariates: covariateMap };
  for (const role of ['subjectId', 'score', 'takeUp', 'applicationDate', 'periodColumn', 'cluster'] as const) {
    const column = byHint(HINTS[role]);
    if (column) guess[role] = column;
  }
  return guess;
}

import type { ErrorCode } from '@shared/errors';
import type { ColumnMapping } from '@shared/schemas/extract';
import type { VariableKind } from '@shared/schemas/program';
import { isBlank, type Cell } from './cells';
import { monthPeriod, parseDateMonth, parseNumber, parsePeriodCell, type NumberProblem } from './values';

/** The mapping with columns resolved to positions in the row, and what each value must satisfy. */
export interface RowRules {
  period: string;
  /** `period` as a month index (values.ts), compared with each application date's month. */
  periodMonth: number;
  scoreMin: number;
  scoreMax: number;
  headerLength: number;
  /** CSV rows must have as many fields as the header; XLSX rows may end early (blank trailing cells). */
  strictFieldCount: boolean;
  mapping: ColumnMapping;
  columns: string[];
  subjectId: number;
  score: number;
  takeUp: number | null;
  /** Take-up codes, lower-cased. */
  takeUpYes: ReadonlySet<string>;
  takeUpNo: ReadonlySet<string>;
  periodColumn: number | null;
  applicationDate: number | null;
  cluster: number | null;
  /** Slot order: `outcomes[i]` fills slot o(i+1). */
  outcomes: Array<{ key: string; column: number; kind: VariableKind }>;
  covariates: Array<{ key: string; column: number | null; kind: VariableKind }>;
}

/**
 * The values of a row that passed, written in place (one instance is reused for every row, so
 * checking allocates nothing per row but the strings it must keep). NaN marks a blank optional value.
 */
export class RowValues {
  subject = '';
  score = 0;
  takeUp: 0 | 1 | null = null;
  cluster: string | null = null;
  readonly outcomes: Float64Array;
  readonly covariates: Float64Array;
  constructor(rules: RowRules) {
    this.outcomes = new Float64Array(rules.outcomes.length);
    this.covariates = new Float64Array(rules.covariates.length);
  }
}

export interface RowProblem {
  code: ErrorCode;
  /** Column name, or null for whole-row problems. */
  column: string | null;
  reason: string;
  /** The offending cell for the report; never set for the subject identifier. */
  cell: Cell | null;
  /** For take-up codes and out-of-period months: the value that the summary may quote. */
  quoted?: string;
}

/**
 * Checks one row against the rules and fills `out` with its values.
 * @returns null when the row passes, else its first problem
 */
export function checkRow(rules: RowRules, cells: Cell[], out: RowValues): RowProblem | null {
  if (rules.strictFieldCount && cells.length !== rules.headerLength) {
    return problem('extract_row_malformed', null, `The row has ${cells.length} fields but the header has ${rules.headerLength}.`, null);
  }

  const subjectCell = cells[rules.subjectId];
  if (isBlank(subjectCell)) return problem('extract_subject_missing', col(rules, rules.subjectId), 'The subject identifier is blank.', null);
  out.subject = String(subjectCell instanceof Date ? subjectCell.toISOString() : subjectCell).trim();

  const decimal = rules.mapping.decimalSeparator;
  const scoreCell = cells[rules.score] ?? null;
  const score = parseNumber(scoreCell, decimal);
  if (typeof score !== 'number') return numberProblem(score, col(rules, rules.score), scoreCell, true);
  if (score < rules.scoreMin || score > rules.scoreMax) {
    return problem('extract_score_out_of_range', col(rules, rules.score), `The score is outside the program's range of ${rules.scoreMin} to ${rules.scoreMax}.`, scoreCell);
  }
  out.score = score;

  out.takeUp = null;
  if (rules.takeUp !== null) {
    const cell = cells[rules.takeUp] ?? null;
    if (isBlank(cell)) return problem('extract_value_missing', col(rules, rules.takeUp), 'Take-up is blank.', null);
    const code = (cell instanceof Date ? '' : String(cell)).trim().toLowerCase();
    if (rules.takeUpYes.has(code)) out.takeUp = 1;
    else if (rules.takeUpNo.has(code)) out.takeUp = 0;
    else {
      const p = problem('extract_take_up_unknown', col(rules, rules.takeUp), 'The take-up code is not one of the codes listed for "took up" or "did not".', cell);
      p.quoted = code.slice(0, 20);
      return p;
    }
  }

  if (rules.periodColumn !== null) {
    const cell = cells[rules.periodColumn] ?? null;
    const period = parsePeriodCell(cell);
    if (period === null) return problem('extract_date_invalid', col(rules, rules.periodColumn), 'The cohort period is not a month written YYYY-MM.', cell);
    if (period !== rules.period) {
      const p = problem('extract_period_mismatch', col(rules, rules.periodColumn), `The row belongs to ${period}, not ${rules.period}.`, cell);
      p.quoted = period;
      return p;
    }
  }
  if (rules.applicationDate !== null) {
    const cell = cells[rules.applicationDate] ?? null;
    const month = parseDateMonth(cell, rules.mapping.dateFormat);
    if (month === 'missing') return problem('extract_value_missing', col(rules, rules.applicationDate), 'The application date is blank.', null);
    if (month === 'invalid') {
      return problem('extract_date_invalid', col(rules, rules.applicationDate), `The application date is not a date written ${rules.mapping.dateFormat}.`, cell);
    }
    if (month !== rules.periodMonth) {
      const p = problem('extract_date_outside_period', col(rules, rules.applicationDate), `The application date falls outside ${rules.period}.`, cell);
      p.quoted = monthPeriod(month);
      return p;
    }
  }

  for (let i = 0; i < rules.outcomes.length; i++) {
    const o = rules.outcomes[i]!;
    const bad = optionalValue(cells[o.column] ?? null, o.kind, rules, o.column, out.outcomes, i);
    if (bad) return bad;
  }
  for (let i = 0; i < rules.covariates.length; i++) {
    const c = rules.covariates[i]!;
    if (c.column === null) {
      out.covariates[i] = Number.NaN;
      continue;
    }
    const bad = optionalValue(cells[c.column] ?? null, c.kind, rules, c.column, out.covariates, i);
    if (bad) return bad;
  }
  const clusterCell = rules.cluster === null ? null : (cells[rules.cluster] ?? null);
  out.cluster = isBlank(clusterCell) ? null : String(clusterCell instanceof Date ? clusterCell.toISOString() : clusterCell).trim();
  return null;
}

/** Outcomes and covariates may be blank (missing); a value present must be a finite number, 0/1 when binary. */
function optionalValue(cell: Cell, kind: VariableKind, rules: RowRules, column: number, into: Float64Array, at: number): RowProblem | null {
  const value = parseNumber(cell, rules.mapping.decimalSeparator);
  if (typeof value !== 'number') {
    if (value === 'missing') {
      into[at] = Number.NaN;
      return null;
    }
    return numberProblem(value, col(rules, column), cell, false);
  }
  if (kind === 'binary' && value !== 0 && value !== 1) {
    const name = col(rules, column);
    return problem('extract_value_not_binary', name, `'${name}' is a yes/no value and must be 0 or 1.`, cell);
  }
  into[at] = value;
  return null;
}

function numberProblem(kind: NumberProblem, column: string, cell: Cell, required: boolean): RowProblem | null {
  if (kind === 'missing') return required ? problem('extract_value_missing', column, `'${column}' is blank.`, null) : null;
  if (kind === 'not-finite') return problem('extract_value_not_finite', column, `'${column}' is not a finite number (NaN or infinity).`, cell);
  return problem('extract_value_not_numeric', column, `'${column}' is not a number.`, cell);
}

function col(rules: RowRules, i: number): string {
  return rules.columns[i] ?? `column ${i + 1}`;
}

function problem(code: ErrorCode, column: string | null, reason: string, cell: Cell | null): RowProblem {
  return { code, column, reason, cell };
}

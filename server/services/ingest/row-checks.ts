import type { ErrorCode } from '@shared/errors';
import type { ColumnMapping } from '@shared/schemas/extract';
import type { VariableKind } from '@shared/schemas/program';
import { isBlank, type Cell } from './cells';
import { parseDate, parseNumber, parsePeriodCell } from './values';

/** The mapping with columns resolved to positions in the row, and what each value must satisfy. */
export interface RowRules {
  period: string;
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

/** A row that passed: values in slot order, NaN where an optional value is blank. */
export interface CheckedRow {
  ok: true;
  subject: string;
  score: number;
  takeUp: 0 | 1 | null;
  cluster: string | null;
  outcomes: number[];
  covariates: number[];
}

export interface RowProblem {
  ok: false;
  code: ErrorCode;
  /** Column name, or null for whole-row problems. */
  column: string | null;
  reason: string;
  /** The offending cell for the report; never set for the subject identifier. */
  cell: Cell | null;
  /** For take-up codes and out-of-period months: the value that the summary may quote. */
  quoted?: string;
}

/** Checks one row against the rules; the first problem found rejects the row. */
export function checkRow(rules: RowRules, cells: Cell[]): CheckedRow | RowProblem {
  if (rules.strictFieldCount && cells.length !== rules.headerLength) {
    return problem('extract_row_malformed', null, `The row has ${cells.length} fields but the header has ${rules.headerLength}.`, null);
  }
  const col = (i: number) => rules.columns[i] ?? `column ${i + 1}`;

  const subjectCell = cells[rules.subjectId];
  if (isBlank(subjectCell)) return problem('extract_subject_missing', col(rules.subjectId), 'The subject identifier is blank.', null);
  const subject = String(subjectCell instanceof Date ? subjectCell.toISOString() : subjectCell).trim();

  const decimal = rules.mapping.decimalSeparator;
  const scoreCell = cells[rules.score] ?? null;
  const score = parseNumber(scoreCell, decimal);
  if (!score.ok) return numberProblem(score.problem, col(rules.score), scoreCell, true);
  if (score.value < rules.scoreMin || score.value > rules.scoreMax) {
    return problem('extract_score_out_of_range', col(rules.score), `The score is outside the program's range of ${rules.scoreMin} to ${rules.scoreMax}.`, scoreCell);
  }

  let takeUp: 0 | 1 | null = null;
  if (rules.takeUp !== null) {
    const cell = cells[rules.takeUp] ?? null;
    if (isBlank(cell)) return problem('extract_value_missing', col(rules.takeUp), 'Take-up is blank.', null);
    const code = (cell instanceof Date ? '' : String(cell)).trim().toLowerCase();
    if (rules.takeUpYes.has(code)) takeUp = 1;
    else if (rules.takeUpNo.has(code)) takeUp = 0;
    else {
      return { ...problem('extract_take_up_unknown', col(rules.takeUp), 'The take-up code is not one of the codes listed for "took up" or "did not".', cell), quoted: code.slice(0, 20) };
    }
  }

  if (rules.periodColumn !== null) {
    const cell = cells[rules.periodColumn] ?? null;
    const period = parsePeriodCell(cell);
    if (period === null) return problem('extract_date_invalid', col(rules.periodColumn), 'The cohort period is not a month written YYYY-MM.', cell);
    if (period !== rules.period) {
      return { ...problem('extract_period_mismatch', col(rules.periodColumn), `The row belongs to ${period}, not ${rules.period}.`, cell), quoted: period };
    }
  }
  if (rules.applicationDate !== null) {
    const cell = cells[rules.applicationDate] ?? null;
    const date = parseDate(cell, rules.mapping.dateFormat);
    if (!date.ok) {
      return date.problem === 'missing'
        ? problem('extract_value_missing', col(rules.applicationDate), 'The application date is blank.', null)
        : problem('extract_date_invalid', col(rules.applicationDate), `The application date is not a date written ${rules.mapping.dateFormat}.`, cell);
    }
    if (date.period !== rules.period) {
      return { ...problem('extract_date_outside_period', col(rules.applicationDate), `The application date falls outside ${rules.period}.`, cell), quoted: date.period };
    }
  }

  const outcomes: number[] = [];
  for (const o of rules.outcomes) {
    const value = optionalValue(cells[o.column] ?? null, o.kind, col(o.column), decimal);
    if (typeof value !== 'number') return value;
    outcomes.push(value);
  }
  const covariates: number[] = [];
  for (const c of rules.covariates) {
    if (c.column === null) {
      covariates.push(Number.NaN);
      continue;
    }
    const value = optionalValue(cells[c.column] ?? null, c.kind, col(c.column), decimal);
    if (typeof value !== 'number') return value;
    covariates.push(value);
  }
  const clusterCell = rules.cluster === null ? null : (cells[rules.cluster] ?? null);
  const cluster = isBlank(clusterCell) ? null : String(clusterCell instanceof Date ? clusterCell.toISOString() : clusterCell).trim();
  return { ok: true, subject, score: score.value, takeUp, cluster, outcomes, covariates };
}

/** Outcomes and covariates may be blank (stored as missing); a value present must be a finite number, 0/1 when binary. */
function optionalValue(cell: Cell, kind: VariableKind, column: string, decimal: '.' | ','): number | RowProblem {
  const parsed = parseNumber(cell, decimal);
  if (!parsed.ok) return parsed.problem === 'missing' ? Number.NaN : numberProblem(parsed.problem, column, cell, false);
  if (kind === 'binary' && parsed.value !== 0 && parsed.value !== 1) {
    return problem('extract_value_not_binary', column, `'${column}' is a yes/no value and must be 0 or 1.`, cell);
  }
  return parsed.value;
}

function numberProblem(kind: 'missing' | 'not-numeric' | 'not-finite', column: string, cell: Cell, required: boolean): RowProblem {
  if (kind === 'missing' && required) return problem('extract_value_missing', column, `'${column}' is blank.`, null);
  if (kind === 'not-finite') return problem('extract_value_not_finite', column, `'${column}' is not a finite number (NaN or infinity).`, cell);
  return problem('extract_value_not_numeric', column, `'${column}' is not a number.`, cell);
}

function problem(code: ErrorCode, column: string | null, reason: string, cell: Cell | null): RowProblem {
  return { ok: false, code, column, reason, cell };
}

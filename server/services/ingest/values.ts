import type { DateFormat } from '@shared/schemas/extract';
import type { Cell } from './cells';

/** Why a cell is not a usable number. Blank cells are `missing`. */
export type NumberProblem = 'missing' | 'not-numeric' | 'not-finite';

const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(?:nan|inf|infinity|∞)$|^#(?:num!|div\/0!)$/i;

/**
 * Reads a number from a cell (called for every value of every row, so it allocates nothing: the
 * answer is the number or the problem's name). Text must be a plain decimal number, optionally with
 * an exponent; with `decimalSeparator` ',' the comma is the decimal mark ("2,5"). No thousands
 * separators, currency signs or units: those are refused rather than guessed.
 * @example parseNumber('2,5', ',') // => 2.5
 * @example parseNumber('NaN', '.') // => 'not-finite'
 */
export function parseNumber(cell: Cell | undefined, decimalSeparator: '.' | ','): number | NumberProblem {
  if (cell === null || cell === undefined) return 'missing';
  if (typeof cell === 'number') return Number.isFinite(cell) ? cell : 'not-finite';
  if (typeof cell === 'boolean') return cell ? 1 : 0;
  if (cell instanceof Date) return 'not-numeric';
  let text = cell.trim();
  if (text === '') return 'missing';
  if (decimalSeparator === ',') {
    if (text.includes('.')) return 'not-numeric';
    text = text.replace(',', '.');
  }
  if (PLAIN_NUMBER.test(text)) {
    const value = Number(text);
    return Number.isFinite(value) ? value : 'not-finite';
  }
  return NON_FINITE.test(text) ? 'not-finite' : 'not-numeric';
}

/** Why a cell is not a date. */
export type DateProblem = 'missing' | 'invalid';

const DATE_PATTERNS: Record<DateFormat, RegExp> = {
  'YYYY-MM-DD': /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ][0-9:.]+(?:Z|[+-]\d{2}:?\d{2})?)?$/,
  'DD/MM/YYYY': /^(\d{1,2})[/.](\d{1,2})[/.](\d{4})$/,
  'MM/DD/YYYY': /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/,
};

/**
 * Reads an application date and returns its month as a month index (see `monthIndex`).
 * Spreadsheet date cells are taken as they are; text follows the mapping's date format. A time
 * part after an ISO date is ignored (the date is what the file says, no time-zone shift).
 * @example monthPeriod(parseDateMonth('2025-04-09', 'YYYY-MM-DD') as number) // => '2025-04'
 */
export function parseDateMonth(cell: Cell | undefined, format: DateFormat): number | DateProblem {
  if (cell === null || cell === undefined) return 'missing';
  if (cell instanceof Date) {
    if (Number.isNaN(cell.getTime())) return 'invalid';
    return checked(cell.getUTCFullYear(), cell.getUTCMonth() + 1, cell.getUTCDate());
  }
  if (typeof cell !== 'string') return 'invalid';
  const text = cell.trim();
  if (text === '') return 'missing';
  const match = DATE_PATTERNS[format].exec(text);
  if (!match) return 'invalid';
  const [a, b, c] = [Number(match[1]), Number(match[2]), Number(match[3])];
  if (format === 'YYYY-MM-DD') return checked(a, b, c);
  if (format === 'DD/MM/YYYY') return checked(c, b, a);
  return checked(c, a, b);
}

function checked(year: number, month: number, day: number): number | DateProblem {
  if (month < 1 || month > 12 || day < 1) return 'invalid';
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day > daysInMonth) return 'invalid';
  return year * 12 + (month - 1);
}

/** `YYYY-MM` as a month count (year × 12 + month − 1), so months compare as numbers. @example monthIndex('2025-04') // => 24303 */
export function monthIndex(period: string): number {
  return Number(period.slice(0, 4)) * 12 + Number(period.slice(5, 7)) - 1;
}

/** The inverse of `monthIndex`. @example monthPeriod(24303) // => '2025-04' */
export function monthPeriod(index: number): string {
  const year = Math.floor(index / 12);
  return `${String(year).padStart(4, '0')}-${String(index - year * 12 + 1).padStart(2, '0')}`;
}

/**
 * Reads a cohort period cell: `YYYY-MM`, `YYYY-M`, `MM/YYYY` or a date (its month).
 * @example parsePeriodCell('2025-4') // => '2025-04'
 */
export function parsePeriodCell(cell: Cell | undefined): string | null {
  if (cell instanceof Date) return Number.isNaN(cell.getTime()) ? null : cell.toISOString().slice(0, 7);
  if (typeof cell !== 'string') return null;
  const text = cell.trim();
  let m = /^(\d{4})-(\d{1,2})(?:-\d{1,2})?$/.exec(text);
  if (m) return month(Number(m[1]), Number(m[2]));
  m = /^(\d{1,2})\/(\d{4})$/.exec(text);
  if (m) return month(Number(m[2]), Number(m[1]));
  return null;
}

function month(year: number, m: number): string | null {
  if (m < 1 || m > 12) return null;
  return `${year}-${String(m).padStart(2, '0')}`;
}

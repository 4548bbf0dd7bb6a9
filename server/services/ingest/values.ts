import type { DateFormat } from '@shared/schemas/extract';
import type { Cell } from './cells';

/** A parsed number, or why the cell is not one. Blank cells are `missing`. */
export type NumberResult = { ok: true; value: number } | { ok: false; problem: 'missing' | 'not-numeric' | 'not-finite' };

const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(?:nan|inf|infinity|∞)$|^#(?:num!|div\/0!)$/i;

/**
 * Reads a number from a cell. Text must be a plain decimal number (optionally with an exponent);
 * with `decimalSeparator` ',' the comma is the decimal mark ("2,5"). No thousands separators,
 * currency signs or units: those are refused rather than guessed.
 * @example parseNumber('2,5', ',') // => { ok: true, value: 2.5 }
 * @example parseNumber('NaN', '.') // => { ok: false, problem: 'not-finite' }
 */
export function parseNumber(cell: Cell | undefined, decimalSeparator: '.' | ','): NumberResult {
  if (cell === null || cell === undefined) return { ok: false, problem: 'missing' };
  if (typeof cell === 'number') return Number.isFinite(cell) ? { ok: true, value: cell } : { ok: false, problem: 'not-finite' };
  if (typeof cell === 'boolean') return { ok: true, value: cell ? 1 : 0 };
  if (cell instanceof Date) return { ok: false, problem: 'not-numeric' };
  let text = cell.trim();
  if (text === '') return { ok: false, problem: 'missing' };
  if (decimalSeparator === ',') {
    if (text.includes('.')) return { ok: false, problem: 'not-numeric' };
    text = text.replace(',', '.');
  }
  if (PLAIN_NUMBER.test(text)) {
    const value = Number(text);
    return Number.isFinite(value) ? { ok: true, value } : { ok: false, problem: 'not-finite' };
  }
  return NON_FINITE.test(text) ? { ok: false, problem: 'not-finite' } : { ok: false, problem: 'not-numeric' };
}

/** A calendar date as a `YYYY-MM` period and day, or why the cell is not a date. */
export type DateResult = { ok: true; period: string; day: number } | { ok: false; problem: 'missing' | 'invalid' };

const DATE_PATTERNS: Record<DateFormat, RegExp> = {
  'YYYY-MM-DD': /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ][0-9:.]+(?:Z|[+-]\d{2}:?\d{2})?)?$/,
  'DD/MM/YYYY': /^(\d{1,2})[/.](\d{1,2})[/.](\d{4})$/,
  'MM/DD/YYYY': /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/,
};

/**
 * Reads an application date. Spreadsheet date cells are taken as they are; text follows the
 * mapping's date format. A time part after an ISO date is ignored (the date is what the file says,
 * no time-zone shift).
 * @example parseDate('2025-04-09', 'YYYY-MM-DD') // => { ok: true, period: '2025-04', day: 9 }
 */
export function parseDate(cell: Cell | undefined, format: DateFormat): DateResult {
  if (cell === null || cell === undefined) return { ok: false, problem: 'missing' };
  if (cell instanceof Date) {
    if (Number.isNaN(cell.getTime())) return { ok: false, problem: 'invalid' };
    return checked(cell.getUTCFullYear(), cell.getUTCMonth() + 1, cell.getUTCDate());
  }
  if (typeof cell !== 'string') return { ok: false, problem: 'invalid' };
  const text = cell.trim();
  if (text === '') return { ok: false, problem: 'missing' };
  const match = DATE_PATTERNS[format].exec(text);
  if (!match) return { ok: false, problem: 'invalid' };
  const [a, b, c] = [Number(match[1]), Number(match[2]), Number(match[3])];
  if (format === 'YYYY-MM-DD') return checked(a, b, c);
  if (format === 'DD/MM/YYYY') return checked(c, b, a);
  return checked(c, a, b);
}

function checked(year: number, month: number, day: number): DateResult {
  if (month < 1 || month > 12 || day < 1) return { ok: false, problem: 'invalid' };
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day > daysInMonth) return { ok: false, problem: 'invalid' };
  return { ok: true, period: `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}`, day };
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

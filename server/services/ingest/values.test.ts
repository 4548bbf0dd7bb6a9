import { describe, expect, it } from 'vitest';
import { monthIndex, monthPeriod, parseDateMonth, parseNumber, parsePeriodCell } from './values';

describe('parseNumber', () => {
  it('reads plain decimals, exponents and spreadsheet numbers', () => {
    expect(parseNumber('61.5', '.')).toBe(61.5);
    expect(parseNumber(' -3 ', '.')).toBe(-3);
    expect(parseNumber('1e3', '.')).toBe(1000);
    expect(parseNumber('.5', '.')).toBe(0.5);
    expect(parseNumber(42, '.')).toBe(42);
    expect(parseNumber(true, '.')).toBe(1);
  });
  it('reads a decimal comma only when told to', () => {
    expect(parseNumber('2,5', ',')).toBe(2.5);
    expect(parseNumber('2,5', '.')).toBe('not-numeric');
    expect(parseNumber('2.5', ',')).toBe('not-numeric');
  });
  it('names what is wrong: blank, not a number, not finite', () => {
    expect(parseNumber('', '.')).toBe('missing');
    expect(parseNumber(null, '.')).toBe('missing');
    expect(parseNumber('1,500', '.')).toBe('not-numeric');
    expect(parseNumber('$12', '.')).toBe('not-numeric');
    expect(parseNumber('NaN', '.')).toBe('not-finite');
    expect(parseNumber('-Infinity', '.')).toBe('not-finite');
    expect(parseNumber('1e999', '.')).toBe('not-finite');
    expect(parseNumber('#DIV/0!', '.')).toBe('not-finite');
    expect(parseNumber(Number.NaN, '.')).toBe('not-finite');
  });
});

describe('parseDateMonth', () => {
  it('reads the three formats and spreadsheet dates into a month', () => {
    expect(monthPeriod(parseDateMonth('2025-04-09', 'YYYY-MM-DD') as number)).toBe('2025-04');
    expect(monthPeriod(parseDateMonth('2025-04-30T23:59:00Z', 'YYYY-MM-DD') as number)).toBe('2025-04');
    expect(monthPeriod(parseDateMonth('09/04/2025', 'DD/MM/YYYY') as number)).toBe('2025-04');
    expect(monthPeriod(parseDateMonth('04/09/2025', 'MM/DD/YYYY') as number)).toBe('2025-04');
    expect(monthPeriod(parseDateMonth(new Date(Date.UTC(2025, 3, 9)), 'DD/MM/YYYY') as number)).toBe('2025-04');
  });
  it('refuses impossible or differently written dates', () => {
    expect(parseDateMonth('2025-02-30', 'YYYY-MM-DD')).toBe('invalid');
    expect(parseDateMonth('2025-13-01', 'YYYY-MM-DD')).toBe('invalid');
    expect(parseDateMonth('09/04/2025', 'YYYY-MM-DD')).toBe('invalid');
    expect(parseDateMonth('soon', 'YYYY-MM-DD')).toBe('invalid');
    expect(parseDateMonth(' ', 'YYYY-MM-DD')).toBe('missing');
  });
  it('counts months as numbers both ways', () => {
    expect(monthIndex('2025-04')).toBe(2025 * 12 + 3);
    expect(monthPeriod(monthIndex('2024-12') + 1)).toBe('2025-01');
  });
});

describe('parsePeriodCell', () => {
  it('accepts YYYY-MM, YYYY-M, MM/YYYY and dates', () => {
    expect(parsePeriodCell('2025-04')).toBe('2025-04');
    expect(parsePeriodCell('2025-4')).toBe('2025-04');
    expect(parsePeriodCell('04/2025')).toBe('2025-04');
    expect(parsePeriodCell(new Date(Date.UTC(2025, 3, 1)))).toBe('2025-04');
    expect(parsePeriodCell('April')).toBeNull();
  });
});

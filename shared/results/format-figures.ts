import type { InferenceDto, OutcomeRefDto } from '../api/results';

const MINUS = '\u2212';
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

function signed(text: string, value: number): string {
  if (value < 0) return `${MINUS}${text.replace(/^-/, '')}`;
  return value > 0 ? `+${text}` : text;
}

/**
 * A jump or effect in the outcome's unit, as screens and e-mail write it: shares as percentage
 * points with one decimal, other units with two decimals and the unit.
 * @example formatChange(-0.1234, { unit: 'share' }) // => '−12.3 pp'
 * @example formatChange(-0.8, { unit: 'months' }) // => '−0.80 months'
 */
export function formatChange(value: number, outcome: Pick<OutcomeRefDto, 'unit'>): string {
  if (outcome.unit === 'share') return `${signed((value * 100).toFixed(1), round(value * 100, 1))} pp`;
  return `${signed(value.toFixed(2), round(value, 2))}${outcome.unit ? ` ${outcome.unit}` : ''}`;
}

/** An interval in the outcome's unit. @example formatInterval({ ciLow: -0.2, ciHigh: -0.05 }, { unit: 'share' }) // => '−20.0 to −5.0 pp' */
export function formatInterval(i: Pick<InferenceDto, 'ciLow' | 'ciHigh'>, outcome: Pick<OutcomeRefDto, 'unit'>): string {
  const [low, high] = [formatChange(i.ciLow, outcome), formatChange(i.ciHigh, outcome)];
  const unit = outcome.unit === 'share' ? ' pp' : outcome.unit ? ` ${outcome.unit}` : '';
  return `${low.slice(0, low.length - unit.length)} to ${high}`;
}

/** The take-up jump is always a share of applicants. */
export const TAKE_UP_UNIT = { unit: 'share' } as const;

/** @example monthLabel('2026-10') // => 'October 2026' */
export function monthLabel(period: string): string {
  return `${MONTHS[Number(period.slice(5, 7)) - 1]} ${period.slice(0, 4)}`;
}

function round(v: number, digits: number): number {
  return Number(v.toFixed(digits));
}

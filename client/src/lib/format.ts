/**
 * Number and date formatting for screens, in the agency's locale (`setDisplayLocale`, from
 * `/api/me`) unless told otherwise. Missing or non-finite values show as a dash.
 */

let displayLocale: string | undefined;
let displayTimeZone: string | undefined;
/** Set once the agency's locale and time zone are known (the sign-in feature does it). */
export function setDisplaySettings(agency: { locale: string; timeZone: string } | undefined): void {
  displayLocale = agency?.locale;
  displayTimeZone = agency?.timeZone;
}

const DASH = '—';
/** U+2212, the typographic minus: lines up with "+" in tabular figures. */
const MINUS = '\u2212';
const missing = (v: number | null | undefined): v is null | undefined => v === null || v === undefined || !Number.isFinite(v);

export function formatNumber(value: number | null | undefined, digits = 2, locale = displayLocale): string {
  if (missing(value)) return DASH;
  return new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value).replace('-', MINUS);
}

/** With an explicit sign: "+3.2", "−12.0", "0.0". */
export function formatSigned(value: number | null | undefined, digits = 1, locale = displayLocale): string {
  if (missing(value)) return DASH;
  const rounded = Number(value.toFixed(digits));
  const body = new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits }).format(Math.abs(value));
  return rounded > 0 ? `+${body}` : rounded < 0 ? `${MINUS}${body}` : body;
}

/** A share (0–1) as a percentage, e.g. 0.614 → "61.4%". */
export function formatShare(value: number | null | undefined, digits = 1, locale = displayLocale): string {
  if (missing(value)) return DASH;
  return new Intl.NumberFormat(locale, { style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value);
}

/** What an outcome is measured in: `share` outcomes are probabilities, so their jumps are percentage points. */
export interface Measure {
  unit: string;
}

export const isShareUnit = (m: Measure): boolean => m.unit === 'share';

/** Unit suffix of a jump in this measure: "pp" (percentage points) for shares, else the unit itself. */
export function jumpUnit(m: Measure, long = false): string {
  if (isShareUnit(m)) return long ? 'percentage points' : 'pp';
  return m.unit;
}

/** Digits that keep a jump readable: 1 for percentage points, 2 for other units. */
export const jumpDigits = (m: Measure): number => (isShareUnit(m) ? 1 : 2);

/** A jump with its sign and unit: shares as percentage points ("−12.0 pp"), else "−0.80 months". */
export function formatJump(value: number | null | undefined, m: Measure, options: { long?: boolean; sign?: boolean } = {}): string {
  if (missing(value)) return DASH;
  const scaled = isShareUnit(m) ? value * 100 : value;
  const digits = jumpDigits(m);
  const body = options.sign === false ? formatNumber(scaled, digits) : formatSigned(scaled, digits);
  const unit = jumpUnit(m, options.long);
  return unit ? `${body} ${unit}` : body;
}

/** An interval "−18.2 to −5.9 pp". */
export function formatInterval(low: number | null | undefined, high: number | null | undefined, m: Measure): string {
  if (missing(low) && missing(high)) return DASH;
  const scale = (v: number | null | undefined) => (missing(v) ? null : isShareUnit(m) ? v * 100 : v);
  const digits = jumpDigits(m);
  const end = (v: number | null) => (v === null ? 'unbounded' : formatSigned(v, digits));
  const unit = jumpUnit(m);
  return `${end(scale(low))} to ${end(scale(high))}${unit ? ` ${unit}` : ''}`;
}

/** A level of an outcome (not a jump): shares as percentages, else the number and unit. */
export function formatLevel(value: number | null | undefined, m: Measure): string {
  if (missing(value)) return DASH;
  if (isShareUnit(m)) return formatShare(value, 1);
  return `${formatNumber(value, 2)}${m.unit ? ` ${m.unit}` : ''}`;
}

/** A p-value: three decimals, "< 0.001" below that. */
export function formatP(p: number | null | undefined): string {
  if (missing(p)) return DASH;
  return p < 0.001 ? '< 0.001' : formatNumber(p, 3);
}

/** A count with thousands separators. */
export function formatCount(n: number | null | undefined): string {
  if (missing(n)) return DASH;
  return new Intl.NumberFormat(displayLocale, { maximumFractionDigits: 0 }).format(n);
}

/** A `YYYY-MM` period as "Apr 2025"; `long` gives "April 2025". */
export function formatPeriod(period: string | null | undefined, locale = displayLocale, long = false): string {
  if (!period) return DASH;
  const [y, m] = period.split('-').map(Number);
  if (!y || !m) return period;
  return new Intl.DateTimeFormat(locale, { month: long ? 'long' : 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(y, m - 1, 1)));
}

/** An instant in the agency's (or program's) time zone, e.g. "Dec 2, 2026, 7:00 AM CST". */
export function formatDateTime(iso: string | null | undefined, timeZone = displayTimeZone, locale = displayLocale): string {
  if (!iso) return DASH;
  const parts = new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(iso));
  const zone = new Intl.DateTimeFormat(locale, { timeZoneName: 'short', timeZone }).formatToParts(new Date(iso)).find((p) => p.type === 'timeZoneName')?.value;
  return zone ? `${parts} ${zone}` : parts;
}

/** Number and date formatting for screens, in the browser's locale unless told otherwise. */

export function formatNumber(value: number | null | undefined, digits = 2, locale?: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value);
}

/** A share (0–1) as percentage points of a probability, e.g. 0.614 → "61.4%". */
export function formatShare(value: number | null | undefined, digits = 1, locale?: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return new Intl.NumberFormat(locale, { style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value);
}

/** A `YYYY-MM` period as "Apr 2025". */
export function formatPeriod(period: string | null | undefined, locale?: string): string {
  if (!period) return '—';
  const [y, m] = period.split('-').map(Number);
  if (!y || !m) return period;
  return new Intl.DateTimeFormat(locale, { month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(y, m - 1, 1)));
}

/** An instant in the agency's time zone, e.g. "2 Dec 2026, 07:00". */
export function formatDateTime(iso: string | null | undefined, timeZone?: string, locale?: string): string {
  if (!iso) return '—';
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(iso));
}

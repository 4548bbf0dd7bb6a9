/** Month arithmetic on `YYYY-MM` periods, without time zones (a period is a calendar label). */

/** @example addMonths('2025-11', 3) // => '2026-02' */
export function addMonths(period: string, months: number): string {
  const [y, m] = parsePeriod(period);
  const index = y * 12 + (m - 1) + months;
  const year = Math.floor(index / 12);
  const month = index - year * 12 + 1;
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}`;
}

/** Inclusive list of periods from `first` to `last`. @example periodRange('2025-11', '2026-01') // => ['2025-11','2025-12','2026-01'] */
export function periodRange(first: string, last: string): string[] {
  const out: string[] = [];
  for (let p = first; p <= last; p = addMonths(p, 1)) out.push(p);
  return out;
}

/** Days in the period's month (Gregorian). @example daysInPeriod('2024-02') // => 29 */
export function daysInPeriod(period: string): number {
  const [y, m] = parsePeriod(period);
  return new Date(Date.UTC(y, m, 0)).getUTCDate();
}

function parsePeriod(period: string): [number, number] {
  const match = /^(\d{4})-(\d{2})$/.exec(period);
  if (!match) throw new RangeError(`parsePeriod: "${period}" is not a YYYY-MM period`);
  return [Number(match[1]), Number(match[2])];
}

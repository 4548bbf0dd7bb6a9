import type { SummarySchedule } from '../schemas/subscription';

/** Civil date and time in a time zone. */
interface ZonedParts {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

/** The wall-clock date and time of an instant in `timeZone` (IANA name). */
export function zonedParts(instant: Date, timeZone: string): ZonedParts {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric' });
    formatters.set(timeZone, f);
  }
  const parts = Object.fromEntries(f.formatToParts(instant).map((p) => [p.type, p.value]));
  return { year: Number(parts.year), month: Number(parts.month), day: Number(parts.day), hour: Number(parts.hour) % 24, minute: Number(parts.minute) };
}

/**
 * The instant at which the wall clock in `timeZone` shows the given civil time. Two refinement
 * steps settle the zone's offset on either side of a daylight-saving change; a time skipped by the
 * change (spring forward) comes out shifted by the change.
 * @example zonedTime(2026, 2, 2, 7, 0, 'America/Chicago').toISOString() // => '2026-02-02T13:00:00.000Z'
 */
export function zonedTime(year: number, month: number, day: number, hour: number, minute: number, timeZone: string): Date {
  const wanted = Date.UTC(year, month - 1, day, hour, minute);
  let guess = wanted;
  for (let i = 0; i < 3; i++) {
    const p = zonedParts(new Date(guess), timeZone);
    const shown = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute);
    if (shown === wanted) break;
    guess += wanted - shown;
  }
  return new Date(guess);
}

/** ISO weekday (1 = Monday … 7 = Sunday) of a civil date. */
function isoWeekday(year: number, month: number, day: number): number {
  const d = new Date(Date.UTC(year, month - 1, day)).getUTCDay();
  return d === 0 ? 7 : d;
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/** The first Monday–Friday of a month (public holidays are not known). @example firstWorkingDay(2026, 2) // => 2 */
export function firstWorkingDay(year: number, month: number): number {
  let day = 1;
  while (isoWeekday(year, month, day) > 5) day++;
  return day;
}

/** The scheduled instant in the month (year, month) of a monthly cadence. */
function monthlySlot(s: SummarySchedule, year: number, month: number): Date {
  const day = s.cadence === 'first-working-day' ? firstWorkingDay(year, month) : Math.min(s.dayOfMonth ?? 1, daysInMonth(year, month));
  return zonedTime(year, month, day, s.hour, s.minute, s.timeZone);
}

function addMonth(year: number, month: number, by: number): [number, number] {
  const i = year * 12 + (month - 1) + by;
  return [Math.floor(i / 12), (i % 12) + 1];
}

/**
 * The latest scheduled instant at or before `now` (the slot a summary is due for).
 * @example latestSlot({ cadence: 'first-working-day', hour: 7, minute: 0, dayOfMonth: null, weekday: null, timeZone: 'America/Chicago' }, new Date('2026-02-02T13:00:00Z')) // => 2026-02-02T13:00:00.000Z
 */
export function latestSlot(s: SummarySchedule, now: Date): Date {
  const local = zonedParts(now, s.timeZone);
  if (s.cadence === 'weekly') {
    const today = isoWeekday(local.year, local.month, local.day);
    const back = (today - (s.weekday ?? 1) + 7) % 7;
    for (const extra of [0, 7]) {
      const civil = new Date(Date.UTC(local.year, local.month - 1, local.day - back - extra));
      const slot = zonedTime(civil.getUTCFullYear(), civil.getUTCMonth() + 1, civil.getUTCDate(), s.hour, s.minute, s.timeZone);
      if (slot.getTime() <= now.getTime()) return slot;
    }
  }
  for (let by = 0; by >= -2; by--) {
    const [y, m] = addMonth(local.year, local.month, by);
    const slot = monthlySlot(s, y, m);
    if (slot.getTime() <= now.getTime()) return slot;
  }
  throw new RangeError('latestSlot: no slot found in three months');
}

/** The first scheduled instant strictly after `now`. */
export function nextSlot(s: SummarySchedule, now: Date): Date {
  const local = zonedParts(now, s.timeZone);
  if (s.cadence === 'weekly') {
    const today = isoWeekday(local.year, local.month, local.day);
    const ahead = ((s.weekday ?? 1) - today + 7) % 7;
    for (const extra of [0, 7]) {
      const civil = new Date(Date.UTC(local.year, local.month - 1, local.day + ahead + extra));
      const slot = zonedTime(civil.getUTCFullYear(), civil.getUTCMonth() + 1, civil.getUTCDate(), s.hour, s.minute, s.timeZone);
      if (slot.getTime() > now.getTime()) return slot;
    }
  }
  for (let by = 0; by <= 2; by++) {
    const [y, m] = addMonth(local.year, local.month, by);
    const slot = monthlySlot(s, y, m);
    if (slot.getTime() > now.getTime()) return slot;
  }
  throw new RangeError('nextSlot: no slot found in three months');
}

const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];

/** The schedule in words. @example scheduleText(defaultSummarySchedule('America/Chicago')) // => '07:00 on the first working day of each month (America/Chicago)' */
export function scheduleText(s: SummarySchedule): string {
  const time = `${String(s.hour).padStart(2, '0')}:${String(s.minute).padStart(2, '0')}`;
  const when =
    s.cadence === 'first-working-day'
      ? 'on the first working day of each month'
      : s.cadence === 'day-of-month'
        ? `on day ${s.dayOfMonth} of each month (the last day in shorter months)`
        : `every ${WEEKDAYS[(s.weekday ?? 1) - 1]}`;
  return `${time} ${when} (${s.timeZone})`;
}

import { describe, expect, it } from 'vitest';
import { defaultSummarySchedule, type SummarySchedule } from '../schemas/subscription';
import { firstWorkingDay, latestSlot, nextSlot, scheduleText, zonedTime } from './summary-schedule';

const chicago = defaultSummarySchedule('America/Chicago');

describe('summary schedule', () => {
  it('finds the first Monday–Friday of a month', () => {
    // Calendar facts: 1 Feb 2026 is a Sunday, 1 Aug 2026 a Saturday, 1 Apr 2026 a Wednesday.
    expect(firstWorkingDay(2026, 2)).toBe(2);
    expect(firstWorkingDay(2026, 8)).toBe(3);
    expect(firstWorkingDay(2026, 4)).toBe(1);
  });

  it('reads 07:00 in the agency zone, across daylight saving time', () => {
    // Chicago is UTC−6 in winter (CST) and UTC−5 from 8 Mar 2026 (CDT), an identity of the tz database.
    expect(zonedTime(2026, 2, 2, 7, 0, 'America/Chicago').toISOString()).toBe('2026-02-02T13:00:00.000Z');
    expect(zonedTime(2026, 4, 1, 7, 0, 'America/Chicago').toISOString()).toBe('2026-04-01T12:00:00.000Z');
    expect(zonedTime(2026, 7, 1, 7, 0, 'Europe/Berlin').toISOString()).toBe('2026-07-01T05:00:00.000Z');
  });

  it('is due exactly at 07:00 on the first working day, not a minute before', () => {
    expect(latestSlot(chicago, new Date('2026-02-02T12:59:59.999Z')).toISOString()).toBe('2026-01-01T13:00:00.000Z');
    expect(latestSlot(chicago, new Date('2026-02-02T13:00:00.000Z')).toISOString()).toBe('2026-02-02T13:00:00.000Z');
    expect(nextSlot(chicago, new Date('2026-02-02T13:00:00.000Z')).toISOString()).toBe('2026-03-02T13:00:00.000Z');
    // November 2026: clocks go back on Sunday 1 Nov; Monday 2 Nov 07:00 CST is 13:00 UTC.
    expect(nextSlot(chicago, new Date('2026-10-15T00:00:00Z')).toISOString()).toBe('2026-11-02T13:00:00.000Z');
  });

  it('handles day-of-month (short months) and weekly cadences', () => {
    const day31: SummarySchedule = { ...chicago, cadence: 'day-of-month', dayOfMonth: 31, hour: 9 };
    expect(nextSlot(day31, new Date('2026-02-01T00:00:00Z')).toISOString()).toBe('2026-02-28T15:00:00.000Z');
    const mondays: SummarySchedule = { ...chicago, cadence: 'weekly', weekday: 1, timeZone: 'UTC', hour: 8 };
    // 4 Mar 2026 is a Wednesday; the Monday before is 2 Mar, the one after 9 Mar.
    expect(latestSlot(mondays, new Date('2026-03-04T00:00:00Z')).toISOString()).toBe('2026-03-02T08:00:00.000Z');
    expect(nextSlot(mondays, new Date('2026-03-04T00:00:00Z')).toISOString()).toBe('2026-03-09T08:00:00.000Z');
    expect(latestSlot(mondays, new Date('2026-03-09T08:00:00Z')).toISOString()).toBe('2026-03-09T08:00:00.000Z');
  });

  it('says the schedule in words', () => {
    expect(scheduleText(chicago)).toBe('07:00 on the first working day of each month (America/Chicago)');
  });
});

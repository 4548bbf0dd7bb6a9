import { z } from 'zod';

/**
 * When a director's summary is sent, read in `timeZone`:
 * - `first-working-day`: the first Monday–Friday of each month (public holidays are not known to Cutline);
 * - `day-of-month`: that day of each month (the last day when the month is shorter);
 * - `weekly`: that weekday (1 = Monday … 7 = Sunday).
 */
export const SUMMARY_CADENCES = ['first-working-day', 'day-of-month', 'weekly'] as const;
export type SummaryCadence = (typeof SUMMARY_CADENCES)[number];

export const SummaryScheduleSchema = z
  .object({
    cadence: z.enum(SUMMARY_CADENCES),
    /** Local time of day, 24-hour clock. */
    hour: z.number().int().min(0).max(23),
    minute: z.number().int().min(0).max(59),
    /** `day-of-month` only: 1–31. */
    dayOfMonth: z.number().int().min(1).max(31).nullable(),
    /** `weekly` only: ISO weekday, 1 = Monday … 7 = Sunday. */
    weekday: z.number().int().min(1).max(7).nullable(),
    /** IANA time zone, e.g. America/Chicago. Defaults to the program's (the agency's) zone. */
    timeZone: z.string().min(1).max(64),
  })
  .superRefine((s, ctx) => {
    if (s.cadence === 'day-of-month' && s.dayOfMonth === null) ctx.addIssue({ code: 'custom', path: ['dayOfMonth'], message: 'Choose the day of the month.' });
    if (s.cadence === 'weekly' && s.weekday === null) ctx.addIssue({ code: 'custom', path: ['weekday'], message: 'Choose the day of the week.' });
    if (!isKnownTimeZone(s.timeZone)) ctx.addIssue({ code: 'custom', path: ['timeZone'], message: 'This is not a time zone Cutline knows (use a name such as Europe/Berlin).' });
  });
export type SummarySchedule = z.infer<typeof SummaryScheduleSchema>;

/** The default: 07:00 on the first working day of the month, in the agency's time zone. */
export function defaultSummarySchedule(timeZone: string): SummarySchedule {
  return { cadence: 'first-working-day', hour: 7, minute: 0, dayOfMonth: null, weekday: null, timeZone };
}

/** `PUT /api/me/subscription` */
export const SubscriptionUpdateSchema = z.object({
  /** Paused subscriptions send nothing until resumed. */
  paused: z.boolean(),
  schedule: SummaryScheduleSchema,
  /** Programs to include; empty means every program the director is granted. */
  programIds: z.array(z.number().int().positive()).max(100),
  /** Attach the Excel annex (when available). */
  attachAnnex: z.boolean(),
});
export type SubscriptionUpdateInput = z.infer<typeof SubscriptionUpdateSchema>;

function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** `GET /api/admin/schedules`: every director's summary e-mail schedule, for administrators. */
export interface SummaryScheduleRowDto {
  subscriptionId: number;
  userId: number;
  person: string;
  /** Switched-off accounts receive nothing, whatever the schedule says. */
  active: boolean;
  paused: boolean;
  /** The schedule in words, e.g. "07:00 on the first working day of each month (America/Chicago)". */
  scheduleText: string;
  /** Next send (ISO 8601), or null while paused or switched off. */
  nextDueAt: string | null;
  lastSentAt: string | null;
  /** Programs covered; empty means every program the director is granted. */
  programs: string[];
  attachAnnex: boolean;
}

export interface SchedulesDto {
  summaries: SummaryScheduleRowDto[];
}

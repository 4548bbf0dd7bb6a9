import { tryNamedLock } from '@server/services/recompute/named-lock';
import { dueSubscriptions, ensureDirectorSubscriptions } from '@server/services/subscriptions.service';
import { sendDueSummaries } from '@server/services/summary-mail.service';
import type { JobDefinition } from './job';

/**
 * Sends directors' summaries when their schedule says (default 07:00 on the first working day of
 * the month in the agency's time zone). Checks every minute; each person's schedule carries its
 * own time zone, so the check itself runs in UTC. At most 200 messages a check.
 */
export const directorSummaryJob: JobDefinition = {
  name: 'director-summary',
  schedule: '* * * * *',
  timeZone: 'UTC',
  async run(ctx) {
    const now = ctx.now();
    // One instance at a time; the per-subscription claim in sendDueSummaries also prevents doubles.
    const lock = await tryNamedLock(ctx.dataSource, `cutline:${String(ctx.dataSource.options.database)}:summary`.slice(0, 64));
    if (!lock) return;
    try {
      await ensureDirectorSubscriptions(ctx.dataSource, now);
      const due = await dueSubscriptions(ctx.dataSource, now);
      if (due.length === 0) return;
      const sent = await sendDueSummaries(ctx, now, due);
      ctx.logger.info({ due: due.length, sent: sent.filter((m) => m.status === 'sent').length, failed: sent.filter((m) => m.status === 'failed').length }, 'director summaries');
    } finally {
      await lock.release();
    }
  },
};

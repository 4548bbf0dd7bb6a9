import { defaultRecomputeDeps } from '@server/services/recompute/default-deps';
import { processRecomputeQueue } from '@server/services/recompute/run-recompute';
import type { JobDefinition } from './job';

/**
 * Works through queued recomputes every minute: runs queued by another instance, retries whose
 * back-off has ended, and runs a dead process left behind. (The app also starts a run at once
 * when it queues one; the named lock keeps the two from overlapping.) At most 20 runs a pass.
 */
export const recomputeQueueJob: JobDefinition = {
  name: 'recompute-queue',
  schedule: '* * * * *',
  timeZone: 'UTC',
  async run(ctx) {
    const reports = await processRecomputeQueue(defaultRecomputeDeps(ctx));
    if (reports.length > 0) ctx.logger.info({ runs: reports.map((r) => ({ id: r.runId, outcome: r.outcome })) }, 'recompute queue pass');
  },
};

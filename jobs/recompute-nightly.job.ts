import { Program } from '@server/entities/program.entity';
import { SYSTEM_ACTOR } from '@server/services/audit.service';
import { defaultRecomputeDeps } from '@server/services/recompute/default-deps';
import { engineAnalyzer } from '@server/services/recompute/engine-analyzer';
import { processRecomputeQueue } from '@server/services/recompute/run-recompute';
import { requestRecompute } from '@server/services/recompute/run-queue';
import { programNeedsRecompute } from '@server/services/recompute/stale-check';
import type { JobDefinition } from './job';

/**
 * Nightly (02:30 UTC): queues a recompute for every program whose results are behind their inputs
 * or marked stale by a failed run — e.g. after an engine update — then works through the queue.
 * Programs that are up to date are left alone (no run is logged for them).
 */
export const recomputeNightlyJob: JobDefinition = {
  name: 'recompute-nightly',
  schedule: '30 2 * * *',
  timeZone: 'UTC',
  async run(ctx) {
    const programs = await ctx.dataSource.getRepository(Program).find({ select: { id: true }, order: { id: 'ASC' } });
    let queued = 0;
    for (const { id } of programs) {
      if (!(await programNeedsRecompute(ctx.dataSource, id, engineAnalyzer))) continue;
      await ctx.dataSource.transaction((tx) => requestRecompute(tx, { programId: id, trigger: 'nightly', actor: SYSTEM_ACTOR, now: ctx.now() }));
      queued++;
    }
    if (queued > 0) await processRecomputeQueue(defaultRecomputeDeps(ctx));
    ctx.logger.info({ programs: programs.length, queued }, 'nightly stale check');
  },
};

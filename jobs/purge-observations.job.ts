import { purgeExpiredObservations } from '@server/services/retention.service';
import type { JobDefinition } from './job';

/**
 * Nightly retention: deletes row-level observations older than each program's retention, keeps
 * the extract records and every computed result, and records what it deleted in the audit trail
 * (`server/services/retention.service.ts`). Capped per run; the next night continues.
 */
export const purgeObservationsJob: JobDefinition = {
  name: 'purge-observations',
  schedule: '40 2 * * *',
  timeZone: 'UTC',
  run: async (ctx) => {
    await purgeExpiredObservations(ctx, ctx.now());
  },
};

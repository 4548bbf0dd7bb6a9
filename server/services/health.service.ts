import type { DataSource } from 'typeorm';
import type { HealthDto } from '@shared/api/health';
import { pendingMigrationCount } from '../db/data-source';

/** Database reachability and migration state; never throws. */
export async function checkHealth(ds: DataSource, version: string): Promise<HealthDto> {
  try {
    await ds.query('SELECT 1');
    const pending = await pendingMigrationCount(ds);
    return { status: pending === 0 ? 'ok' : 'degraded', version, database: { reachable: true, migrationsPending: pending } };
  } catch {
    return { status: 'degraded', version, database: { reachable: false, migrationsPending: -1 } };
  }
}

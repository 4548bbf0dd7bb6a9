import { defaultRecomputeDeps } from '@server/services/recompute/default-deps';
import type { RecomputeDeps } from '@server/services/recompute/recompute-deps';
import { createDesign } from '@server/services/designs.service';
import { defaultDesignSettings } from '@shared/schemas/design';
import { createLogger } from '@server/lib/logger';
import type { TestDatabase } from './test-database';

/** The app's recompute over a test database, retrying at once (no back-off) unless told otherwise. */
export function testRecomputeDeps(db: TestDatabase, overrides: Partial<RecomputeDeps> = {}): RecomputeDeps {
  return { ...defaultRecomputeDeps({ dataSource: db.dataSource, config: db.config, logger: createLogger('silent') }), retryBaseMs: 0, ...overrides };
}

/** The demo program's primary design (both outcomes, both covariates, default settings) by the analyst. */
export async function createDemoDesign(db: TestDatabase, programId: number): Promise<number> {
  const design = await createDesign(db.dataSource, programId, { userId: null, label: 'Test analyst' }, {
    name: 'Main analysis plan',
    settings: defaultDesignSettings(['shutoff_6m', 'arrears_months'], ['household_size', 'prior_arrears']),
    primary: true,
  });
  return design.id;
}

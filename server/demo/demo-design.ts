import type { DataSource } from 'typeorm';
import { DEMO_COVARIATES, DEMO_OUTCOMES } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import { EvaluationDesign } from '../entities/evaluation-design.entity';
import { SYSTEM_ACTOR } from '../services/audit.service';
import { createDesign } from '../services/designs.service';

/**
 * The demo program's evaluation design (both outcomes, both covariates, the default settings), so
 * `npm start` shows results without an analyst first writing a design. Only when the program has
 * no design at all; queues a recompute like any new primary design.
 * @returns whether it was created
 */
export async function ensureDemoDesign(ds: DataSource, programId: number): Promise<boolean> {
  if (await ds.getRepository(EvaluationDesign).existsBy({ programId })) return false;
  await createDesign(ds, programId, SYSTEM_ACTOR, {
    name: 'Main analysis plan',
    settings: defaultDesignSettings(DEMO_OUTCOMES.map((o) => o.key), DEMO_COVARIATES.map((c) => c.key)),
    primary: true,
  });
  return true;
}

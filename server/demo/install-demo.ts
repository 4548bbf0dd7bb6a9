import type { DataSource } from 'typeorm';
import {
  DEMO_COVARIATES,
  DEMO_CUTOFF_SCHEDULE,
  DEMO_OUTCOMES,
  DEMO_PROGRAM,
  demoPeriods,
} from '@shared/demo/heating-credit';
import { Cohort } from '../entities/cohort.entity';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';

/**
 * Installs the invented demo program (definitions, cutoff schedule, cohorts) once.
 * @returns whether anything was installed (false when the program already exists).
 */
export async function installDemoScenario(ds: DataSource): Promise<{ installed: boolean; programId: number }> {
  const existing = await ds.getRepository(Program).findOneBy({ slug: DEMO_PROGRAM.slug });
  if (existing) return { installed: false, programId: existing.id };
  const programId = await ds.transaction(async (tx) => {
    const program = await tx.getRepository(Program).save(tx.getRepository(Program).create(DEMO_PROGRAM));
    await tx.getRepository(CutoffChange).insert(DEMO_CUTOFF_SCHEDULE.map((c) => ({ ...c, programId: program.id })));
    await tx.getRepository(OutcomeDefinition).insert(DEMO_OUTCOMES.map((o, i) => ({ ...o, programId: program.id, position: i + 1 })));
    await tx.getRepository(CovariateDefinition).insert(DEMO_COVARIATES.map((c, i) => ({ ...c, programId: program.id, position: i + 1 })));
    await tx.getRepository(Cohort).insert(demoPeriods().map((period) => ({ programId: program.id, period })));
    return program.id;
  });
  return { installed: true, programId };
}

import type { DataSource } from 'typeorm';
import {
  DEMO_COVARIATES,
  DEMO_CUTOFF_SCHEDULE,
  DEMO_OUTCOMES,
  DEMO_PROGRAM,
  demoPeriods,
} from '@shared/demo/heating-credit';
import { DEMO_PEOPLE } from '@shared/demo/people';
import { Cohort } from '../entities/cohort.entity';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { RoleGrant } from '../entities/role-grant.entity';
import { User } from '../entities/user.entity';

/**
 * Installs the invented demo program (definitions, cutoff schedule, cohorts) once, and the demo
 * people with their grants (each person once: an administrator's later changes are kept).
 * @returns whether the program was installed (false when it already exists).
 */
export async function installDemoScenario(ds: DataSource): Promise<{ installed: boolean; programId: number }> {
  const existing = await ds.getRepository(Program).findOneBy({ slug: DEMO_PROGRAM.slug });
  if (existing) {
    await installDemoPeople(ds, existing.id);
    return { installed: false, programId: existing.id };
  }
  const programId = await ds.transaction(async (tx) => {
    const program = await tx.getRepository(Program).save(tx.getRepository(Program).create(DEMO_PROGRAM));
    await tx.getRepository(CutoffChange).insert(DEMO_CUTOFF_SCHEDULE.map((c) => ({ ...c, programId: program.id })));
    await tx.getRepository(OutcomeDefinition).insert(DEMO_OUTCOMES.map((o, i) => ({ ...o, programId: program.id, position: i + 1 })));
    await tx.getRepository(CovariateDefinition).insert(DEMO_COVARIATES.map((c, i) => ({ ...c, programId: program.id, position: i + 1 })));
    await tx.getRepository(Cohort).insert(demoPeriods().map((period) => ({ programId: program.id, period })));
    return program.id;
  });
  await installDemoPeople(ds, programId);
  return { installed: true, programId };
}

/** The demo people (`shared/demo/people.ts`), each with their one grant, unless they exist already. */
async function installDemoPeople(ds: DataSource, programId: number): Promise<void> {
  await ds.transaction(async (tx) => {
    for (const person of DEMO_PEOPLE) {
      if (await tx.getRepository(User).existsBy({ email: person.email })) continue;
      const user = await tx.getRepository(User).save(
        tx.getRepository(User).create({ email: person.email, displayName: person.displayName, nameId: null, active: true, lastSignInAt: null }),
      );
      await tx.getRepository(RoleGrant).insert({
        userId: user.id,
        role: person.role,
        programId: person.scope === 'agency' ? null : programId,
        source: 'admin',
        groupName: null,
        grantedByUserId: null,
      });
    }
  });
}

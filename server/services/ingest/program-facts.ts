import type { EntityManager } from 'typeorm';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import { CovariateDefinition } from '../../entities/covariate-definition.entity';
import { CutoffChange } from '../../entities/cutoff-change.entity';
import { OutcomeDefinition } from '../../entities/outcome-definition.entity';
import { Program } from '../../entities/program.entity';
import { AppError, notFound } from '../../lib/errors';
import type { ProgramFacts } from './mapping-rules';

/** The program's rules for validation, with the cutoff in force for `period`. @throws not_found */
export async function programFacts(manager: EntityManager, programId: number): Promise<ProgramFacts & { schedule: CutoffChange[] }> {
  const program = await manager.getRepository(Program).findOneBy({ id: programId });
  if (!program) throw notFound('Program');
  const [outcomes, covariates, schedule] = await Promise.all([
    manager.getRepository(OutcomeDefinition).find({ where: { programId }, order: { position: 'ASC' } }),
    manager.getRepository(CovariateDefinition).find({ where: { programId }, order: { position: 'ASC' } }),
    manager.getRepository(CutoffChange).find({ where: { programId }, order: { firstPeriod: 'ASC' } }),
  ]);
  return {
    id: program.id,
    scoreMin: program.scoreMin,
    scoreMax: program.scoreMax,
    eligibleSide: program.eligibleSide,
    maxRejectedShare: Number(program.maxRejectedShare),
    outcomes: outcomes.map((o) => ({ key: o.key, label: o.label, kind: o.kind })),
    covariates: covariates.map((c) => ({ key: c.key, label: c.label, kind: c.kind })),
    schedule,
  };
}

/**
 * The cutoff of the program for a period.
 * @throws AppError extract_period_invalid when the schedule starts later
 */
export function cutoffOrThrow(schedule: readonly CutoffChange[], period: string): number {
  const cutoff = cutoffForPeriod(schedule, period);
  if (cutoff === null) {
    const first = schedule[0]?.firstPeriod;
    throw new AppError(
      'extract_period_invalid',
      first
        ? `The program has no cutoff for ${period}: its cutoff schedule starts in ${first}. Choose the month the file covers, or ask an administrator to extend the schedule.`
        : 'The program has no cutoff schedule yet, so no extract can be checked. Ask an administrator to set the cutoff first.',
    );
  }
  return cutoff;
}

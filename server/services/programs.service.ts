import type { DataSource } from 'typeorm';
import type { ListDto, ProgramDetailDto, ProgramSummaryDto } from '@shared/api/programs';
import { cutoffForPeriod } from '@shared/domain/cutoff-schedule';
import type { PageQuery } from '@shared/schemas/paging';
import { Cohort } from '../entities/cohort.entity';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { notFound } from '../lib/errors';

/** Which programs a caller may see: all, or only those listed. */
export type ProgramVisibility = 'all' | readonly number[];

/** Programs visible to the caller, by name, one page at a time. */
export async function listPrograms(ds: DataSource, visibility: ProgramVisibility, page: PageQuery): Promise<ListDto<ProgramSummaryDto>> {
  const query = ds.getRepository(Program).createQueryBuilder('p').orderBy('p.name', 'ASC').addOrderBy('p.id', 'ASC');
  if (visibility !== 'all') {
    if (visibility.length === 0) return { items: [], total: 0, page: page.page, pageSize: page.pageSize };
    query.where('p.id IN (:...ids)', { ids: [...visibility] });
  }
  const [programs, total] = await query
    .skip((page.page - 1) * page.pageSize)
    .take(page.pageSize)
    .getManyAndCount();
  const items = await Promise.all(programs.map((p) => toSummary(ds, p)));
  return { items, total, page: page.page, pageSize: page.pageSize };
}

/** One program with its cutoff schedule and variable definitions. @throws not_found */
export async function getProgram(ds: DataSource, programId: number): Promise<ProgramDetailDto> {
  const program = await ds.getRepository(Program).findOneBy({ id: programId });
  if (!program) throw notFound('Program');
  const [summary, schedule, outcomes, covariates] = await Promise.all([
    toSummary(ds, program),
    ds.getRepository(CutoffChange).find({ where: { programId }, order: { firstPeriod: 'ASC' } }),
    ds.getRepository(OutcomeDefinition).find({ where: { programId }, order: { position: 'ASC' } }),
    ds.getRepository(CovariateDefinition).find({ where: { programId }, order: { position: 'ASC' } }),
  ]);
  return {
    ...summary,
    scoreMin: program.scoreMin,
    scoreMax: program.scoreMax,
    timeZone: program.timeZone,
    cutoffSchedule: schedule.map((c) => ({ id: c.id, cutoff: c.cutoff, firstPeriod: c.firstPeriod })),
    outcomes: outcomes.map((o) => ({ id: o.id, key: o.key, label: o.label, unit: o.unit, kind: o.kind, goodDirection: o.goodDirection })),
    covariates: covariates.map((c) => ({ id: c.id, key: c.key, label: c.label, unit: c.unit, kind: c.kind })),
  };
}

async function toSummary(ds: DataSource, p: Program): Promise<ProgramSummaryDto> {
  const [schedule, cohortStats] = await Promise.all([
    ds.getRepository(CutoffChange).find({ where: { programId: p.id } }),
    ds
      .getRepository(Cohort)
      .createQueryBuilder('c')
      .select('COUNT(*)', 'count')
      .addSelect('MAX(c.period)', 'latest')
      .where('c.programId = :id', { id: p.id })
      .getRawOne<{ count: string | number; latest: string | null }>(),
  ]);
  const latestPeriod = cohortStats?.latest ?? null;
  const latestScheduled = [...schedule].sort((a, b) => a.firstPeriod.localeCompare(b.firstPeriod)).at(-1);
  return {
    id: p.id,
    slug: p.slug,
    name: p.name,
    description: p.description,
    scoreLabel: p.scoreLabel,
    scoreUnit: p.scoreUnit,
    eligibleSide: p.eligibleSide,
    currentCutoff: latestPeriod ? cutoffForPeriod(schedule, latestPeriod) : (latestScheduled?.cutoff ?? null),
    cohortCount: Number(cohortStats?.count ?? 0),
    latestPeriod,
    populationLabel: p.populationLabel,
    takeUpPhrase: p.takeUpPhrase,
  };
}

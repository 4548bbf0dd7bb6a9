import type { DataSource, EntityManager } from 'typeorm';
import type { ProgramDetailDto } from '@shared/api/programs';
import type { CovariateDefinitionsInput, CutoffScheduleInput, OutcomeDefinitionsInput, ProgramCreateInput } from '@shared/schemas/program-admin';
import type { ProgramInput } from '@shared/schemas/program';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { DesignVersion } from '../entities/design-version.entity';
import { EvaluationDesign } from '../entities/evaluation-design.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { conflict, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { getProgram } from './programs.service';
import { requestRecompute } from './recompute/run-queue';
import { wakeRecompute } from './recompute/wake';

/**
 * Administrators' changes to programs: details, the cutoff schedule, outcome and covariate
 * definitions. Each change is one transaction with its audit event; each bumps the program's
 * `updated_at` (the results cache's stamp, `results-cache.ts`); a changed cutoff schedule queues a
 * recompute, since every month's estimate depends on its cutoff.
 */

/** @throws conflict when the short name is taken */
export async function createProgram(ds: DataSource, actor: AuditActor, input: ProgramCreateInput): Promise<ProgramDetailDto> {
  const id = await ds.transaction(async (tx) => {
    await assertSlugFree(tx, input.program.slug, null);
    const program = await tx.getRepository(Program).save(tx.getRepository(Program).create(input.program));
    await writeSchedule(tx, program.id, input.cutoffSchedule);
    await writeOutcomes(tx, program.id, input.outcomes);
    await writeCovariates(tx, program.id, input.covariates);
    await recordAudit(tx, { actor, action: 'program.create', programId: program.id, subjectType: 'program', subjectId: program.id, details: { cutoffs: input.cutoffSchedule.length, outcomes: input.outcomes.length, covariates: input.covariates.length } });
    return program.id;
  });
  return getProgram(ds, id);
}

/** @throws not_found, conflict when the short name is taken */
export async function updateProgram(ds: DataSource, programId: number, actor: AuditActor, input: ProgramInput): Promise<ProgramDetailDto> {
  await ds.transaction(async (tx) => {
    const program = await lockedProgram(tx, programId);
    await assertSlugFree(tx, input.slug, programId);
    const changed = (Object.keys(input) as Array<keyof ProgramInput>).filter((k) => program[k] !== input[k]);
    await tx.getRepository(Program).update({ id: programId }, { ...input, updatedAt: new Date() });
    await recordAudit(tx, { actor, action: 'program.update', programId, subjectType: 'program', subjectId: programId, details: { part: 'details', fields: changed } });
    if (changed.includes('eligibleSide')) await requestRecompute(tx, { programId, trigger: 'on-demand', actor });
  });
  wakeRecompute(ds);
  return getProgram(ds, programId);
}

/** Replaces the cutoff schedule and queues a recompute. @throws not_found */
export async function replaceCutoffSchedule(ds: DataSource, programId: number, actor: AuditActor, input: CutoffScheduleInput): Promise<ProgramDetailDto> {
  await ds.transaction(async (tx) => {
    await lockedProgram(tx, programId);
    await tx.getRepository(CutoffChange).delete({ programId });
    await writeSchedule(tx, programId, input.changes);
    await touch(tx, programId);
    await recordAudit(tx, { actor, action: 'program.update', programId, subjectType: 'program', subjectId: programId, details: { part: 'cutoff-schedule', changes: input.changes.length } });
    await requestRecompute(tx, { programId, trigger: 'on-demand', actor });
  });
  wakeRecompute(ds);
  return getProgram(ds, programId);
}

/** Replaces the outcome definitions. @throws not_found, conflict when a removed outcome is used by a design */
export async function replaceOutcomes(ds: DataSource, programId: number, actor: AuditActor, input: OutcomeDefinitionsInput): Promise<ProgramDetailDto> {
  await ds.transaction(async (tx) => {
    await lockedProgram(tx, programId);
    await assertNotUsedByDesigns(tx, programId, input.outcomes.map((o) => o.key), 'outcomes', 'outcome');
    await tx.getRepository(OutcomeDefinition).delete({ programId });
    await writeOutcomes(tx, programId, input.outcomes);
    await touch(tx, programId);
    await recordAudit(tx, { actor, action: 'program.update', programId, subjectType: 'program', subjectId: programId, details: { part: 'outcomes', keys: input.outcomes.map((o) => o.key) } });
  });
  return getProgram(ds, programId);
}

/** Replaces the covariate definitions. @throws not_found, conflict when a removed covariate is used by a design */
export async function replaceCovariates(ds: DataSource, programId: number, actor: AuditActor, input: CovariateDefinitionsInput): Promise<ProgramDetailDto> {
  await ds.transaction(async (tx) => {
    await lockedProgram(tx, programId);
    await assertNotUsedByDesigns(tx, programId, input.covariates.map((c) => c.key), 'covariates', 'covariate');
    await tx.getRepository(CovariateDefinition).delete({ programId });
    await writeCovariates(tx, programId, input.covariates);
    await touch(tx, programId);
    await recordAudit(tx, { actor, action: 'program.update', programId, subjectType: 'program', subjectId: programId, details: { part: 'covariates', keys: input.covariates.map((c) => c.key) } });
  });
  return getProgram(ds, programId);
}

async function lockedProgram(tx: EntityManager, programId: number): Promise<Program> {
  const program = await tx.getRepository(Program).createQueryBuilder('p').setLock('pessimistic_write').where('p.id = :programId', { programId }).getOne();
  if (!program) throw notFound('Program');
  return program;
}

async function touch(tx: EntityManager, programId: number): Promise<void> {
  await tx.getRepository(Program).update({ id: programId }, { updatedAt: new Date() });
}

async function assertSlugFree(tx: EntityManager, slug: string, programId: number | null): Promise<void> {
  const other = await tx.getRepository(Program).findOneBy({ slug });
  if (other && other.id !== programId) throw conflict(`Another program already uses the short name “${slug}”. Choose another.`);
}

/** A design's current settings may name only variables the program still defines. */
async function assertNotUsedByDesigns(tx: EntityManager, programId: number, keptKeys: readonly string[], field: 'outcomes' | 'covariates', what: string): Promise<void> {
  const designs = await tx.getRepository(EvaluationDesign).findBy({ programId });
  for (const d of designs) {
    const version = await tx.getRepository(DesignVersion).findOneBy({ designId: d.id, version: d.currentVersion });
    const used = (version?.settings[field] ?? []).filter((k) => !keptKeys.includes(k));
    if (used.length > 0) {
      throw conflict(`The evaluation design “${d.name}” still uses the ${what} ${used.map((k) => `“${k}”`).join(', ')}. An analyst removes it from the design first (a new design version).`);
    }
  }
}

async function writeSchedule(tx: EntityManager, programId: number, changes: CutoffScheduleInput['changes']): Promise<void> {
  await tx.getRepository(CutoffChange).insert(changes.map((c) => ({ programId, cutoff: c.cutoff, firstPeriod: c.firstPeriod })));
}

async function writeOutcomes(tx: EntityManager, programId: number, outcomes: OutcomeDefinitionsInput['outcomes']): Promise<void> {
  if (outcomes.length > 0) await tx.getRepository(OutcomeDefinition).insert(outcomes.map((o, i) => ({ ...o, programId, position: i + 1 })));
}

async function writeCovariates(tx: EntityManager, programId: number, covariates: CovariateDefinitionsInput['covariates']): Promise<void> {
  if (covariates.length > 0) await tx.getRepository(CovariateDefinition).insert(covariates.map((c, i) => ({ ...c, programId, position: i + 1 })));
}

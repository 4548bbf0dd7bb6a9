import type { DataSource, EntityManager } from 'typeorm';
import type { DesignComparisonDto, DesignDetailDto, DesignDto, DesignVersionDto, DeviationDto } from '@shared/api/designs';
import type { DesignCreateInput, DesignLockInput, DesignSettings, DesignUpdateInput, DesignVersionCreateInput } from '@shared/schemas/design';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { DesignDeviation } from '../entities/design-deviation.entity';
import { DesignVersion } from '../entities/design-version.entity';
import { EvaluationDesign } from '../entities/evaluation-design.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { AppError, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { changedSettings } from './design-settings';
import { acceptedExtracts } from './recompute/accepted-extracts';
import { requestRecompute } from './recompute/run-queue';

/** Designs of a program, primary first, then by name. */
export async function listDesigns(ds: DataSource, programId: number): Promise<DesignDto[]> {
  const designs = await ds.getRepository(EvaluationDesign).find({ where: { programId }, order: { name: 'ASC', id: 'ASC' } });
  const out = await Promise.all(designs.map((d) => toDesignDto(ds.manager, d)));
  return out.sort((a, b) => Number(b.primary) - Number(a.primary));
}

/** @throws not_found */
export async function getDesign(ds: DataSource, programId: number, designId: number): Promise<DesignDetailDto> {
  const design = await findDesign(ds.manager, programId, designId);
  const versions = await ds.getRepository(DesignVersion).find({ where: { designId }, order: { version: 'DESC' } });
  const deviations = await ds.getRepository(DesignDeviation).find({ where: { designId }, order: { toVersion: 'DESC' } });
  return { ...(await toDesignDto(ds.manager, design)), versions: versions.map(toVersionDto), deviations: deviations.map(toDeviationDto) };
}

/**
 * A new design with its first version. The program's first design becomes its primary design.
 * @throws design_setting_unknown when an outcome or covariate is not defined for the program
 */
export async function createDesign(ds: DataSource, programId: number, actor: AuditActor, input: DesignCreateInput): Promise<DesignDetailDto> {
  const id = await ds.transaction(async (tx) => {
    await lockProgram(tx, programId);
    await checkSettingsAgainstProgram(tx, programId, input.settings);
    const hasPrimary = await tx.getRepository(EvaluationDesign).existsBy({ primaryOfProgramId: programId });
    const primary = input.primary || !hasPrimary;
    if (primary && hasPrimary) await tx.getRepository(EvaluationDesign).update({ primaryOfProgramId: programId }, { primaryOfProgramId: null });
    const design = await tx.getRepository(EvaluationDesign).save(
      tx.getRepository(EvaluationDesign).create({
        programId,
        name: input.name,
        primaryOfProgramId: primary ? programId : null,
        currentVersion: 1,
        lockedAt: null,
        lockedByUserId: null,
        lockedByLabel: null,
        lockedVersion: null,
        lockNote: null,
        periodsSeenBeforeLock: null,
      }),
    );
    await tx.getRepository(DesignVersion).insert({
      designId: design.id,
      version: 1,
      settings: input.settings,
      reason: null,
      createdByUserId: actor.userId,
      createdByLabel: actor.label,
    });
    await recordAudit(tx, { actor, action: 'design.create', programId, subjectType: 'design', subjectId: design.id, details: { version: 1, primary } });
    if (primary) await requestRecompute(tx, { programId, trigger: 'design-changed', actor });
    return design.id;
  });
  return getDesign(ds, programId, id);
}

/**
 * An edit: writes the next version. After the lock a reason is required and the change is
 * recorded as a deviation (with the settings that changed) beside the new version.
 * @throws design_unchanged | deviation_reason_required | design_setting_unknown | not_found
 */
export async function createDesignVersion(
  ds: DataSource,
  programId: number,
  designId: number,
  actor: AuditActor,
  input: DesignVersionCreateInput,
): Promise<DesignDetailDto> {
  await ds.transaction(async (tx) => {
    const design = await findDesign(tx, programId, designId, true);
    await checkSettingsAgainstProgram(tx, programId, input.settings);
    const current = await tx.getRepository(DesignVersion).findOneByOrFail({ designId, version: design.currentVersion });
    const changed = changedSettings(current.settings, input.settings);
    if (changed.length === 0) throw new AppError('design_unchanged', 'These settings are the same as the current version, so no new version was written.');
    const reason = input.reason?.trim() || null;
    if (design.lockedAt && !reason) {
      throw new AppError('deviation_reason_required', 'This design is locked (pre-registered). Say why it changes: the reason is recorded as a deviation beside the results.');
    }
    const next = design.currentVersion + 1;
    await tx.getRepository(DesignVersion).insert({ designId, version: next, settings: input.settings, reason, createdByUserId: actor.userId, createdByLabel: actor.label });
    await tx.getRepository(EvaluationDesign).update({ id: designId }, { currentVersion: next });
    await recordAudit(tx, { actor, action: 'design.version', programId, subjectType: 'design', subjectId: designId, details: { version: next, changed } });
    if (design.lockedAt) {
      await tx.getRepository(DesignDeviation).insert({
        designId,
        fromVersion: design.currentVersion,
        toVersion: next,
        reason: reason!,
        changed,
        recordedByUserId: actor.userId,
        recordedByLabel: actor.label,
      });
      await recordAudit(tx, {
        actor,
        action: 'design.deviation',
        programId,
        subjectType: 'design',
        subjectId: designId,
        details: { fromVersion: design.currentVersion, toVersion: next, changed, reason },
      });
    }
    if (design.primaryOfProgramId !== null) await requestRecompute(tx, { programId, trigger: 'design-changed', actor });
  });
  return getDesign(ds, programId, designId);
}

/**
 * Pre-registers the current version: timestamped, with the cohorts whose outcomes were already
 * loaded, so results of later cohorts can say they follow a plan fixed before their data arrived.
 * @throws design_locked when it is locked already
 */
export async function lockDesign(ds: DataSource, programId: number, designId: number, actor: AuditActor, input: DesignLockInput): Promise<DesignDetailDto> {
  await ds.transaction(async (tx) => {
    const design = await findDesign(tx, programId, designId, true);
    if (design.lockedAt) {
      throw new AppError('design_locked', `This design was locked on ${design.lockedAt.toISOString().slice(0, 10)}; a lock cannot be moved. Later changes are recorded as deviations.`);
    }
    const seen = (await acceptedExtracts(tx, programId)).map((e) => e.period);
    await tx.getRepository(EvaluationDesign).update(
      { id: designId },
      {
        lockedAt: new Date(),
        lockedByUserId: actor.userId,
        lockedByLabel: actor.label,
        lockedVersion: design.currentVersion,
        lockNote: input.note?.trim() || null,
        periodsSeenBeforeLock: seen,
      },
    );
    await recordAudit(tx, {
      actor,
      action: 'design.lock',
      programId,
      subjectType: 'design',
      subjectId: designId,
      details: { version: design.currentVersion, periodsSeenBeforeLock: seen.length },
    });
  });
  return getDesign(ds, programId, designId);
}

/** Renames a design or makes it the program's primary design (which queues a recompute). */
export async function updateDesign(ds: DataSource, programId: number, designId: number, actor: AuditActor, input: DesignUpdateInput): Promise<DesignDetailDto> {
  await ds.transaction(async (tx) => {
    await lockProgram(tx, programId);
    const design = await findDesign(tx, programId, designId, true);
    if (input.name !== undefined) await tx.getRepository(EvaluationDesign).update({ id: designId }, { name: input.name });
    if (input.primary && design.primaryOfProgramId === null) {
      await tx.getRepository(EvaluationDesign).update({ primaryOfProgramId: programId }, { primaryOfProgramId: null });
      await tx.getRepository(EvaluationDesign).update({ id: designId }, { primaryOfProgramId: programId });
      await requestRecompute(tx, { programId, trigger: 'design-changed', actor });
    }
    await recordAudit(tx, { actor, action: 'design.version', programId, subjectType: 'design', subjectId: designId, details: { renamed: input.name !== undefined, primary: input.primary ?? false } });
  });
  return getDesign(ds, programId, designId);
}

/** The settings that differ between two versions of a design. @throws not_found */
export async function compareDesignVersions(ds: DataSource, programId: number, designId: number, from: number, to: number): Promise<DesignComparisonDto> {
  await findDesign(ds.manager, programId, designId);
  const repo = ds.getRepository(DesignVersion);
  const [a, b] = await Promise.all([repo.findOneBy({ designId, version: from }), repo.findOneBy({ designId, version: to })]);
  if (!a || !b) throw notFound(`Version ${!a ? from : to} of this design`);
  return {
    designId,
    from: toVersionDto(a),
    to: toVersionDto(b),
    changes: changedSettings(a.settings, b.settings).map((setting) => ({ setting, from: a.settings[setting], to: b.settings[setting] })),
  };
}

/** The primary design of a program with its current version, or null. */
export async function primaryDesign(manager: EntityManager, programId: number): Promise<{ design: EvaluationDesign; version: DesignVersion } | null> {
  const design = await manager.getRepository(EvaluationDesign).findOneBy({ primaryOfProgramId: programId });
  if (!design) return null;
  const version = await manager.getRepository(DesignVersion).findOneByOrFail({ designId: design.id, version: design.currentVersion });
  return { design, version };
}

/** Deviations that apply to results of `version`: those recorded up to it. */
export async function deviationsUpTo(manager: EntityManager, designId: number, version: number): Promise<DeviationDto[]> {
  const rows = await manager
    .getRepository(DesignDeviation)
    .createQueryBuilder('d')
    .where('d.designId = :designId AND d.toVersion <= :version', { designId, version })
    .orderBy('d.toVersion', 'ASC')
    .getMany();
  return rows.map(toDeviationDto);
}

async function findDesign(manager: EntityManager, programId: number, designId: number, forUpdate = false): Promise<EvaluationDesign> {
  const qb = manager.getRepository(EvaluationDesign).createQueryBuilder('d').where('d.id = :designId AND d.programId = :programId', { designId, programId });
  if (forUpdate) qb.setLock('pessimistic_write');
  const design = await qb.getOne();
  if (!design) throw notFound('Design');
  return design;
}

/** Serialises design changes of one program (one primary design at a time). */
async function lockProgram(tx: EntityManager, programId: number): Promise<void> {
  const program = await tx.getRepository(Program).createQueryBuilder('p').setLock('pessimistic_write').where('p.id = :programId', { programId }).getOne();
  if (!program) throw notFound('Program');
}

async function checkSettingsAgainstProgram(tx: EntityManager, programId: number, settings: DesignSettings): Promise<void> {
  const outcomes = new Set((await tx.getRepository(OutcomeDefinition).findBy({ programId })).map((o) => o.key));
  const covariates = new Set((await tx.getRepository(CovariateDefinition).findBy({ programId })).map((c) => c.key));
  const unknownOutcomes = settings.outcomes.filter((k) => !outcomes.has(k));
  const unknownCovariates = settings.covariates.filter((k) => !covariates.has(k));
  if (unknownOutcomes.length > 0 || unknownCovariates.length > 0) {
    throw new AppError('design_setting_unknown', 'Some outcomes or covariates of this design are not defined for the program. Choose from the program’s definitions.', {
      details: { outcomes: unknownOutcomes, covariates: unknownCovariates },
    });
  }
}

async function toDesignDto(manager: EntityManager, d: EvaluationDesign): Promise<DesignDto> {
  const version = await manager.getRepository(DesignVersion).findOneByOrFail({ designId: d.id, version: d.currentVersion });
  const deviationCount = await manager.getRepository(DesignDeviation).countBy({ designId: d.id });
  return {
    id: d.id,
    programId: d.programId,
    name: d.name,
    primary: d.primaryOfProgramId !== null,
    currentVersion: toVersionDto(version),
    lock: d.lockedAt
      ? {
          lockedAt: d.lockedAt.toISOString(),
          lockedBy: d.lockedByLabel ?? 'unknown',
          lockedVersion: d.lockedVersion ?? 1,
          note: d.lockNote,
          periodsSeenBeforeLock: d.periodsSeenBeforeLock ?? [],
        }
      : null,
    deviationCount,
    createdAt: d.createdAt.toISOString(),
    updatedAt: d.updatedAt.toISOString(),
  };
}

export function toVersionDto(v: DesignVersion): DesignVersionDto {
  return { id: v.id, designId: v.designId, version: v.version, settings: v.settings, createdAt: v.createdAt.toISOString(), createdBy: v.createdByLabel, reason: v.reason };
}

function toDeviationDto(d: DesignDeviation): DeviationDto {
  return {
    id: d.id,
    designId: d.designId,
    fromVersion: d.fromVersion,
    toVersion: d.toVersion,
    reason: d.reason,
    changed: d.changed,
    recordedAt: d.recordedAt.toISOString(),
    recordedBy: d.recordedByLabel,
  };
}

import { In, IsNull, type EntityManager, type DataSource } from 'typeorm';
import type { GrantDto } from '@shared/api/auth';
import type { GrantCreateInput } from '@shared/schemas/users';
import type { GroupRoleRule } from '../auth/group-roles';
import { Program } from '../entities/program.entity';
import { RoleGrant } from '../entities/role-grant.entity';
import { User } from '../entities/user.entity';
import { conflict, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';

export function toGrantDto(g: RoleGrant): GrantDto {
  return {
    id: g.id,
    role: g.role,
    programId: g.programId,
    programName: g.program?.name ?? null,
    source: g.source,
    group: g.groupName,
    createdAt: g.createdAt.toISOString(),
  };
}

/** Grants of some users with their program names, oldest first. */
export async function grantsOfUsers(manager: EntityManager, userIds: readonly number[]): Promise<Map<number, GrantDto[]>> {
  const byUser = new Map<number, GrantDto[]>(userIds.map((id) => [id, []]));
  if (userIds.length === 0) return byUser;
  const grants = await manager.getRepository(RoleGrant).find({
    where: { userId: In([...userIds]) },
    relations: { program: true },
    order: { createdAt: 'ASC', id: 'ASC' },
  });
  for (const g of grants) byUser.get(g.userId)?.push(toGrantDto(g));
  return byUser;
}

/**
 * Gives a person a role, agency-wide or for one program, and records it in the audit trail.
 * @throws not_found for an unknown person or program; conflict when they already hold it there
 */
export async function addGrant(ds: DataSource, actor: AuditActor, userId: number, input: GrantCreateInput): Promise<GrantDto> {
  return ds.transaction(async (tx) => {
    await lockUser(tx, userId);
    let program: Program | null = null;
    if (input.programId !== null) {
      program = await tx.getRepository(Program).findOneBy({ id: input.programId });
      if (!program) throw notFound('Program');
    }
    const repo = tx.getRepository(RoleGrant);
    const existing = await repo.findOneBy({ userId, role: input.role, programId: input.programId ?? IsNull(), source: 'admin' });
    if (existing) {
      throw conflict(input.programId === null ? 'This person already holds that role agency-wide.' : 'This person already holds that role for this program.');
    }
    const grant = await repo.save(
      repo.create({ userId, role: input.role, programId: input.programId, source: 'admin', groupName: null, grantedByUserId: actor.userId }),
    );
    await recordAudit(tx, {
      actor,
      action: 'grant.add',
      programId: input.programId,
      subjectType: 'user',
      subjectId: userId,
      details: { grantId: grant.id, role: input.role, agencyWide: input.programId === null },
    });
    grant.program = program ?? undefined;
    return toGrantDto(grant);
  });
}

/**
 * Takes a role away and records it. Roles that come from identity-provider groups change at the
 * identity provider, and the last agency-wide administrator cannot be removed.
 * @throws not_found, conflict
 */
export async function revokeGrant(ds: DataSource, actor: AuditActor, grantId: number): Promise<void> {
  await ds.transaction(async (tx) => {
    const repo = tx.getRepository(RoleGrant);
    const found = await repo.findOneBy({ id: grantId });
    if (!found) throw notFound('Grant');
    await lockUser(tx, found.userId);
    if (found.source === 'group') {
      throw conflict(`This role comes from the identity-provider group “${found.groupName}”. Change the group membership at the identity provider.`);
    }
    if (found.role === 'admin' && found.programId === null && (await otherAgencyAdmins(tx, found.userId)) === 0) {
      throw conflict('Cutline needs at least one agency-wide administrator. Grant the role to someone else first.');
    }
    await repo.delete({ id: grantId });
    await recordAudit(tx, {
      actor,
      action: 'grant.revoke',
      programId: found.programId,
      subjectType: 'user',
      subjectId: found.userId,
      details: { grantId, role: found.role, agencyWide: found.programId === null },
    });
  });
}

/** Active people other than `userId` who hold agency-wide admin. */
export async function otherAgencyAdmins(manager: EntityManager, userId: number): Promise<number> {
  return manager
    .getRepository(RoleGrant)
    .createQueryBuilder('g')
    .innerJoin(User, 'u', 'u.id = g.userId')
    .where('g.role = :role AND g.programId IS NULL AND u.active = 1 AND g.userId <> :userId', { role: 'admin', userId })
    .select('COUNT(DISTINCT g.userId)', 'n')
    .getRawOne<{ n: string | number }>()
    .then((r) => Number(r?.n ?? 0));
}

/**
 * Makes a person's group-derived grants match the groups the identity provider just sent: adds
 * what the rules give, removes what they no longer give. Administrator grants are left alone.
 * Rules naming an unknown program are skipped (returned in `unknownPrograms`).
 */
export async function syncGroupGrants(
  tx: EntityManager,
  actor: AuditActor,
  userId: number,
  rules: readonly GroupRoleRule[],
): Promise<{ added: number; removed: number; unknownPrograms: number }> {
  const slugs = [...new Set(rules.map((r) => r.programSlug).filter((s): s is string => s !== null))];
  const programs = slugs.length ? await tx.getRepository(Program).findBy({ slug: In(slugs) }) : [];
  const idOf = new Map(programs.map((p) => [p.slug, p.id]));
  const key = (role: string, programId: number | null, group: string | null) => `${role}|${programId ?? '*'}|${group}`;
  const wanted = new Map<string, { role: GroupRoleRule['role']; programId: number | null; group: string }>();
  let unknownPrograms = 0;
  for (const r of rules) {
    const programId = r.programSlug === null ? null : (idOf.get(r.programSlug) ?? undefined);
    if (programId === undefined) {
      unknownPrograms++;
      continue;
    }
    wanted.set(key(r.role, programId, r.group), { role: r.role, programId, group: r.group });
  }
  const repo = tx.getRepository(RoleGrant);
  const held = await repo.findBy({ userId, source: 'group' });
  const stale = held.filter((g) => !wanted.has(key(g.role, g.programId, g.groupName)));
  const heldKeys = new Set(held.map((g) => key(g.role, g.programId, g.groupName)));
  const fresh = [...wanted.entries()].filter(([k]) => !heldKeys.has(k)).map(([, w]) => w);
  if (stale.length) await repo.delete({ id: In(stale.map((g) => g.id)) });
  for (const w of fresh) {
    const grant = await repo.save(repo.create({ userId, role: w.role, programId: w.programId, source: 'group', groupName: w.group, grantedByUserId: null }));
    await recordAudit(tx, {
      actor,
      action: 'grant.add',
      programId: w.programId,
      subjectType: 'user',
      subjectId: userId,
      details: { grantId: grant.id, role: w.role, agencyWide: w.programId === null, source: 'group' },
    });
  }
  for (const g of stale) {
    await recordAudit(tx, {
      actor,
      action: 'grant.revoke',
      programId: g.programId,
      subjectType: 'user',
      subjectId: userId,
      details: { grantId: g.id, role: g.role, agencyWide: g.programId === null, source: 'group' },
    });
  }
  return { added: fresh.length, removed: stale.length, unknownPrograms };
}

/** Serialises changes to one person's grants. @throws not_found */
async function lockUser(tx: EntityManager, userId: number): Promise<User> {
  const user = await tx.getRepository(User).createQueryBuilder('u').setLock('pessimistic_write').where('u.id = :userId', { userId }).getOne();
  if (!user) throw notFound('Person');
  return user;
}

import { Brackets, IsNull, type DataSource } from 'typeorm';
import type { ListDto } from '@shared/api/programs';
import type { UserDto } from '@shared/api/auth';
import type { UserCreateInput, UserListQuery, UserUpdateInput } from '@shared/schemas/users';
import type { GroupRoleRule } from '../auth/group-roles';
import type { Role } from '@shared/schemas/roles';
import { RoleGrant } from '../entities/role-grant.entity';
import { User } from '../entities/user.entity';
import type { CurrentUser } from '../http/current-user';
import { conflict, notFound } from '../lib/errors';
import { recordAudit, type AuditActor } from './audit.service';
import { grantsOfUsers, otherAgencyAdmins, syncGroupGrants } from './grants.service';

/**
 * The signed-in user with their grants, loaded on every request; null when unknown or switched off.
 * One round trip (a join, not two entity queries): it runs before every API answer.
 */
export async function loadCurrentUser(ds: DataSource, userId: number): Promise<CurrentUser | null> {
  const rows = (await ds.query(
    `SELECT u.id, u.email, u.display_name AS displayName, g.role, g.program_id AS programId
       FROM app_user u LEFT JOIN role_grant g ON g.user_id = u.id
      WHERE u.id = ? AND u.active = 1
      ORDER BY g.id`,
    [userId],
  )) as Array<{ id: number; email: string; displayName: string; role: Role | null; programId: number | null }>;
  const [user] = rows;
  if (!user) return null;
  return {
    id: Number(user.id),
    email: user.email,
    displayName: user.displayName,
    grants: rows.flatMap((g) => (g.role === null ? [] : [{ role: g.role, programId: g.programId === null ? null : Number(g.programId) }])),
  };
}

/** What a verified assertion says about the person. */
export interface SignInIdentity {
  email: string;
  displayName: string;
  nameId: string;
  /** The group rules that apply to the groups the identity provider sent. */
  groupRules: readonly GroupRoleRule[];
}

export type SignInResult = { ok: true; userId: number; label: string } | { ok: false; reason: 'account_disabled'; userId: number; label: string };

/**
 * Finds or creates the person named by a verified assertion, refreshes their name and
 * group-derived grants, and stamps the sign-in. People are matched by e-mail address.
 */
export async function signInUser(ds: DataSource, identity: SignInIdentity): Promise<SignInResult> {
  return ds.transaction(async (tx) => {
    const repo = tx.getRepository(User);
    let user = await repo.createQueryBuilder('u').setLock('pessimistic_write').where('u.email = :email', { email: identity.email }).getOne();
    if (!user) {
      user = await repo.save(repo.create({ email: identity.email, displayName: identity.displayName, nameId: identity.nameId, active: true, lastSignInAt: null }));
    }
    const actor = { userId: user.id, label: identity.displayName };
    if (!user.active) return { ok: false, reason: 'account_disabled', userId: user.id, label: user.displayName };
    await repo.update({ id: user.id }, { displayName: identity.displayName, nameId: identity.nameId, lastSignInAt: new Date() });
    await syncGroupGrants(tx, actor, user.id, identity.groupRules);
    return { ok: true, userId: user.id, label: identity.displayName };
  });
}

function toUserDto(u: User, grants: UserDto['grants']): UserDto {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    active: u.active,
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
    createdAt: u.createdAt.toISOString(),
    grants,
  };
}

/** People by name, one page at a time; `q` matches part of the name or e-mail address. */
export async function listUsers(ds: DataSource, query: UserListQuery): Promise<ListDto<UserDto>> {
  const qb = ds.getRepository(User).createQueryBuilder('u').orderBy('u.displayName', 'ASC').addOrderBy('u.id', 'ASC');
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    qb.where(new Brackets((w) => w.where('u.displayName LIKE :like', { like }).orWhere('u.email LIKE :like', { like })));
  }
  const [users, total] = await qb
    .skip((query.page - 1) * query.pageSize)
    .take(query.pageSize)
    .getManyAndCount();
  const grants = await grantsOfUsers(ds.manager, users.map((u) => u.id));
  return { items: users.map((u) => toUserDto(u, grants.get(u.id) ?? [])), total, page: query.page, pageSize: query.pageSize };
}

/** One person with their grants. @throws not_found */
export async function getUser(ds: DataSource, userId: number): Promise<UserDto> {
  const user = await ds.getRepository(User).findOneBy({ id: userId });
  if (!user) throw notFound('Person');
  const grants = await grantsOfUsers(ds.manager, [userId]);
  return toUserDto(user, grants.get(userId) ?? []);
}

/**
 * Adds a person ahead of their first sign-in so that roles can be granted in advance; the
 * identity provider's name replaces the one given here when they first sign in.
 * @throws conflict when someone with that e-mail address exists
 */
export async function createUser(ds: DataSource, actor: AuditActor, input: UserCreateInput): Promise<UserDto> {
  const id = await ds.transaction(async (tx) => {
    const repo = tx.getRepository(User);
    if (await repo.existsBy({ email: input.email })) throw conflict('Someone with this e-mail address is already on the list.');
    const user = await repo.save(repo.create({ email: input.email, displayName: input.displayName, nameId: null, active: true, lastSignInAt: null }));
    await recordAudit(tx, { actor, action: 'user.update', subjectType: 'user', subjectId: user.id, details: { change: 'added' } });
    return user.id;
  });
  return getUser(ds, id);
}

/**
 * Switches an account off or on. Switching off ends the person's sessions at their next request
 * (sessions are checked against the account every time).
 * @throws not_found; conflict for one's own account or the last agency-wide administrator
 */
export async function updateUser(ds: DataSource, actor: AuditActor, userId: number, input: UserUpdateInput): Promise<UserDto> {
  await ds.transaction(async (tx) => {
    const repo = tx.getRepository(User);
    const user = await repo.createQueryBuilder('u').setLock('pessimistic_write').where('u.id = :userId', { userId }).getOne();
    if (!user) throw notFound('Person');
    if (input.active === user.active) return;
    if (!input.active) {
      if (actor.userId === userId) throw conflict('You cannot switch off your own account.');
      const isAgencyAdmin = await tx.getRepository(RoleGrant).existsBy({ userId, role: 'admin', programId: IsNull() });
      if (isAgencyAdmin && (await otherAgencyAdmins(tx, userId)) === 0) {
        throw conflict('Cutline needs at least one active agency-wide administrator. Grant the role to someone else first.');
      }
    }
    await repo.update({ id: userId }, { active: input.active });
    await recordAudit(tx, { actor, action: 'user.update', subjectType: 'user', subjectId: userId, details: { change: input.active ? 'switched-on' : 'switched-off' } });
  });
  return getUser(ds, userId);
}

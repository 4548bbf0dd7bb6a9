import type { Role } from '../schemas/roles';

/** A role held agency-wide (`programId: null`) or for one program. */
export interface GrantLike {
  role: Role;
  programId: number | null;
}

/** Where a role is needed: anywhere in the agency (an agency-wide grant), or for one program. */
export type RoleScope = { scope: 'agency' } | { scope: 'program'; programId: number };

/**
 * Whether the grants give one of `roles` where it is needed. An agency-wide grant covers every
 * program; a program grant covers only its own program and never an agency-wide need.
 * The server's access check and the client's navigation both use this, so they cannot disagree.
 * @example holdsRole([{ role: 'analyst', programId: 3 }], ['analyst'], { scope: 'program', programId: 3 }) // => true
 */
export function holdsRole(grants: readonly GrantLike[], roles: readonly Role[], where: RoleScope): boolean {
  return grants.some(
    (g) => roles.includes(g.role) && (g.programId === null || (where.scope === 'program' && g.programId === where.programId)),
  );
}

/** Programs the grants reach: 'all' when any grant is agency-wide, otherwise the distinct program ids. */
export function visibleProgramIds(grants: readonly GrantLike[]): 'all' | number[] {
  if (grants.some((g) => g.programId === null)) return 'all';
  return [...new Set(grants.map((g) => g.programId as number))].sort((a, b) => a - b);
}

/** Roles the grants give for one program (agency-wide grants included), in the order of `ROLES`. */
export function rolesForProgram(grants: readonly GrantLike[], programId: number): Role[] {
  return [...new Set(grants.filter((g) => g.programId === null || g.programId === programId).map((g) => g.role))];
}

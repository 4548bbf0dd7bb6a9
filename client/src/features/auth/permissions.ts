import type { MeDto } from '@shared/api/auth';
import { holdsRole } from '@shared/domain/access';
import type { Role } from '@shared/schemas/roles';

/**
 * What the signed-in person may use, for navigation and buttons. The server decides; these
 * mirror its rules (`shared/domain/access.ts`) so nobody is shown what they cannot open.
 */
export const isAgencyAdmin = (me: MeDto): boolean => holdsRole(me.grants, ['admin'], { scope: 'agency' });

export const holdsRoleForProgram = (me: MeDto, roles: readonly Role[], programId: number): boolean =>
  holdsRole(me.grants, roles, { scope: 'program', programId });

/** Holds one of the roles for some program or agency-wide. */
export const holdsAnyRole = (me: MeDto, roles: readonly Role[]): boolean => me.grants.some((g) => roles.includes(g.role));

import type { Request } from 'express';
import { holdsRole, visibleProgramIds } from '@shared/domain/access';
import type { AccessEnforcer } from '../http/access';
import { idParam } from '../http/validate';
import { csrfInvalid, forbidden, sessionExpired, unauthenticated } from '../lib/errors';
import type { ProgramVisibility } from '../services/programs.service';
import { csrfTokenMatches, SAFE_METHODS } from './csrf';

/**
 * The access check behind every `allow(rule)`: who is signed in (401), whether a state-changing
 * request carries the session's CSRF token (403 `csrf_invalid`), and whether their grants hold
 * one of the rule's roles where it is needed (403). Installed by `createApp` before routes are built.
 */
export const enforceAccess: AccessEnforcer = (rule) => (req, _res, next) => {
  if (rule.kind === 'public') return next();
  const user = req.user;
  if (!user) throw req.sessionEnded ? sessionExpired() : unauthenticated();
  if (!SAFE_METHODS.has(req.method) && !csrfTokenMatches(req)) throw csrfInvalid();
  if (rule.kind === 'signed-in') return next();
  if (rule.scope === 'agency') {
    if (!holdsRole(user.grants, rule.roles, { scope: 'agency' })) {
      throw forbidden(`This needs an agency-wide grant as ${listRoles(rule.roles)}.`);
    }
    return next();
  }
  const programId = idParam(req.params.programId, 'Program id');
  if (!holdsRole(user.grants, rule.roles, { scope: 'program', programId })) {
    throw forbidden(`This needs the role ${listRoles(rule.roles)} for this program, and you do not hold it.`);
  }
  next();
};

/** `AppContext.visiblePrograms`: the programs the signed-in user's grants reach. */
export function visibleProgramsOf(req: Request): ProgramVisibility {
  return req.user ? visibleProgramIds(req.user.grants) : [];
}

function listRoles(roles: readonly string[]): string {
  return roles.length <= 1 ? (roles[0] ?? 'a role') : `${roles.slice(0, -1).join(', ')} or ${roles.at(-1)}`;
}

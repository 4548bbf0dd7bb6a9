import type { RequestHandler } from 'express';
import type { Role } from '@shared/schemas/roles';

/**
 * Who may call a route. Every API route declares one with `allow(...)` as its first handler; a
 * test walks the router and fails on any route without a rule.
 * - `public`: anyone (health, sign-in endpoints).
 * - `signed-in`: any signed-in user.
 * - `roles` + `scope: 'program'`: one of the roles, granted for the program in `:programId` or agency-wide.
 * - `roles` + `scope: 'agency'`: one of the roles, granted agency-wide.
 */
export type AccessRule =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  | { kind: 'roles'; roles: readonly Role[]; scope: 'program' | 'agency' };

export type AccessMiddleware = RequestHandler & { accessRule: AccessRule };

/** Builds the middleware that checks a rule (`server/auth/access-enforcer.ts`). */
export type AccessEnforcer = (rule: AccessRule) => RequestHandler;

/** Until the real check is installed, nothing gets through: a route built too early fails closed. */
let enforcer: AccessEnforcer = () => (_req, _res, next) => next(new Error('The access check is not installed: build routes through createApp.'));

/** Installed by `createApp` before routes are built. */
export function setAccessEnforcer(next: AccessEnforcer): void {
  enforcer = next;
}

export function allow(rule: AccessRule): AccessMiddleware {
  const check = enforcer(rule);
  const middleware: RequestHandler = (req, res, next) => check(req, res, next);
  return Object.assign(middleware, { accessRule: rule });
}

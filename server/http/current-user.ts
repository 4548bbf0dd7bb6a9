import type { Request } from 'express';
import type {} from 'passport';
import type { Role } from '@shared/schemas/roles';
import { unauthenticated } from '../lib/errors';
import type { AuditActor } from '../services/audit.service';

/** The signed-in user as the sign-in module puts it on `req.user`. */
export interface CurrentUser {
  id: number;
  email: string;
  displayName: string;
  /** `programId: null` is an agency-wide grant. */
  grants: ReadonlyArray<{ role: Role; programId: number | null }>;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport types `req.user` as Express.User; ours is CurrentUser.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends CurrentUser {}
  }
}

export function currentUser(req: Request): CurrentUser | null {
  return req.user ?? null;
}

/** @throws unauthenticated when nobody is signed in. */
export function requireUser(req: Request): CurrentUser {
  const user = currentUser(req);
  if (!user) throw unauthenticated();
  return user;
}

/** The audit actor of a request. */
export function actorOf(req: Request): AuditActor {
  const user = currentUser(req);
  return user ? { userId: user.id, label: user.displayName } : { userId: null, label: 'anonymous' };
}

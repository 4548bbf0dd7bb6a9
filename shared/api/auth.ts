import type { GrantSource } from '../schemas/users';
import type { Role } from '../schemas/roles';

/** One role grant as the API shows it. `programId: null` is agency-wide. */
export interface GrantDto {
  id: number;
  role: Role;
  programId: number | null;
  /** Name of the program, or null for agency-wide grants. */
  programName: string | null;
  source: GrantSource;
  /** The identity-provider group the grant came from, when `source` is 'group'. */
  group: string | null;
  createdAt: string;
}

/** `GET /api/me`: who is signed in, what they may do, and the token for state-changing requests. */
export interface MeDto {
  user: { id: number; email: string; displayName: string };
  grants: GrantDto[];
  /** Send as the `X-CSRF-Token` header on every POST, PUT, PATCH and DELETE. */
  csrfToken: string;
  session: {
    /** The session ends after this many minutes without a request. */
    idleMinutes: number;
    /** The session ends at this instant whatever happens (ISO 8601). */
    endsAt: string;
  };
  /** The agency's locale (BCP 47) and time zone (IANA) for numbers and dates on screens. */
  agency?: { locale: string; timeZone: string };
}

/** A row of `GET /api/admin/users`. */
export interface UserDto {
  id: number;
  email: string;
  displayName: string;
  active: boolean;
  lastSignInAt: string | null;
  createdAt: string;
  grants: GrantDto[];
}

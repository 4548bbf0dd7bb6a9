import { Strategy as SamlStrategy, ValidateInResponseTo, type Profile, type VerifiedCallback } from '@node-saml/passport-saml';
import type { RequestHandler } from 'express';
import { Passport } from 'passport';
import type { AppContext } from '../app-context';
import type { CurrentUser } from '../http/current-user';
import { reusedReads } from '../http/reused-reads';
import { loadCurrentUser } from '../services/users.service';
import { completeSignIn } from './complete-sign-in';
import { parseGroupRoles, type GroupRoleRule } from './group-roles';
import { MariaDbSamlRequestCache } from './saml-request-cache';
import { sessionLifetime, sessionMiddleware } from './session';

/** How long a sign-in request waits for its answer: 10 minutes (common practice, no source). */
export const SIGN_IN_REQUEST_LIFETIME_MS = 10 * 60_000;
/** Clock difference tolerated between Cutline and the identity provider: 60 s (common practice, no source). */
export const CLOCK_SKEW_MS = 60_000;

/** The sign-in machinery of one app: its own passport instance (never the global one), the SAML strategy and the session handlers. */
export interface SignIn {
  passport: InstanceType<typeof Passport>;
  strategy: SamlStrategy;
  groupRules: GroupRoleRule[];
  /** Session, signed-in person and timeout handling, in order; mounted on /api and /auth. */
  handlers: RequestHandler[];
}

/**
 * People with their grants by database and id, reused for a moment (`server/http/reused-reads.ts`);
 * one map per process, whatever number of apps it builds. Switched-off accounts are never kept.
 */
const people = reusedReads<string, CurrentUser>(10_000);

export function createSignIn(ctx: AppContext): SignIn {
  const { config, dataSource, identityProvider: idp } = ctx;
  const groupRules = parseGroupRoles(config.auth.groupRoles);
  const strategy = new SamlStrategy(
    {
      name: 'saml',
      entryPoint: idp.ssoUrl,
      idpCert: idp.certificates,
      issuer: config.auth.spEntityId,
      audience: config.auth.spEntityId,
      callbackUrl: config.auth.callbackUrl,
      wantAssertionsSigned: true,
      wantAuthnResponseSigned: config.auth.wantResponseSigned,
      validateInResponseTo: ValidateInResponseTo.always,
      requestIdExpirationPeriodMs: SIGN_IN_REQUEST_LIFETIME_MS,
      cacheProvider: new MariaDbSamlRequestCache(dataSource, SIGN_IN_REQUEST_LIFETIME_MS),
      acceptedClockSkewMs: CLOCK_SKEW_MS,
      // No NameID format and no authentication context are asked for: providers differ in what
      // they support, and Cutline keys people by the e-mail attribute.
      identifierFormat: null,
      disableRequestedAuthnContext: true,
      signatureAlgorithm: 'sha256',
    },
    (profile: Profile | null, done: VerifiedCallback) => {
      completeSignIn(ctx, groupRules, profile).then(
        (outcome) => (outcome.ok ? done(null, outcome.user as unknown as Record<string, unknown>) : done(null, undefined, outcome)),
        (err: unknown) => done(err instanceof Error ? err : new Error(String(err))),
      );
    },
    // Logout requests from the identity provider are not accepted (Cutline signs out locally).
    (_profile: Profile | null, done: VerifiedCallback) => done(new Error('Single logout is not supported.')),
  );
  const passport = new Passport();
  passport.use(strategy);
  passport.serializeUser((user, done) => done(null, user.id));
  return {
    passport,
    strategy,
    groupRules,
    handlers: [sessionMiddleware(config, dataSource), restoreSignedInPerson(dataSource), sessionLifetime(config)],
  };
}

/**
 * Puts the signed-in person on `req.user`, as `passport.session()` would, without passport's
 * per-request strategy machinery (measured at about a tenth of a cached dashboard answer's CPU):
 * the id passport stored at sign-in (`req.session.passport.user`, passport's layout) is read
 * through the reused person reads; a person no longer found (switched off, removed) is dropped
 * from the session, which then counts as ended. passport itself serves only the /auth routes.
 */
function restoreSignedInPerson(dataSource: AppContext['dataSource']): RequestHandler {
  const database = String(dataSource.options.database ?? '');
  return (req, _res, next) => {
    const stored = req.session.passport;
    const id = stored?.user;
    if (typeof id !== 'number') return next();
    const found = (user: CurrentUser | undefined) => {
      if (user) req.user = user;
      else delete stored!.user;
      next();
    };
    const person = people.load(`${database}:${id}`, async () => {
      const user = await loadCurrentUser(dataSource, id);
      return user ? (Object.freeze({ ...user, grants: Object.freeze(user.grants.map((g) => Object.freeze(g))) }) as CurrentUser) : undefined;
    });
    if (person instanceof Promise) person.then(found, next);
    else found(person);
  };
}

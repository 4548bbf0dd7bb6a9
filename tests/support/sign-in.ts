import request from 'supertest';
import type { Response } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { MeDto } from '@shared/api/auth';
import type { GrantLike } from '@shared/domain/access';
import type { Role } from '@shared/schemas/roles';
import type { AnswerDeviations, LocalIdentityProvider, LocalPerson, PendingSignIn } from '@server/dev/local-idp/local-idp';
import { RoleGrant } from '@server/entities/role-grant.entity';
import { User } from '@server/entities/user.entity';
import { testIdentityProvider } from './local-idp';
import type { TestApp } from './test-app';

/** A supertest agent holding a signed-in session; it sends the session's CSRF token on every request. */
export type SignedInAgent = TestAgent & { me: MeDto };

export interface SignInOptions {
  /** One role to hold… */
  role?: Role;
  /** …for this program (default: agency-wide). */
  programId?: number | null;
  /** Or any set of grants (replaces role/programId). */
  grants?: readonly GrantLike[];
  /** Default: a fresh address per call, so each call is a new person. */
  email?: string;
  displayName?: string;
  /** Groups the identity provider sends (mapped through `CUTLINE_SAML_GROUP_ROLES`). */
  groups?: string[];
  /** Leave the CSRF header off, to test the refusal. */
  csrf?: boolean;
}

/** The app to sign in to: in process, or a server process at a URL (its database given for the person and grants). */
export interface SignInTarget {
  app: TestApp['app'] | string;
  ctx: Pick<TestApp['ctx'], 'dataSource'>;
}

let counter = 0;

/**
 * Signs a person in through the real SAML flow and returns their session:
 * the person and grants are written to the database, `/auth/saml/login` redirects with a real
 * AuthnRequest, the tests' local identity provider signs a real answer, `/auth/saml/callback`
 * verifies it and starts the session, and `/api/me` hands out the CSRF token.
 *
 * @example const analyst = await signIn(t, { role: 'analyst', programId });
 *          await analyst.post(`/api/programs/${programId}/extracts`).send(body).expect(201);
 */
export async function signIn(t: SignInTarget, options: SignInOptions = {}): Promise<SignedInAgent> {
  const email = options.email ?? `person-${process.pid}-${++counter}@test.example`;
  const displayName = options.displayName ?? `Test person ${counter}`;
  const grants: readonly GrantLike[] = options.grants ?? (options.role ? [{ role: options.role, programId: options.programId ?? null }] : []);
  await ensurePerson(t, email, displayName, grants);

  const agent = request.agent(t.app);
  const callback = await signInThroughIdp(agent, { email, displayName, groups: options.groups ?? [] });
  if (callback.status !== 303 || String(callback.headers.location).startsWith('/sign-in')) {
    throw new Error(`signIn: the app refused the sign-in (${callback.status} → ${callback.headers.location}).`);
  }
  const me = (await agent.get('/api/me').expect(200)).body as MeDto;
  if (options.csrf !== false) agent.set('X-CSRF-Token', me.csrfToken);
  return Object.assign(agent, { me });
}

/** Step 1: ask the app to start signing in; returns the request its redirect carries. */
export async function startSignIn(agent: TestAgent, returnTo = '/', idp: LocalIdentityProvider = testIdentityProvider()): Promise<PendingSignIn> {
  const res = await agent.get(`/auth/saml/login?returnTo=${encodeURIComponent(returnTo)}`);
  if (res.status !== 302) throw new Error(`startSignIn: /auth/saml/login answered ${res.status}.`);
  const location = new URL(String(res.headers.location));
  return idp.readRequest({ SAMLRequest: location.searchParams.get('SAMLRequest') ?? '', RelayState: location.searchParams.get('RelayState') ?? '' });
}

/** Step 2: post an identity provider's answer (possibly altered) to the app's assertion consumer service. */
export function postAnswer(agent: TestAgent, answer: { acsUrl: string; SAMLResponse: string; RelayState: string }): Promise<Response> {
  return agent.post(new URL(answer.acsUrl).pathname).type('form').send({ SAMLResponse: answer.SAMLResponse, RelayState: answer.RelayState });
}

/** Steps 1 and 2 with an honest (or deliberately deviant) answer for `person`. */
export async function signInThroughIdp(
  agent: TestAgent,
  person: LocalPerson,
  options: { deviations?: AnswerDeviations; idp?: LocalIdentityProvider; returnTo?: string } = {},
): Promise<Response> {
  const pending = await startSignIn(agent, options.returnTo);
  const answer = await (options.idp ?? testIdentityProvider()).answer(pending, person, options.deviations);
  return postAnswer(agent, answer);
}

/** Creates the person if needed and gives them the grants they lack (as an administrator would). */
async function ensurePerson(t: SignInTarget, email: string, displayName: string, grants: readonly GrantLike[]): Promise<number> {
  const users = t.ctx.dataSource.getRepository(User);
  const user =
    (await users.findOneBy({ email })) ??
    (await users.save(users.create({ email, displayName, nameId: null, active: true, lastSignInAt: null })));
  const repo = t.ctx.dataSource.getRepository(RoleGrant);
  const held = await repo.findBy({ userId: user.id, source: 'admin' });
  for (const g of grants) {
    if (held.some((h) => h.role === g.role && h.programId === g.programId)) continue;
    await repo.insert({ userId: user.id, role: g.role, programId: g.programId, source: 'admin', groupName: null, grantedByUserId: null });
  }
  return user.id;
}

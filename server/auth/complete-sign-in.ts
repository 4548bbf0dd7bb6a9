import type { Profile } from '@node-saml/node-saml';
import { EmailSchema } from '@shared/schemas/users';
import type { SignInRefusal } from '@shared/schemas/sign-in';
import type { AppContext } from '../app-context';
import type { CurrentUser } from '../http/current-user';
import { loadCurrentUser, signInUser } from '../services/users.service';
import { rememberAssertion } from './assertion-replay';
import { rulesForGroups, type GroupRoleRule } from './group-roles';

export type SignInOutcome =
  | { ok: true; user: CurrentUser }
  | { ok: false; reason: SignInRefusal; actor?: { userId: number; label: string } };

/** How long an assertion without an expiry is remembered against replay: 24 hours (common practice, no source). */
const DEFAULT_ASSERTION_MEMORY_MS = 24 * 3_600_000;

/**
 * What happens after node-saml has verified signature, audience, times and InResponseTo: check the
 * issuer, refuse an assertion seen before, read the person's attributes, and sign them in.
 */
export async function completeSignIn(ctx: AppContext, groupRules: readonly GroupRoleRule[], profile: Profile | null): Promise<SignInOutcome> {
  if (!profile) return { ok: false, reason: 'failed' };
  // node-saml 5.1 checks `idpIssuer` on logout messages only, so the issuer of an assertion is checked here.
  if (profile.issuer !== ctx.identityProvider.entityId) return { ok: false, reason: 'wrong_issuer' };
  const assertion = readAssertion(profile);
  if (!assertion.id) return { ok: false, reason: 'failed' };
  if (!(await rememberAssertion(ctx.dataSource, profile.issuer, assertion.id, assertion.expiresAt))) return { ok: false, reason: 'replayed' };

  const names = ctx.config.auth.attributes;
  const email = EmailSchema.safeParse(firstString(profile[names.email]) ?? profile.email ?? profile.mail ?? profile.nameID);
  if (!email.success) return { ok: false, reason: 'missing_email' };
  const displayName = (firstString(profile[names.displayName]) ?? email.data).slice(0, 200);
  const groups = allStrings(profile[names.groups]);

  const result = await signInUser(ctx.dataSource, {
    email: email.data,
    displayName,
    nameId: profile.nameID.slice(0, 255),
    groupRules: rulesForGroups(groupRules, groups),
  });
  if (!result.ok) return { ok: false, reason: result.reason, actor: { userId: result.userId, label: result.label } };
  const user = await loadCurrentUser(ctx.dataSource, result.userId);
  return user ? { ok: true, user } : { ok: false, reason: 'account_disabled' };
}

/** The assertion's ID and the latest instant it could still be used (Conditions or SubjectConfirmationData). */
function readAssertion(profile: Profile): { id: string | null; expiresAt: Date } {
  const parsed = profile.getAssertion?.() as { Assertion?: AssertionJs } | undefined;
  const a = parsed?.Assertion;
  const instants = [
    a?.Conditions?.[0]?.$?.NotOnOrAfter,
    ...(a?.Subject?.[0]?.SubjectConfirmation ?? []).map((c) => c.SubjectConfirmationData?.[0]?.$?.NotOnOrAfter),
  ]
    .map((v) => (v ? Date.parse(v) : Number.NaN))
    .filter(Number.isFinite);
  const expiresAt = instants.length ? Math.max(...instants) : Date.now() + DEFAULT_ASSERTION_MEMORY_MS;
  return { id: a?.$?.ID ?? null, expiresAt: new Date(expiresAt) };
}

interface AssertionJs {
  $?: { ID?: string };
  Conditions?: Array<{ $?: { NotOnOrAfter?: string } }>;
  Subject?: Array<{ SubjectConfirmation?: Array<{ SubjectConfirmationData?: Array<{ $?: { NotOnOrAfter?: string } }> }> }>;
}

function firstString(value: unknown): string | undefined {
  const v = Array.isArray(value) ? value[0] : value;
  return typeof v === 'string' && v.trim() !== '' ? v.trim() : undefined;
}

function allStrings(value: unknown): string[] {
  const list = Array.isArray(value) ? value : value === undefined ? [] : [value];
  return list.filter((v): v is string => typeof v === 'string' && v !== '');
}

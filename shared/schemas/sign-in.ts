/**
 * Why a sign-in was refused. The server redirects to `/sign-in?error=<reason>` and records the
 * reason in the audit trail; the sign-in page shows the matching sentence. Append, never rename.
 */
export const SIGN_IN_REFUSALS = {
  signature_invalid:
    'The answer from your identity provider was not signed correctly, so Cutline did not trust it. Please sign in again; if this keeps happening, tell your administrator.',
  wrong_audience: 'The answer from your identity provider was meant for another application. Please start again from this page.',
  expired: 'The answer from your identity provider arrived after it had expired. Please sign in again.',
  not_yet_valid:
    'The answer from your identity provider is not valid yet; the clocks of the two systems may disagree. Please try again in a minute, or tell your administrator.',
  replayed: 'This sign-in answer was already used, or Cutline did not ask for it. Please sign in again.',
  wrong_issuer: 'The answer came from an identity provider Cutline does not know. Please start again from this page.',
  missing_email: 'Your identity provider did not send an e-mail address, which Cutline needs to recognise you. Please tell your administrator.',
  account_disabled: 'Your Cutline account is switched off. Ask an administrator to switch it on again.',
  rate_limited: 'There were too many sign-in attempts from your network address. Please wait a few minutes and try again.',
  provider_error: 'Your identity provider did not sign you in. Please try again, or tell your administrator if it keeps happening.',
  failed: 'Signing in did not work. Please try again.',
} as const;

export type SignInRefusal = keyof typeof SIGN_IN_REFUSALS;
export const SIGN_IN_REFUSAL_CODES = Object.keys(SIGN_IN_REFUSALS) as SignInRefusal[];

export function isSignInRefusal(value: unknown): value is SignInRefusal {
  return typeof value === 'string' && Object.hasOwn(SIGN_IN_REFUSALS, value);
}

/**
 * A place inside Cutline to return to after signing in: a path on this site, never another site.
 * Anything else (absolute URLs, `//host`, backslashes, control characters) becomes `/`.
 * @example safeReturnPath('/programs/3?tab=trend') // => '/programs/3?tab=trend'
 * @example safeReturnPath('https://elsewhere.example/') // => '/'
 */
export function safeReturnPath(value: unknown): string {
  if (typeof value !== 'string' || value.length > 1000) return '/';
  if (!value.startsWith('/') || value.startsWith('//') || value.includes('\\') || hasControlCharacter(value)) return '/';
  if (value.startsWith('/auth/') || value.startsWith('/api/')) return '/';
  return value;
}

function hasControlCharacter(value: string): boolean {
  for (let i = 0; i < value.length; i++) {
    const code = value.charCodeAt(i);
    if (code < 0x20 || code === 0x7f) return true;
  }
  return false;
}

import type { SignInRefusal } from '@shared/schemas/sign-in';

/**
 * Turns node-saml's validation errors into Cutline's refusal reasons. node-saml reports them as
 * plain Errors with English messages, so this matches the messages of @node-saml/node-saml 5.1;
 * `tests/api/saml-refusals.test.ts` pins each one to a real refused answer.
 */
const PATTERNS: ReadonlyArray<[RegExp, SignInRefusal]> = [
  [/signature/i, 'signature_invalid'],
  [/audience/i, 'wrong_audience'],
  [/not yet valid/i, 'not_yet_valid'],
  [/expired|no valid subject confirmation/i, 'expired'],
  [/InResponseTo/i, 'replayed'],
  [/issuer/i, 'wrong_issuer'],
  [/SAML provider returned/i, 'provider_error'],
];

export function refusalFromError(err: unknown): SignInRefusal {
  const message = err instanceof Error ? err.message : String(err);
  return PATTERNS.find(([pattern]) => pattern.test(message))?.[1] ?? 'failed';
}

import { SIGN_IN_REFUSALS, isSignInRefusal, safeReturnPath } from '@shared/schemas/sign-in';

export type SignInNotice = { kind: 'expired' } | { kind: 'signed-out' } | { kind: 'refused'; reason: string } | { kind: 'none' };

/**
 * Where signed-out people land. Signing in is a full-page trip to the identity provider (the
 * session cookie is set on the way back), so this is a link, not a fetch.
 */
export function SignInPage({ notice, returnTo }: { notice: SignInNotice; returnTo: string }) {
  const href = `/auth/saml/login?returnTo=${encodeURIComponent(safeReturnPath(returnTo))}`;
  return (
    <main id="main" className="mx-auto max-w-xl px-6 py-20">
      <p className="flex items-center gap-2 font-semibold tracking-tight text-ink-900">
        <span aria-hidden className="inline-block h-5 w-1 rounded-sm bg-accent-500" />
        Cutline
      </p>
      <h1 className="mt-8 text-2xl font-semibold tracking-tight text-ink-900">Sign in</h1>
      <p className="mt-2 text-ink-700">Cutline uses your agency account. You will be sent to your agency&rsquo;s sign-in page and brought back here.</p>
      <Notice notice={notice} />
      <a
        href={href}
        className="mt-8 inline-block rounded bg-accent-700 px-5 py-2.5 font-medium text-white hover:bg-accent-900 focus-visible:outline-offset-4"
      >
        Sign in with your agency account
      </a>
      <p className="mt-10 text-sm text-ink-500">
        What you can see depends on the roles your administrator has granted you, program by program.
      </p>
    </main>
  );
}

function Notice({ notice }: { notice: SignInNotice }) {
  if (notice.kind === 'none') return null;
  if (notice.kind === 'signed-out') {
    return (
      <p role="status" className="mt-6 rounded-md border border-rule bg-panel px-5 py-3 text-sm text-ink-700">
        You have signed out of Cutline.
      </p>
    );
  }
  const message =
    notice.kind === 'expired'
      ? 'Sessions end after a while without activity, and at the end of the working day. Sign in again to carry on where you were.'
      : isSignInRefusal(notice.reason)
        ? SIGN_IN_REFUSALS[notice.reason]
        : SIGN_IN_REFUSALS.failed;
  return (
    <div role="alert" className="mt-6 rounded-md border-l-4 border-caution bg-caution-50 px-5 py-3">
      <p className="font-medium text-ink-900">{notice.kind === 'expired' ? 'Your session has ended.' : 'You are not signed in.'}</p>
      <p className="mt-1 text-sm text-ink-700">{message}</p>
    </div>
  );
}

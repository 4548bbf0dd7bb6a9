import { formatDateTime } from '@/lib/format';
import { useSignedInUser } from '../me-context';
import { grantLabel } from '@/lib/roles';

/** The signed-in person, their roles, when the session ends, and signing out (a form post with the CSRF token). */
export function UserMenu() {
  const me = useSignedInUser();
  return (
    <details className="relative ml-auto">
      <summary className="cursor-pointer list-none rounded px-3 py-2 text-sm text-ink-700 hover:text-ink-900" aria-label={`Account of ${me.user.displayName}`}>
        <span className="font-medium text-ink-900">{me.user.displayName}</span>
        <span aria-hidden className="ml-1 text-ink-500">▾</span>
      </summary>
      <div className="absolute right-0 z-10 mt-2 w-80 rounded-md border border-rule bg-panel p-4 text-sm shadow-lg">
        <p className="font-medium text-ink-900">{me.user.displayName}</p>
        <p className="text-ink-500">{me.user.email}</p>
        <h2 className="mt-4 text-xs font-medium uppercase tracking-wide text-ink-500">Your roles</h2>
        {me.grants.length === 0 ? (
          <p className="mt-1 text-ink-700">None yet. An administrator can grant you a role.</p>
        ) : (
          <ul className="mt-1 space-y-0.5 text-ink-700" aria-label="Your roles">
            {me.grants.map((g) => (
              <li key={g.id}>{grantLabel(g)}</li>
            ))}
          </ul>
        )}
        <p className="mt-4 text-xs text-ink-500">
          Your session ends after {me.session.idleMinutes} minutes without activity, and at {formatDateTime(me.session.endsAt)} at the latest.
        </p>
        <form method="post" action="/auth/logout" className="mt-4">
          <input type="hidden" name="_csrf" value={me.csrfToken} />
          <button type="submit" className="rounded border border-ink-300 px-3 py-1.5 hover:border-ink-500">
            Sign out
          </button>
        </form>
      </div>
    </details>
  );
}

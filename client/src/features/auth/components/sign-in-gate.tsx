import type { ReactNode } from 'react';
import { useLocation } from 'react-router-dom';
import { ErrorState, Loading } from '@/components/ui/states';
import { ApiError } from '@/lib/api-client';
import { useMe } from '../api/get-me';
import { MeContext } from '../me-context';
import { SignInPage } from './sign-in-page';

/** Shows its children to signed-in people and the sign-in page to everyone else (with why, when a session ended). */
export function SignInGate({ children }: { children: ReactNode }) {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <Loading label="Checking your sign-in…" />;
  if (me.isError) {
    if (me.error instanceof ApiError && me.error.status === 401) {
      const notice = me.error.code === 'session_expired' ? ({ kind: 'expired' } as const) : ({ kind: 'none' } as const);
      return <SignInPage notice={notice} returnTo={`${location.pathname}${location.search}`} />;
    }
    return (
      <main className="mx-auto max-w-3xl px-6 py-16">
        <ErrorState error={me.error} onRetry={() => void me.refetch()} />
      </main>
    );
  }
  return <MeContext.Provider value={me.data}>{children}</MeContext.Provider>;
}

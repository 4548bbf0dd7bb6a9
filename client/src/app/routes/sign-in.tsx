import { Navigate, useSearchParams } from 'react-router-dom';
import { safeReturnPath } from '@shared/schemas/sign-in';
import { Loading } from '@/components/ui/states';
import { useMe } from '@/features/auth/api/get-me';
import { SignInPage, type SignInNotice } from '@/features/auth/components/sign-in-page';

/** `/sign-in`: where sign-out and refused sign-ins land (`?signedOut=1`, `?error=<reason>`). */
export default function SignInRoute() {
  const [params] = useSearchParams();
  const me = useMe();
  const returnTo = safeReturnPath(params.get('returnTo') ?? '/');
  if (me.isPending) return <Loading label="Checking your sign-in…" />;
  if (me.isSuccess && !params.get('error')) return <Navigate to={returnTo} replace />;
  const error = params.get('error');
  const notice: SignInNotice = error
    ? { kind: 'refused', reason: error }
    : params.get('signedOut')
      ? { kind: 'signed-out' }
      : me.error && 'code' in me.error && me.error.code === 'session_expired'
        ? { kind: 'expired' }
        : { kind: 'none' };
  return <SignInPage notice={notice} returnTo={returnTo} />;
}

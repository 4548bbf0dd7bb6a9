import { NavLink, Outlet, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { ErrorState } from '@/components/ui/states';
import { SignInGate } from '@/features/auth/components/sign-in-gate';
import { UserMenu } from '@/features/auth/components/user-menu';
import { useSignedInUser } from '@/features/auth/me-context';
import { NAV_ITEMS } from '../navigation';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `rounded px-3 py-2 text-sm ${isActive ? 'bg-accent-50 font-medium text-accent-900' : 'text-ink-700 hover:text-ink-900'}`;

export function RootLayout() {
  return (
    <SignInGate>
      <SignedInLayout />
    </SignInGate>
  );
}

function SignedInLayout() {
  const me = useSignedInUser();
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-4 focus:bg-panel focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="no-print border-b border-rule bg-panel">
        <div className="mx-auto flex max-w-6xl items-center gap-8 px-6 py-3">
          <NavLink to="/" className="flex items-center gap-2 font-semibold tracking-tight text-ink-900">
            <span aria-hidden className="inline-block h-5 w-1 rounded-sm bg-accent-500" />
            Cutline
          </NavLink>
          <nav aria-label="Main" className="flex gap-1">
            {NAV_ITEMS.filter((item) => item.visible(me)).map((item) => (
              <NavLink key={item.to} to={item.to} end={item.end} className={navClass}>
                {item.label}
              </NavLink>
            ))}
          </nav>
          <UserMenu />
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-6 py-10">
        <Outlet />
      </main>
    </div>
  );
}

export function RootErrorBoundary() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? new Error(`${error.status} ${error.statusText}`) : error;
  return (
    <main className="mx-auto max-w-3xl px-6 py-16">
      <ErrorState error={message} onRetry={() => window.location.reload()} />
    </main>
  );
}

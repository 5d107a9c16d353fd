import { lazy, type ReactNode } from 'react';
import { createBrowserRouter, Navigate, useLocation } from 'react-router-dom';
import type { Role } from '@crankjournal/shared-types';
import { Shell } from './components/AppShell/Shell';
import { ErrorBoundary } from './components/ErrorBoundary/ErrorBoundary';
import { useSession } from './features/auth/useSession';

const SignInPage = lazy(() => import('./features/auth/pages/SignIn.page'));
const SetPasswordPage = lazy(() => import('./features/auth/pages/SetPassword.page'));
const TodayPage = lazy(() => import('./features/home/pages/Today.page'));
const UsersPage = lazy(() => import('./features/users/pages/Users.page'));
const AccountPage = lazy(() => import('./features/account/pages/Account.page'));
const NotFoundPage = lazy(() => import('./components/NotFound.page'));

function RequireSession({ children }: { children: ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (!session) return <Navigate to="/sign-in" replace state={{ from: location.pathname + location.search }} />;
  return <>{children}</>;
}

/** A screen only some roles may open; the server enforces the same rule on its routes. */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const session = useSession();
  if (!session || !roles.includes(session.user.role)) return <NotFoundPage />;
  return <>{children}</>;
}

export const routes = [
  { path: '/sign-in', element: <SignInPage /> },
  { path: '/set-password', element: <SetPasswordPage /> },
  {
    path: '/',
    element: (
      <RequireSession>
        <ErrorBoundary>
          <Shell />
        </ErrorBoundary>
      </RequireSession>
    ),
    children: [
      { index: true, element: <TodayPage /> },
      { path: 'account', element: <AccountPage /> },
      { path: 'admin/users', element: <RequireRole roles={['administrator']}><UsersPage /></RequireRole> },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);

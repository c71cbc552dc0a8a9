import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Navigate, Outlet, useLocation, type LoaderFunctionArgs } from 'react-router';
import { ROLE_LABELS, type Area } from '@shared/types';
import { AppShell, type ShellNavItem } from '@/components/layouts/app-shell';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useMe } from '@/features/auth/api/get-me';
import { useLogout } from '@/features/auth/api/logout';
import { useLogoutAll } from '@/features/auth/api/logout-all';
import { requireMe } from '../../guards';

/** The navigation, in order; an entry shows only when the server lists its area. */
const NAVIGATION: ReadonlyArray<{ area: Area } & ShellNavItem> = [
  { area: 'dashboard', label: 'Home', to: paths.app.root.getHref(), end: true },
  { area: 'field', label: 'Day sheets', to: paths.app.field.getHref() },
  { area: 'bookings', label: 'Bookings', to: paths.app.bookings.getHref() },
  { area: 'invoices', label: 'Invoices', to: paths.app.invoices.getHref() },
  { area: 'exports', label: 'Exports', to: paths.app.exports.getHref() },
  { area: 'reports', label: 'Reports', to: paths.app.reports.getHref() },
  { area: 'customers', label: 'Customers', to: paths.app.customers.getHref() },
  { area: 'catalog', label: 'Catalog', to: paths.app.catalog.getHref() },
  { area: 'users', label: 'Users', to: paths.app.users.getHref() },
  { area: 'settings', label: 'Company settings', to: paths.app.settings.getHref() },
  { area: 'devInbox', label: 'Mail inbox', to: paths.app.devMail.getHref() },
];

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireMe(queryClient, request);

export default function AppRoot() {
  const me = useMe();
  const location = useLocation();
  const logout = useLogout();
  const logoutAll = useLogoutAll();
  const [signOutError, setSignOutError] = useState<string | null>(null);

  if (me.isPending) return <PageSpinner />;
  if (!me.data) {
    // The session ended (or nobody signed in): sign in, then come back here.
    return <Navigate to={paths.auth.signIn.getHref(`${location.pathname}${location.search}`)} replace />;
  }

  // A fresh page load after signing out drops everything the previous user had cached.
  const leave = () => window.location.assign(paths.auth.signIn.getHref());
  // A 401 here means the session had already ended: that is signed out too.
  const onError = (error: unknown) => (isApiError(error) && error.status === 401 ? leave() : setSignOutError(errorMessage(error)));

  const { user, organization, areas } = me.data;
  return (
    <AppShell
      navItems={NAVIGATION.filter((item) => areas.includes(item.area))}
      organizationName={organization.name}
      userName={user.name}
      roleLabel={ROLE_LABELS[user.role]}
      signingOut={logout.isPending || logout.isSuccess ? 'here' : logoutAll.isPending || logoutAll.isSuccess ? 'everywhere' : null}
      signOutError={signOutError}
      onSignOut={() => {
        setSignOutError(null);
        logout.mutate(undefined, { onSuccess: leave, onError });
      }}
      onSignOutEverywhere={() => {
        setSignOutError(null);
        logoutAll.mutate(undefined, { onSuccess: leave, onError });
      }}
    >
      <Outlet />
    </AppShell>
  );
}

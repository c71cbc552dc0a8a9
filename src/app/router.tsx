import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import { createBrowserRouter, redirect, RouterProvider, type LoaderFunction } from 'react-router';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { setUnauthenticatedHandler } from '@/lib/api';
import { forgetSignedIn } from '@/features/auth/api/get-me';
import { customerSignInAfter401, isCustomerPage } from '@/features/portal/customer-pages';
import { RouteError } from './routes/error';

/** What a lazy route module may export. */
interface RouteModule {
  default: React.ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: React.ComponentType;
}

/** Turns a route module into lazy route properties, giving its loader the query client. */
const convert = (queryClient: QueryClient) => (module: RouteModule) => ({
  Component: module.default,
  ...(module.clientLoader ? { loader: module.clientLoader(queryClient) } : {}),
  ...(module.ErrorBoundary ? { ErrorBoundary: module.ErrorBoundary } : {}),
});

export function createAppRouter(queryClient: QueryClient) {
  const c = convert(queryClient);
  return createBrowserRouter([
    {
      path: paths.home.path,
      ErrorBoundary: RouteError,
      HydrateFallback: PageSpinner,
      children: [
        { index: true, loader: () => redirect(paths.app.root.getHref()) },
        { path: paths.auth.signIn.path, lazy: () => import('./routes/auth/sign-in').then(c) },
        { path: paths.auth.signUp.path, lazy: () => import('./routes/auth/sign-up').then(c) },
        { path: paths.auth.signUpConfirm.path, lazy: () => import('./routes/auth/confirm-sign-up').then(c) },
        { path: paths.auth.forgotPassword.path, lazy: () => import('./routes/auth/forgot-password').then(c) },
        { path: paths.auth.resetPassword.path, lazy: () => import('./routes/auth/reset-password').then(c) },
        { path: paths.auth.invite.path, lazy: () => import('./routes/auth/invite').then(c) },
        // Outside the app shell and its sign-in: customers have no account.
        { path: paths.sign.path, lazy: () => import('./routes/sign').then(c) },
        { path: paths.portal.signIn.path, lazy: () => import('./routes/portal/sign-in').then(c) },
        { path: paths.portal.welcome.path, lazy: () => import('./routes/portal/welcome').then(c) },
        { path: paths.portal.root.path, lazy: () => import('./routes/portal/rentals').then(c) },
        { path: paths.portal.booking.path, lazy: () => import('./routes/portal/booking').then(c) },
        { path: paths.portal.checkout.path, lazy: () => import('./routes/portal/checkout').then(c) },
        { path: paths.pay.link.path, lazy: () => import('./routes/pay/pay-link').then(c) },
        { path: paths.pay.checkout.path, lazy: () => import('./routes/pay/checkout').then(c) },
        {
          path: paths.app.root.path,
          lazy: () => import('./routes/app/root').then(c),
          children: [
            {
              // Errors inside a page keep the shell and its navigation on screen.
              ErrorBoundary: RouteError,
              children: [
                { index: true, lazy: () => import('./routes/app/dashboard').then(c) },
                { path: paths.app.bookings.path, lazy: () => import('./routes/app/bookings/list').then(c) },
                { path: paths.app.bookingsCalendar.path, lazy: () => import('./routes/app/bookings/calendar').then(c) },
                { path: paths.app.bookingNew.path, lazy: () => import('./routes/app/bookings/new').then(c) },
                { path: paths.app.booking.path, lazy: () => import('./routes/app/bookings/booking').then(c) },
                { path: paths.app.field.path, lazy: () => import('./routes/app/field/today').then(c) },
                { path: paths.app.fieldDay.path, lazy: () => import('./routes/app/field/day').then(c) },
                { path: paths.app.fieldLoadList.path, lazy: () => import('./routes/app/field/load-list').then(c) },
                { path: paths.app.fieldBooking.path, lazy: () => import('./routes/app/field/booking').then(c) },
                { path: paths.app.fieldSiteCheck.path, lazy: () => import('./routes/app/field/site-check').then(c) },
                { path: paths.app.fieldCheckIn.path, lazy: () => import('./routes/app/field/check-in').then(c) },
                { path: paths.app.fieldCalendar.path, lazy: () => import('./routes/app/field/calendar').then(c) },
                { path: paths.app.invoices.path, lazy: () => import('./routes/app/invoices/list').then(c) },
                { path: paths.app.invoice.path, lazy: () => import('./routes/app/invoices/invoice').then(c) },
                { path: paths.app.exports.path, lazy: () => import('./routes/app/exports').then(c) },
                { path: paths.app.reports.path, lazy: () => import('./routes/app/reports').then(c) },
                { path: paths.app.customers.path, lazy: () => import('./routes/app/customers/list').then(c) },
                { path: paths.app.customerNew.path, lazy: () => import('./routes/app/customers/new').then(c) },
                { path: paths.app.customer.path, lazy: () => import('./routes/app/customers/customer').then(c) },
                { path: paths.app.customerStatement.path, lazy: () => import('./routes/app/customers/statement').then(c) },
                { path: paths.app.catalog.path, lazy: () => import('./routes/app/catalog/list').then(c) },
                { path: paths.app.catalogNew.path, lazy: () => import('./routes/app/catalog/new').then(c) },
                { path: paths.app.catalogItem.path, lazy: () => import('./routes/app/catalog/item').then(c) },
                { path: paths.app.users.path, lazy: () => import('./routes/app/users').then(c) },
                { path: paths.app.settings.path, lazy: () => import('./routes/app/settings').then(c) },
                { path: paths.app.settingsTemplates.path, lazy: () => import('./routes/app/settings/templates').then(c) },
                { path: paths.app.settingsTemplate.path, lazy: () => import('./routes/app/settings/template').then(c) },
                { path: paths.app.settingsClauses.path, lazy: () => import('./routes/app/settings/clauses').then(c) },
                { path: paths.app.settingsAccounts.path, lazy: () => import('./routes/app/settings/accounts').then(c) },
                { path: paths.app.devMail.path, lazy: () => import('./routes/app/dev-mail').then(c) },
                { path: '*', lazy: () => import('./routes/not-found').then(c) },
              ],
            },
          ],
        },
        { path: '*', lazy: () => import('./routes/not-found').then(c) },
      ],
    },
  ]);
}

export function AppRouter() {
  const queryClient = useQueryClient();
  const router = useMemo(() => createAppRouter(queryClient), [queryClient]);

  useEffect(() => {
    // A 401 from a data call means the session ended: forget the user and ask them to sign in.
    setUnauthenticatedHandler(() => {
      const here = router.state.location;
      // Customers' pages have their own sign-in (or none); the staff's "me" is not theirs to forget.
      if (isCustomerPage(here.pathname)) {
        const to = customerSignInAfter401(here.pathname);
        if (to) void router.navigate(to, { replace: true });
        return;
      }
      forgetSignedIn(queryClient);
      if (here.pathname === paths.auth.signIn.path) return;
      void router.navigate(paths.auth.signIn.getHref(`${here.pathname}${here.search}`), { replace: true });
    });
    return () => setUnauthenticatedHandler(null);
  }, [queryClient, router]);

  return <RouterProvider router={router} />;
}

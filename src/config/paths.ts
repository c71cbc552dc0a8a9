/** Every client URL, written once. `path` is the router pattern, `getHref` builds a link. */

function withQuery(path: string, query: Record<string, string | undefined>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value) params.set(key, value);
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

export const paths = {
  home: { path: '/', getHref: () => '/' },
  auth: {
    signIn: { path: '/sign-in', getHref: (next?: string) => withQuery('/sign-in', { next }) },
    signUp: { path: '/sign-up', getHref: () => '/sign-up' },
    /** The e-mailed link that finishes a sign-up. */
    signUpConfirm: { path: '/sign-up/confirm', getHref: (token?: string) => withQuery('/sign-up/confirm', { token }) },
    forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
    resetPassword: { path: '/reset-password', getHref: (token?: string) => withQuery('/reset-password', { token }) },
    invite: { path: '/invite', getHref: (token?: string) => withQuery('/invite', { token }) },
  },
  /** The customer's public signing page; the token comes from the e-mailed link. */
  sign: { path: '/sign/:token', getHref: (token: string) => `/sign/${encodeURIComponent(token)}` },
  /** The customer's own pages ("Your rentals"): signed in by an e-mailed one-time link, outside the staff app. */
  portal: {
    root: { path: '/portal', getHref: () => '/portal' },
    signIn: { path: '/portal/sign-in', getHref: (next?: string) => withQuery('/portal/sign-in', { next }) },
    welcome: { path: '/portal/welcome', getHref: (token?: string) => withQuery('/portal/welcome', { token }) },
    booking: { path: '/portal/bookings/:id', getHref: (id: string) => `/portal/bookings/${encodeURIComponent(id)}` },
    checkout: {
      path: '/portal/checkouts/:checkoutId',
      getHref: (checkoutId: string, cancelled?: boolean) => withQuery(`/portal/checkouts/${encodeURIComponent(checkoutId)}`, { cancelled: cancelled ? '1' : undefined }),
    },
  },
  /** An e-mailed pay link: one invoice, paid by card without signing in. */
  pay: {
    link: { path: '/pay/:token', getHref: (token: string) => `/pay/${encodeURIComponent(token)}` },
    checkout: {
      path: '/pay/:token/checkouts/:checkoutId',
      getHref: (token: string, checkoutId: string, cancelled?: boolean) =>
        withQuery(`/pay/${encodeURIComponent(token)}/checkouts/${encodeURIComponent(checkoutId)}`, { cancelled: cancelled ? '1' : undefined }),
    },
  },
  app: {
    root: { path: '/app', getHref: () => '/app' },
    dashboard: { path: '', getHref: () => '/app' },
    users: { path: 'users', getHref: () => '/app/users' },
    settings: { path: 'settings', getHref: () => '/app/settings' },
    settingsTemplates: { path: 'settings/templates', getHref: () => '/app/settings/templates' },
    settingsTemplate: { path: 'settings/templates/:name', getHref: (name: string) => `/app/settings/templates/${encodeURIComponent(name)}` },
    settingsClauses: { path: 'settings/clauses', getHref: () => '/app/settings/clauses' },
    settingsAccounts: { path: 'settings/accounts', getHref: () => '/app/settings/accounts' },
    devMail: { path: 'dev/mail', getHref: () => '/app/dev/mail' },
    catalog: { path: 'catalog', getHref: () => '/app/catalog' },
    catalogNew: { path: 'catalog/new', getHref: () => '/app/catalog/new' },
    catalogItem: { path: 'catalog/:id', getHref: (id: string, month?: string) => withQuery(`/app/catalog/${encodeURIComponent(id)}`, { month }) },
    customers: { path: 'customers', getHref: () => '/app/customers' },
    customerNew: { path: 'customers/new', getHref: () => '/app/customers/new' },
    customer: { path: 'customers/:id', getHref: (id: string) => `/app/customers/${encodeURIComponent(id)}` },
    customerStatement: { path: 'customers/:id/statement', getHref: (id: string) => `/app/customers/${encodeURIComponent(id)}/statement` },
    bookings: { path: 'bookings', getHref: () => '/app/bookings' },
    bookingsCalendar: { path: 'bookings/calendar', getHref: (month?: string) => withQuery('/app/bookings/calendar', { month }) },
    bookingNew: { path: 'bookings/new', getHref: (customerId?: string) => withQuery('/app/bookings/new', { customerId }) },
    booking: { path: 'bookings/:id', getHref: (id: string) => `/app/bookings/${encodeURIComponent(id)}` },
    invoices: { path: 'invoices', getHref: () => '/app/invoices' },
    exports: { path: 'exports', getHref: () => '/app/exports' },
    reports: { path: 'reports', getHref: (tab?: string) => withQuery('/app/reports', { tab }) },
    field: { path: 'field', getHref: () => '/app/field' },
    fieldDay: { path: 'field/days/:date', getHref: (date: string) => `/app/field/days/${encodeURIComponent(date)}` },
    fieldLoadList: { path: 'field/days/:date/load-list', getHref: (date: string) => `/app/field/days/${encodeURIComponent(date)}/load-list` },
    fieldBooking: { path: 'field/bookings/:id', getHref: (id: string) => `/app/field/bookings/${encodeURIComponent(id)}` },
    fieldSiteCheck: { path: 'field/bookings/:id/site-check', getHref: (id: string) => `/app/field/bookings/${encodeURIComponent(id)}/site-check` },
    fieldCheckIn: { path: 'field/bookings/:id/check-in', getHref: (id: string) => `/app/field/bookings/${encodeURIComponent(id)}/check-in` },
    fieldCalendar: { path: 'field/calendar', getHref: () => '/app/field/calendar' },
    invoice: { path: 'invoices/:id', getHref: (id: string) => `/app/invoices/${encodeURIComponent(id)}` },
  },
} as const;

/**
 * Where to go after signing in. Only paths inside this app are accepted, so a crafted
 * `?next=https://elsewhere` link cannot send a user off-site.
 */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.app.root.getHref();
  if (next.startsWith(paths.auth.signIn.path) || next.startsWith(paths.auth.signUp.path)) return paths.app.root.getHref();
  return next;
}

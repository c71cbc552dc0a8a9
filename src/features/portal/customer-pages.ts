import { paths } from '@/config/paths';

/** The customer's own pages and pay links: outside the staff app, never sent to the staff sign-in. */
export const isCustomerPage = (pathname: string) => /^\/(portal|pay)(\/|$)/.test(pathname);

/** The pages a signed-out customer must be able to open (a 401 there is not "session ended"). */
const OPEN_PAGES: readonly string[] = [paths.portal.signIn.path, paths.portal.welcome.path];

/**
 * Where a customer's page goes when their session has ended: the portal sign-in, coming back to
 * the same page. Only the path travels (the server takes `next` as a bare /portal path). Pay links
 * need no session, so they go nowhere.
 */
export function customerSignInAfter401(pathname: string): string | null {
  if (!/^\/portal(\/|$)/.test(pathname) || OPEN_PAGES.includes(pathname)) return null;
  return paths.portal.signIn.getHref(portalNext(pathname));
}

/** A path the server accepts as `next` (PortalSignInRequest), or undefined. */
export function portalNext(path: string | null | undefined): string | undefined {
  if (!path) return undefined;
  const bare = path.split(/[?#]/)[0].replace(/\/+$/, '') || '/';
  if (!/^\/portal(\/[A-Za-z0-9/_-]*)?$/.test(bare) || bare.length > 200) return undefined;
  if (OPEN_PAGES.includes(bare) || bare === paths.portal.root.path) return undefined;
  return bare;
}

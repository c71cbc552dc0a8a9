import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router';
import type { MeResponse } from '@shared/schemas/auth';
import type { Area } from '@shared/types';
import { paths, safeNext } from '@/config/paths';
import { meQueryOptions } from '@/features/auth/api/get-me';

/** For loaders under /app: the signed-in user, or a redirect to sign in that comes back here. */
export async function requireMe(queryClient: QueryClient, request: Request): Promise<MeResponse> {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (!me) {
    const url = new URL(request.url);
    throw redirect(paths.auth.signIn.getHref(`${url.pathname}${url.search}`));
  }
  return me;
}

/** The server lists the areas a user may open; pages outside them answer 403 here. */
export async function requireArea(queryClient: QueryClient, request: Request, area: Area): Promise<MeResponse> {
  const me = await requireMe(queryClient, request);
  if (!me.areas.includes(area)) throw data('Not part of your role', { status: 403 });
  return me;
}

/** For sign-in and sign-up: a signed-in visitor goes straight on into the app. */
export async function redirectIfSignedIn(queryClient: QueryClient, request: Request): Promise<null> {
  // If the server cannot say who is signed in, show the form anyway: signing in reports the trouble.
  const me = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
  if (me) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
  return null;
}

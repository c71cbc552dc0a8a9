import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitePreview } from '@shared/schemas/auth';
import { api } from '@/lib/api';

export const getInvite = (token: string, signal?: AbortSignal) =>
  api.get<InvitePreview>(`/api/auth/invites/${encodeURIComponent(token)}`, { signal });

export const inviteQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['auth', 'invites', token] as const,
    queryFn: ({ signal }) => getInvite(token, signal),
    retry: false,
    staleTime: Infinity,
  });

export const useInvite = (token: string) => useQuery({ ...inviteQueryOptions(token), enabled: token.length > 0 });

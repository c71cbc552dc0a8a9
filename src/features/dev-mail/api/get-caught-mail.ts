import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaughtMail } from '@shared/schemas/mail';
import { api } from '@/lib/api';

/** What the local mail sink caught, newest first; 404 when the local fakes are not running. */
export const getCaughtMail = (signal?: AbortSignal) => api.get<CaughtMail[]>('/api/dev/mail', { signal });

export const CAUGHT_MAIL_REFRESH_MS = 4000;

export const caughtMailQueryOptions = () =>
  queryOptions({
    queryKey: ['dev', 'mail'] as const,
    queryFn: ({ signal }) => getCaughtMail(signal),
    staleTime: 0,
  });

export const useCaughtMail = ({ autoRefresh }: { autoRefresh: boolean }) =>
  useQuery({ ...caughtMailQueryOptions(), refetchInterval: autoRefresh ? CAUGHT_MAIL_REFRESH_MS : false });

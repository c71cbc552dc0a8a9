import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DashboardSummary } from '@shared/schemas/dashboard';
import { api } from '@/lib/api';

export const getDashboard = (signal?: AbortSignal) => api.get<DashboardSummary>('/api/dashboard', { signal });

export const dashboardQueryOptions = () =>
  queryOptions({
    queryKey: ['dashboard'] as const,
    queryFn: ({ signal }) => getDashboard(signal),
    // The day moves on while Home stays open on the office screen.
    refetchInterval: 5 * 60_000,
  });

export const useDashboard = () => useQuery(dashboardQueryOptions());

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ItemAvailability } from '@shared/schemas/items';
import { api } from '@/lib/api';

export const getItemAvailability = (id: string, from: string, to: string, signal?: AbortSignal) =>
  api.get<ItemAvailability>(`/api/items/${encodeURIComponent(id)}/availability`, { query: { from, to }, signal });

export const itemAvailabilityQueryOptions = (id: string, from: string, to: string) =>
  queryOptions({
    queryKey: ['items', 'availability', id, { from, to }] as const,
    queryFn: ({ signal }) => getItemAvailability(id, from, to, signal),
    placeholderData: keepPreviousData,
  });

export const useItemAvailability = (id: string, range: { from: string; to: string }) =>
  useQuery(itemAvailabilityQueryOptions(id, range.from, range.to));

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ItemRow } from '@shared/schemas/items';
import { api } from '@/lib/api';

export const getItem = (id: string, signal?: AbortSignal) => api.get<ItemRow>(`/api/items/${encodeURIComponent(id)}`, { signal });

export const itemQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['items', 'detail', id] as const,
    queryFn: ({ signal }) => getItem(id, signal),
  });

export const useItem = (id: string) => useQuery(itemQueryOptions(id));

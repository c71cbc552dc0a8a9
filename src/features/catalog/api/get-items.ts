import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { ItemListQuery, ItemRow } from '@shared/schemas/items';
import { api } from '@/lib/api';

export type ItemsFilter = Partial<ItemListQuery>;

export const getItems = (filter: ItemsFilter, signal?: AbortSignal) =>
  api.get<ListResponse<ItemRow>>('/api/items', { query: { ...filter }, signal });

/** Every catalog query starts with ['items'], so a change refreshes all lists and pages. */
export const itemsBaseKey = ['items'] as const;

export const itemsQueryOptions = (filter: ItemsFilter) =>
  queryOptions({
    queryKey: ['items', 'list', filter] as const,
    queryFn: ({ signal }) => getItems(filter, signal),
    placeholderData: keepPreviousData,
  });

export const useItems = (filter: ItemsFilter, options: { enabled?: boolean } = {}) => useQuery({ ...itemsQueryOptions(filter), ...options });

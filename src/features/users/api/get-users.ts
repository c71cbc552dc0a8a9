import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { UserRow } from '@shared/schemas/users';
import { api } from '@/lib/api';

export interface UsersPage {
  data: UserRow[];
  total: number;
}

export const USERS_PAGE_SIZE = 25;

export const getUsers = (page: number, pageSize: number, signal?: AbortSignal) =>
  api.get<UsersPage>('/api/users', { query: { page, pageSize }, signal });

/** The key starts with ['users'] so a change to any user refreshes every page. */
export const usersQueryOptions = (page = 1, pageSize = USERS_PAGE_SIZE) =>
  queryOptions({
    queryKey: ['users', 'list', { page, pageSize }] as const,
    queryFn: ({ signal }) => getUsers(page, pageSize, signal),
    placeholderData: keepPreviousData,
  });

export const usersBaseKey = ['users'] as const;

export const useUsers = (page: number, pageSize = USERS_PAGE_SIZE) => useQuery(usersQueryOptions(page, pageSize));

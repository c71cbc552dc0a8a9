import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { CrewMember } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { fieldBaseKey } from './get-day-sheet';

/** Everyone who may go out on site (crew, office, owner), for the crew picker. */
export const getCrewMembers = (signal?: AbortSignal) => api.get<ListResponse<CrewMember>>('/api/field/crew-members', { signal });

export const crewMembersQueryOptions = () => queryOptions({ queryKey: [...fieldBaseKey, 'crew-members'] as const, queryFn: ({ signal }) => getCrewMembers(signal) });

export const useCrewMembers = (enabled = true) => useQuery({ ...crewMembersQueryOptions(), enabled });

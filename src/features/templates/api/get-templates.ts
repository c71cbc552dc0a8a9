import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { LibraryPermissions, TemplateRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';

/** The company's templates: its own copies, or the shipped defaults where it has none; `can.update` says whether this user may change them. */
export const getTemplates = (signal?: AbortSignal) => api.get<ListResponse<TemplateRow> & LibraryPermissions>('/api/templates', { signal });

export const templatesBaseKey = ['templates'] as const;

export const templatesQueryOptions = () =>
  queryOptions({
    queryKey: ['templates', 'list'] as const,
    queryFn: ({ signal }) => getTemplates(signal),
  });

export const useTemplates = (options: { enabled?: boolean } = {}) => useQuery({ ...templatesQueryOptions(), ...options });

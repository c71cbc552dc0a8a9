import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TemplateRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';

export const getTemplate = (name: string, signal?: AbortSignal) => api.get<TemplateRow>(`/api/templates/${encodeURIComponent(name)}`, { signal });

export const templateQueryOptions = (name: string) =>
  queryOptions({
    queryKey: ['templates', 'detail', name] as const,
    queryFn: ({ signal }) => getTemplate(name, signal),
  });

export const useTemplate = (name: string) => useQuery(templateQueryOptions(name));

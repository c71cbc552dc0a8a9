import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface TemplatePreviewInput {
  name: string;
  source: string;
  bookingId: string;
}

/** The template rendered with a real booking, as sanitized HTML; a bad template is the same 400 as saving. */
export const previewTemplate = ({ name, source, bookingId }: TemplatePreviewInput, signal?: AbortSignal) =>
  api.post<{ html: string }>(`/api/templates/${encodeURIComponent(name)}/preview`, { source, bookingId }, { signal });

/*
 * A POST that only reads, so it is a query: the key holds the source, a new source asks again
 * and the previous answer stays on screen meanwhile.
 */
export const templatePreviewQueryOptions = (input: TemplatePreviewInput) =>
  queryOptions({
    queryKey: ['templates', 'preview', input] as const,
    queryFn: ({ signal }) => previewTemplate(input, signal),
    placeholderData: keepPreviousData,
    retry: false,
    staleTime: 60_000,
  });

export const useTemplatePreview = (input: TemplatePreviewInput | null) =>
  useQuery({ ...templatePreviewQueryOptions(input ?? { name: '', source: '', bookingId: '' }), enabled: input !== null });

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClauseInput, ClauseRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { clausesQueryOptions } from './get-clauses';

/** PUT takes the whole clause, not a patch. */
export const updateClause = ({ id, body }: { id: string; body: ClauseInput }) => api.put<ClauseRow>(`/api/clauses/${encodeURIComponent(id)}`, body);

export function useUpdateClause() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateClause,
    onSettled: () => queryClient.invalidateQueries({ queryKey: clausesQueryOptions().queryKey }),
  });
}

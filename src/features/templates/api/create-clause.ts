import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClauseInput, ClauseRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { clausesQueryOptions } from './get-clauses';

export const createClause = (body: ClauseInput) => api.post<ClauseRow>('/api/clauses', body);

export function useCreateClause() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createClause,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clausesQueryOptions().queryKey }),
  });
}

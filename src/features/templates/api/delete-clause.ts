import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { clausesQueryOptions } from './get-clauses';

export const deleteClause = (id: string) => api.delete<void>(`/api/clauses/${encodeURIComponent(id)}`);

export function useDeleteClause() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteClause,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clausesQueryOptions().queryKey }),
  });
}

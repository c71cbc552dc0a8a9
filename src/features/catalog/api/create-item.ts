import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ItemInput, ItemRow } from '@shared/schemas/items';
import { api } from '@/lib/api';
import { itemsBaseKey } from './get-items';

export const createItem = (body: ItemInput) => api.post<ItemRow>('/api/items', body);

export function useCreateItem() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createItem, onSuccess: () => queryClient.invalidateQueries({ queryKey: itemsBaseKey }) });
}

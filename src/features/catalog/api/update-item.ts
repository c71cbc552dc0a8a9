import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ItemInput, ItemRow } from '@shared/schemas/items';
import { api } from '@/lib/api';
import { itemQueryOptions } from './get-item';
import { itemsBaseKey } from './get-items';

/** PUT takes the whole item, not a patch. */
export const updateItem = ({ id, body }: { id: string; body: ItemInput }) => api.put<ItemRow>(`/api/items/${encodeURIComponent(id)}`, body);

export function useUpdateItem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateItem,
    onSuccess: (item) => {
      queryClient.setQueryData(itemQueryOptions(item.id).queryKey, item);
      void queryClient.invalidateQueries({ queryKey: itemsBaseKey });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerInput, CustomerRow } from '@shared/schemas/customers';
import { api } from '@/lib/api';
import { customerQueryOptions } from './get-customer';
import { customersBaseKey } from './get-customers';

export const updateCustomer = ({ id, body }: { id: string; body: CustomerInput }) => api.put<CustomerRow>(`/api/customers/${encodeURIComponent(id)}`, body);

export function useUpdateCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCustomer,
    onSuccess: (customer) => {
      queryClient.setQueryData(customerQueryOptions(customer.id).queryKey, customer);
      void queryClient.invalidateQueries({ queryKey: [...customersBaseKey, 'list'] });
    },
  });
}

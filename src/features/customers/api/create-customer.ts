import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerInput, CustomerRow } from '@shared/schemas/customers';
import { api } from '@/lib/api';
import { customerQueryOptions } from './get-customer';
import { customersBaseKey } from './get-customers';

export const createCustomer = (body: CustomerInput) => api.post<CustomerRow>('/api/customers', body);

export function useCreateCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCustomer,
    onSuccess: (customer) => {
      queryClient.setQueryData(customerQueryOptions(customer.id).queryKey, customer);
      void queryClient.invalidateQueries({ queryKey: [...customersBaseKey, 'list'] });
    },
  });
}

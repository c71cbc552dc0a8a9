import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerRow } from '@shared/schemas/customers';
import { api } from '@/lib/api';
import { customerQueryOptions } from './get-customer';
import { certificateUrl } from './upload-certificate';

export const deleteCertificate = (customerId: string) => api.delete<CustomerRow>(certificateUrl(customerId));

export function useDeleteCertificate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteCertificate,
    onSuccess: (customer) => queryClient.setQueryData(customerQueryOptions(customer.id).queryKey, customer),
  });
}

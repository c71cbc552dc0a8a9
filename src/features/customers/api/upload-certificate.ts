import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerRow } from '@shared/schemas/customers';
import { uploadFile } from '@/lib/api';
import { customerQueryOptions } from './get-customer';

export const certificateUrl = (customerId: string) => `/api/customers/${encodeURIComponent(customerId)}/exemption-certificate`;

/** Replaces any certificate on file. The server checks the content (PDF, PNG, JPEG, WEBP; 5 MB). */
export const uploadCertificate = ({ customerId, file, onProgress }: { customerId: string; file: File; onProgress?: (fraction: number) => void }) =>
  uploadFile<CustomerRow>('POST', certificateUrl(customerId), file, { onProgress });

export function useUploadCertificate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadCertificate,
    onSuccess: (customer) => queryClient.setQueryData(customerQueryOptions(customer.id).queryKey, customer),
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaymentRow, RecordPaymentRequest } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { documentsBaseKey } from '@/features/documents/api/get-booking-documents';
import { moneyBaseKey } from './get-invoices';

/**
 * Cash, check or transfer on one invoice or split across several; a receipt PDF is made and
 * e-mailed. 409 `overpayment` names the part that is more than its invoice's balance.
 */
export const recordPayment = (body: RecordPaymentRequest) => api.post<PaymentRow>('/api/payments', body);

export function useRecordPayment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordPayment,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
      // The receipt is a document of the booking.
      void queryClient.invalidateQueries({ queryKey: documentsBaseKey });
    },
  });
}

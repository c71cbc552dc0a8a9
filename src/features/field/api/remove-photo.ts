import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

/** Takes a photo taken by mistake off its booking; answers the booking's field page. */
export const removePhoto = (photoId: string) => api.delete<FieldBooking>(`/api/field/photos/${encodeURIComponent(photoId)}`);

export function useRemovePhoto(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: removePhoto, onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}

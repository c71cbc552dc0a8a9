import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking, PhotoStage } from '@shared/schemas/field';
import { uploadFile } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

export interface PhotoUpload {
  file: File;
  stage: PhotoStage;
  lineKey?: string;
  caption?: string;
  onProgress?: (fraction: number) => void;
}

/** One photo with what it shows. The server reads the type from the bytes (JPEG, PNG, WEBP, AVIF; 10 MB). */
export const uploadPhoto = (bookingId: string, { file, stage, lineKey = '', caption = '', onProgress }: PhotoUpload) =>
  uploadFile<FieldBooking>('POST', `/api/field/bookings/${encodeURIComponent(bookingId)}/photos`, file, { onProgress, query: { stage, lineKey, caption } });

export function useUploadPhoto(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: (input: PhotoUpload) => uploadPhoto(bookingId, input), onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}

import { useId, useState, type ReactNode } from 'react';
import { PHOTO_MAX_BYTES, type PhotoStage } from '@shared/schemas/field';
import { Alert } from '@/components/ui/alert';
import { errorMessage, isApiError } from '@/lib/api';
import { formatBytes } from '@/lib/format';
import { useUploadPhoto } from '../api/upload-photo';

function uploadMessage(error: unknown): string {
  if (isApiError(error) && error.status === 413) return 'That photo is larger than 10 MB. Take it again at a lower resolution.';
  if (isApiError(error) && error.status === 415) return 'That file is not a photo. Choose a JPEG, PNG, WEBP or AVIF picture.';
  return errorMessage(error);
}

/** A camera button: on a phone it opens the camera; the server checks what arrives is an image. */
export function PhotoUpload({ bookingId, stage, lineKey, label, disabled }: { bookingId: string; stage: PhotoStage; lineKey?: string; label: ReactNode; disabled?: boolean }) {
  const id = useId();
  const upload = useUploadPhoto(bookingId);
  const [progress, setProgress] = useState(0);
  const [caption, setCaption] = useState('');
  const [localError, setLocalError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const choose = (file: File | undefined) => {
    setLocalError(null);
    setDone(null);
    upload.reset();
    if (!file) return;
    if (file.size > PHOTO_MAX_BYTES) return setLocalError(`${file.name} is ${formatBytes(file.size)}: the limit is 10 MB.`);
    if (file.size === 0) return setLocalError(`${file.name} is empty: take the photo again.`);
    setProgress(0);
    upload.mutate({ file, stage, lineKey, caption, onProgress: setProgress }, { onSuccess: () => { setDone('Photo saved.'); setCaption(''); } });
  };

  return (
    <div className="space-y-2 rounded-md border border-canvas-200 bg-canvas-50 p-3">
      <div>
        <label htmlFor={`${id}-caption`} className="mb-1 block text-sm font-semibold text-canvas-800">
          Caption (optional)
        </label>
        <input
          id={`${id}-caption`}
          value={caption}
          maxLength={200}
          onChange={(e) => setCaption(e.target.value)}
          className="block w-full rounded-md border border-canvas-400 bg-white px-3 py-2"
        />
      </div>
      <div>
        <label htmlFor={id} className="mb-1 block text-sm font-semibold text-canvas-800">
          {label}
        </label>
        <input
          id={id}
          type="file"
          accept="image/jpeg,image/png,image/webp,image/avif"
          capture="environment"
          disabled={disabled || upload.isPending}
          aria-describedby={`${id}-hint`}
          className="block w-full text-sm file:mr-3 file:min-h-10 file:rounded-md file:border file:border-canvas-300 file:bg-white file:px-3 file:py-2 file:font-semibold"
          onChange={(event) => {
            choose(event.target.files?.[0]);
            event.target.value = '';
          }}
        />
        <p id={`${id}-hint`} className="mt-1 text-xs text-canvas-600">
          A photo from the camera or the phone’s pictures, at most 10 MB.
        </p>
      </div>
      <div aria-live="polite">
        {upload.isPending ? (
          <label className="block text-sm font-semibold text-canvas-800">
            Uploading… {Math.round(progress * 100)}%
            <progress className="mt-1 block h-2 w-full accent-pine-700" max={1} value={progress} />
          </label>
        ) : null}
        {done ? <p className="text-sm font-semibold text-pine-800">{done}</p> : null}
        {localError ? <Alert tone="danger">{localError}</Alert> : null}
        {upload.isError ? <Alert tone="danger">{uploadMessage(upload.error)}</Alert> : null}
      </div>
    </div>
  );
}

import { useId, useState } from 'react';
import { LOGO_MAX_BYTES, LOGO_TYPES } from '@shared/schemas/documents';
import type { OrganizationResponse } from '@shared/schemas/organization';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { describedBy } from '@/components/ui/field';
import { errorMessage, isApiError } from '@/lib/api';
import { formatBytes } from '@/lib/format';
import { useDeleteLogo } from '../api/delete-logo';
import { logoUrl, useUploadLogo } from '../api/upload-logo';

function uploadMessage(error: unknown): string {
  if (isApiError(error) && error.status === 413) return 'That file is larger than 1 MB. Save the logo smaller, or as a JPEG.';
  if (isApiError(error) && error.status === 415) return 'That file is not a PNG or JPEG image. Save the logo as one of those.';
  return errorMessage(error);
}

/** The company logo printed on documents: see it, upload or replace it with progress, remove it. */
export function LogoPanel({ organization }: { organization: OrganizationResponse }) {
  const inputId = useId();
  const hintId = `${inputId}-hint`;
  const errorId = `${inputId}-error`;
  const upload = useUploadLogo();
  const remove = useDeleteLogo();
  const [progress, setProgress] = useState(0);
  const [localError, setLocalError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  // A new address after each upload, so the replaced logo is not shown from the browser's cache.
  const [version, setVersion] = useState(() => Date.now());
  const [broken, setBroken] = useState(false);
  const canEdit = organization.can.update;
  const hasLogo = organization.hasLogo;
  const fieldError = localError ?? (upload.isError ? uploadMessage(upload.error) : null);

  const choose = (picked: File | undefined) => {
    setLocalError(null);
    setDone(null);
    upload.reset();
    if (!picked) return;
    // The server checks the content too; this only saves sending a file it would refuse.
    if (picked.size > LOGO_MAX_BYTES) {
      setLocalError(`${picked.name} is ${formatBytes(picked.size)}: the limit is 1 MB.`);
      return;
    }
    setProgress(0);
    upload.mutate(
      { file: picked, onProgress: setProgress },
      {
        onSuccess: () => {
          setVersion(Date.now());
          setBroken(false);
          setDone(`${picked.name} uploaded. Documents you issue from now on print it.`);
        },
      },
    );
  };

  return (
    <div className="space-y-4">
      {hasLogo ? (
        <div className="inline-flex max-w-full rounded-md border border-canvas-200 bg-white p-3">
          {broken ? (
            <p className="text-sm text-canvas-700">The logo is on file but could not be shown here.</p>
          ) : (
            <img src={logoUrl(version)} alt={`${organization.name} logo`} className="max-h-24 max-w-full object-contain" onError={() => setBroken(true)} />
          )}
        </div>
      ) : (
        <p className="text-sm text-canvas-700">No logo yet: documents print your company name alone in the header.</p>
      )}

      {canEdit ? (
        <div className="space-y-3">
          <div>
            <label htmlFor={inputId} className="mb-1 block text-sm font-semibold text-canvas-800">
              {hasLogo ? 'Replace the logo' : 'Upload a logo'}
            </label>
            <input
              id={inputId}
              type="file"
              accept={LOGO_TYPES.join(',')}
              disabled={upload.isPending || remove.isPending}
              aria-invalid={fieldError ? true : undefined}
              aria-describedby={describedBy(hintId, fieldError ? errorId : undefined)}
              className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-canvas-300 file:bg-white file:px-3 file:py-2 file:font-semibold"
              onChange={(event) => {
                choose(event.target.files?.[0]);
                event.target.value = '';
              }}
            />
            <p id={hintId} className="mt-1 text-sm text-canvas-600">
              PNG or JPEG, at most 1 MB. It prints up to about 1.5 inches wide, so a wide logo reads best.
            </p>
            <p id={errorId} aria-live="polite" className={fieldError ? 'mt-1 text-sm font-semibold text-rust-700' : 'sr-only'}>
              {fieldError}
            </p>
          </div>
          {hasLogo ? (
            <Button size="sm" variant="ghost" className="text-rust-700 hover:bg-rust-50" disabled={upload.isPending} onClick={() => setConfirming(true)}>
              Remove the logo
            </Button>
          ) : null}
        </div>
      ) : null}

      <div aria-live="polite" className="space-y-2">
        {upload.isPending ? (
          <div>
            <label className="text-sm font-semibold text-canvas-800">
              Uploading…
              <progress className="mt-1 block h-2 w-full accent-pine-700" max={1} value={progress} />
            </label>
            <span className="text-sm text-canvas-700">{Math.round(progress * 100)}%</span>
          </div>
        ) : null}
        {done ? <Alert tone="success">{done}</Alert> : null}
      </div>

      <ConfirmDialog
        open={confirming}
        title="Remove the logo?"
        confirmLabel="Remove the logo"
        confirmVariant="danger"
        isLoading={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onCancel={() => {
          remove.reset();
          setConfirming(false);
        }}
        onConfirm={() =>
          remove.mutate(undefined, {
            onSuccess: () => {
              setConfirming(false);
              setDone('Logo removed. Documents you issue from now on print your company name alone.');
            },
          })
        }
      >
        Documents you issue from now on print your company name alone in the header. Documents already issued keep the logo they were printed with.
      </ConfirmDialog>
    </div>
  );
}

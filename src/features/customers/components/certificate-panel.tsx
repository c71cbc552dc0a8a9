import { useId, useState } from 'react';
import { CERTIFICATE_MAX_BYTES, CERTIFICATE_TYPES, type CustomerRow } from '@shared/schemas/customers';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { errorMessage, isApiError } from '@/lib/api';
import { formatBytes, formatDateTime } from '@/lib/format';
import { useDeleteCertificate } from '../api/delete-certificate';
import { certificateUrl, useUploadCertificate } from '../api/upload-certificate';

function uploadMessage(error: unknown): string {
  if (isApiError(error) && error.status === 413) return 'That file is larger than 5 MB. Scan it at a lower resolution or as a PDF.';
  if (isApiError(error) && error.status === 415) return 'That file is not a PDF, PNG, JPEG or WEBP image. Save the certificate in one of those.';
  return errorMessage(error);
}

/** The customer's sales-tax exemption certificate: upload with progress, download, remove. */
export function CertificatePanel({ customer }: { customer: CustomerRow }) {
  const inputId = useId();
  const upload = useUploadCertificate();
  const remove = useDeleteCertificate();
  const [progress, setProgress] = useState(0);
  const [localError, setLocalError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const file = customer.exemptionCertificate;
  const canEdit = customer.can.update;

  const choose = (picked: File | undefined) => {
    setLocalError(null);
    setDone(null);
    upload.reset();
    if (!picked) return;
    // The server checks the content too; this only saves sending a file it would refuse.
    if (picked.size > CERTIFICATE_MAX_BYTES) {
      setLocalError(`${picked.name} is ${formatBytes(picked.size)}: the limit is 5 MB.`);
      return;
    }
    setProgress(0);
    upload.mutate(
      { customerId: customer.id, file: picked, onProgress: setProgress },
      { onSuccess: () => setDone(`${picked.name} uploaded.`) },
    );
  };

  return (
    <div className="space-y-4">
      {file ? (
        <dl className="grid gap-1 text-sm sm:grid-cols-[auto_1fr] sm:gap-x-6">
          <dt className="font-semibold text-canvas-700">File</dt>
          <dd className="break-all">{file.filename}</dd>
          <dt className="font-semibold text-canvas-700">Size</dt>
          <dd>{formatBytes(file.size)}</dd>
          <dt className="font-semibold text-canvas-700">Uploaded</dt>
          <dd>{formatDateTime(file.createdAt)}</dd>
        </dl>
      ) : (
        <p className="text-sm text-canvas-700">
          No certificate on file.
          {customer.taxExempt ? ' This customer is marked tax exempt: keep their certificate here in case of an audit.' : null}
        </p>
      )}

      <div className="flex flex-wrap items-center gap-2">
        {file ? (
          <a className="inline-flex min-h-8 items-center rounded-md border border-canvas-300 bg-white px-3 py-1 text-sm font-semibold hover:bg-canvas-100" href={certificateUrl(customer.id)} download={file.filename}>
            Download certificate
          </a>
        ) : null}
        {file && canEdit ? (
          <Button size="sm" variant="ghost" className="text-rust-700 hover:bg-rust-50" onClick={() => setConfirming(true)}>
            Remove certificate
          </Button>
        ) : null}
      </div>

      {canEdit ? (
        <div>
          <label htmlFor={inputId} className="mb-1 block text-sm font-semibold text-canvas-800">
            {file ? 'Replace the certificate' : 'Upload a certificate'}
          </label>
          <input
            id={inputId}
            type="file"
            accept={CERTIFICATE_TYPES.join(',')}
            disabled={upload.isPending}
            aria-describedby={`${inputId}-hint`}
            className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-canvas-300 file:bg-white file:px-3 file:py-2 file:font-semibold"
            onChange={(event) => {
              choose(event.target.files?.[0]);
              event.target.value = '';
            }}
          />
          <p id={`${inputId}-hint`} className="mt-1 text-sm text-canvas-600">
            PDF, PNG, JPEG or WEBP, at most 5 MB.
          </p>
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
        {localError ? <Alert tone="danger">{localError}</Alert> : null}
        {upload.isError ? <Alert tone="danger">{uploadMessage(upload.error)}</Alert> : null}
      </div>

      <ConfirmDialog
        open={confirming}
        title="Remove the exemption certificate?"
        confirmLabel="Remove certificate"
        confirmVariant="danger"
        isLoading={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onCancel={() => setConfirming(false)}
        onConfirm={() =>
          remove.mutate(customer.id, {
            onSuccess: () => {
              setConfirming(false);
              setDone('Certificate removed.');
            },
          })
        }
      >
        The file is deleted. The customer stays marked tax exempt until you change that.
      </ConfirmDialog>
    </div>
  );
}

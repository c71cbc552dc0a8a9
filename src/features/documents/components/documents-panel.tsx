import { useEffect, useRef, useState } from 'react';
import { DOCUMENT_KIND_LABELS, type DocumentKind, type DocumentRow } from '@shared/schemas/documents';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { useCreateAgreement } from '../api/create-agreement';
import { useBookingDocuments } from '../api/get-booking-documents';
import { DocumentItem } from './document-item';
import { documentName } from './document-labels';

type IssuableKind = Extract<DocumentKind, 'rental_agreement'>;
/** Documents that record money and so start with a form. */
const CREATE_LABELS: Record<IssuableKind, { first: string; next: string; progress: string }> = {
  rental_agreement: { first: 'Create rental agreement', next: 'New version of the rental agreement', progress: 'Making the rental agreement…' },
};

interface DocumentsPanelProps {
  booking: { id: string; reference: string; customerEmail: string };
  timeZone: string;
  /** From the booking's `can.issueDocuments`: who may issue documents; others read them. */
  canIssue: boolean;
  /** Unsaved edits in the booking: documents are made from the saved booking. */
  dirty: boolean;
  /** Something the booking's history shows has changed (issued, queued, sent, failed). */
  onChanged?: () => void;
}

/** A fingerprint of where every send stands, to notice one turning sent or failed. */
const sendStates = (documents: readonly DocumentRow[] | undefined) =>
  (documents ?? []).flatMap((d) => d.sends.map((s) => `${s.id}:${s.status}`)).join(',');

export function DocumentsPanel({ booking, timeZone, canIssue, dirty, onChanged }: DocumentsPanelProps) {
  const documents = useBookingDocuments(booking.id);
  const agreement = useCreateAgreement();
  const [confirming, setConfirming] = useState<IssuableKind | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const mutations = { rental_agreement: agreement };
  const issuing = agreement.isPending ? 'rental_agreement' : null;
  const failed = agreement.error;

  // The booking's history lists sends too: refresh it when a queued e-mail goes out or fails.
  const states = documents.data ? sendStates(documents.data.data) : null;
  const seen = useRef(states);
  useEffect(() => {
    if (states === null) return;
    if (seen.current !== null && seen.current !== states) onChanged?.();
    seen.current = states;
  }, [states, onChanged]);

  const current = (kind: IssuableKind) => documents.data?.data.find((d) => d.kind === kind && d.status === 'issued') ?? null;

  const issue = (kind: IssuableKind) => {
    setConfirming(null);
    setMessage(null);
    agreement.reset();
    mutations[kind].mutate(booking.id, {
      onSuccess: (d) => {
        setMessage(`${documentName(d)} is ready.`);
        onChanged?.();
      },
    });
  };

  const confirmingCurrent = confirming ? current(confirming) : null;

  return (
    <div className="space-y-4">
      {canIssue ? (
        <div className="space-y-2">
          {dirty ? <Alert tone="warning">Save your changes first: documents are made from the saved booking.</Alert> : null}
          <div className="flex flex-wrap gap-2">
            {(['rental_agreement'] as const).map((kind) => {
              const existing = current(kind);
              return (
                <Button
                  key={kind}
                  size="sm"
                  variant={kind === 'rental_agreement' ? 'primary' : 'secondary'}
                  disabled={dirty || issuing !== null || documents.isPending}
                  isLoading={issuing === kind}
                  onClick={() => (existing ? setConfirming(kind) : issue(kind))}
                >
                  {existing ? CREATE_LABELS[kind].next : CREATE_LABELS[kind].first}
                </Button>
              );
            })}
          </div>
          <p className="text-sm text-canvas-700">Invoices, receipts and credit notes come from the money panel below: each one is a ledger record as well as a PDF.</p>
        </div>
      ) : null}

      <LiveRegion>
        {issuing ? (
          <p role="status" className="flex items-center gap-2 text-sm text-canvas-800">
            <Spinner /> {CREATE_LABELS[issuing].progress} It takes a second or two.
          </p>
        ) : message ? (
          <Alert tone="success">{message}</Alert>
        ) : null}
      </LiveRegion>
      {failed ? (
        <Alert tone="danger" title="The document was not made.">
          {errorMessage(failed)}
        </Alert>
      ) : null}

      {documents.data?.agreement.state === 'changed_since_signed' ? (
        <Alert tone="warning" title="Changed since signed">
          The customer signed {documents.data.agreement.lastSignedNumber}; the booking changed after that, so {documents.data.agreement.currentNumber} needs
          their signature. Send it for signature below: the next invoice waits until it is signed.
        </Alert>
      ) : null}

      {documents.isPending ? (
        <Spinner className="text-canvas-600" label="Loading documents…" />
      ) : documents.isError ? (
        <Alert tone="danger" title="The documents could not be loaded.">
          {errorMessage(documents.error)}
        </Alert>
      ) : documents.data.data.length === 0 ? (
        <p className="text-sm text-canvas-700">No documents yet.{canIssue ? ' Create the rental agreement when the booking is ready to sign.' : ''}</p>
      ) : (
        <ul aria-label={`Documents of booking ${booking.reference}`} className="space-y-3">
          {documents.data.data.map((d) => (
            <DocumentItem key={d.id} document={d} customerEmail={booking.customerEmail} timeZone={timeZone} />
          ))}
        </ul>
      )}

      <ConfirmDialog
        open={confirming !== null}
        title={confirming ? `Make a new version of the ${DOCUMENT_KIND_LABELS[confirming].toLowerCase()}?` : ''}
        confirmLabel={confirming ? CREATE_LABELS[confirming].next : ''}
        onConfirm={() => confirming && issue(confirming)}
        onCancel={() => setConfirming(null)}
      >
        {confirmingCurrent ? (
          <p>
            Version {confirmingCurrent.version + 1} replaces {documentName(confirmingCurrent)}, made from the booking as it is saved now. The old version
            stays in the list, marked replaced; a copy already sent to the customer is no longer the current one.
          </p>
        ) : null}
      </ConfirmDialog>
    </div>
  );
}

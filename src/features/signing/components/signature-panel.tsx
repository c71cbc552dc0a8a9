import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import type { SigningRequestRow } from '@shared/schemas/signing';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage, isApiError } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useSignatureRequests } from '../api/get-signature-requests';
import { useResendSignatureRequest } from '../api/resend-signature-request';
import { useVoidSignatureRequest } from '../api/void-signature-request';
import { SendSignatureForm } from './send-signature-form';
import { SIGNING_STATUS_LABELS, SIGNING_STATUS_TONES } from './signing-labels';
import { SigningTrail } from './signing-trail';

interface SignaturePanelProps {
  /** A rental agreement; only the current, issued one can be sent. */
  document: { id: string; status: 'issued' | 'replaced' | 'void'; can: { send: boolean } };
  /** "Rental agreement RA-0007, version 2" */
  name: string;
  customerEmail: string;
  timeZone: string;
}

/** When the link ends or ended, in words that fit its status. */
function expiryText(row: SigningRequestRow, timeZone: string): string | null {
  const at = formatZoned(row.expiresAt, timeZone);
  if (row.status === 'pending') return `Link works until ${at}`;
  if (row.status === 'expired') return `Link expired ${at}`;
  return null;
}

function RequestSummary({ row, timeZone }: { row: SigningRequestRow; timeZone: string }) {
  const expiry = expiryText(row, timeZone);
  return (
    <div className="flex flex-wrap items-center gap-x-2 gap-y-1 text-sm">
      <Badge tone={SIGNING_STATUS_TONES[row.status]}>{SIGNING_STATUS_LABELS[row.status]}</Badge>
      <span className="break-all text-canvas-900">To {row.sentTo}</span>
      <span className="text-canvas-600">sent {formatZoned(row.createdAt, timeZone)}</span>
      {row.signedAt ? <span className="text-canvas-900">signed {formatZoned(row.signedAt, timeZone)}</span> : null}
      {expiry ? <span className="text-canvas-600">· {expiry}</span> : null}
    </div>
  );
}

/**
 * The rental agreement's signing: send a link, see where it stands (with the trail a dispute
 * would need), resend or void it. The server says what may be done with each request.
 */
export function SignaturePanel({ document: d, name, customerEmail, timeZone }: SignaturePanelProps) {
  const requests = useSignatureRequests(d.id);
  const resend = useResendSignatureRequest();
  const voiding = useVoidSignatureRequest();
  const queryClient = useQueryClient();
  const [sending, setSending] = useState(false);
  const [confirming, setConfirming] = useState<'resend' | 'void' | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const rows = requests.data?.data ?? [];
  const latest = rows[0] ?? null;
  const older = rows.slice(1);
  const canSend = d.status === 'issued' && d.can.send;

  // Signing makes a signed copy and reserves the booking: show both as soon as the trail says so.
  const latestStatus = latest ? `${latest.id}:${latest.status}` : null;
  const seen = useRef(latestStatus);
  useEffect(() => {
    if (seen.current !== null && latestStatus !== seen.current && latest?.status === 'signed') {
      void queryClient.invalidateQueries({ queryKey: ['documents'] });
      void queryClient.invalidateQueries({ queryKey: ['bookings'] });
    }
    seen.current = latestStatus;
  }, [latestStatus, latest?.status, queryClient]);

  if (!canSend && rows.length === 0) return null;
  // Those who may not see signing links (the server answers 403) see no panel rather than an error.
  if (requests.isError && isApiError(requests.error) && requests.error.status === 403) return null;

  const act = () => {
    if (!latest || !confirming) return;
    const mutation = confirming === 'resend' ? resend : voiding;
    mutation.mutate(latest.id, {
      onSuccess: (row) => {
        setConfirming(null);
        setNotice(
          confirming === 'resend'
            ? `A fresh signing link is on its way to ${row.sentTo}. The old link no longer works.`
            : 'The signing link is void. The customer who opens it is told to ask you for a new one.',
        );
      },
    });
  };
  const ask = (what: 'resend' | 'void') => {
    resend.reset();
    voiding.reset();
    setNotice(null);
    setConfirming(what);
  };
  const acting = confirming === 'resend' ? resend : voiding;

  return (
    <div className="mt-3">
      <h4 className="text-sm font-semibold text-canvas-800">Signature</h4>
      {requests.isPending ? (
        <Spinner className="mt-1 text-sm text-canvas-600" label="Loading signing links…" />
      ) : requests.isError ? (
        <Alert tone="danger" title="The signing links could not be loaded." className="mt-1">
          {errorMessage(requests.error)}
        </Alert>
      ) : latest ? (
        <div className="mt-1 space-y-2" aria-live="polite">
          <RequestSummary row={latest} timeZone={timeZone} />
          {latest.status === 'declined' ? (
            <p className="text-sm font-semibold text-rust-700">The customer declined to sign electronically: arrange a paper signature or send a new link.</p>
          ) : null}
          {latest.events.some((e) => e.event === 'refused_stock') ? (
            <p className="text-sm font-semibold text-rust-700">
              The customer tried to sign, but the items are no longer free on the dates. Change the booking, issue a new version and send it again.
            </p>
          ) : null}
          <details className="group rounded-md">
            <summary className="cursor-pointer text-sm font-semibold text-pine-700 underline hover:text-pine-900">
              Signing trail ({latest.events.length} {latest.events.length === 1 ? 'event' : 'events'})
            </summary>
            <SigningTrail events={latest.events} timeZone={timeZone} label={`Signing trail of the link sent to ${latest.sentTo}`} />
          </details>
        </div>
      ) : (
        <p className="mt-1 text-sm text-canvas-700">Not sent for signature yet.</p>
      )}

      <div className="mt-2 flex flex-wrap gap-2">
        {canSend ? (
          <Button
            size="sm"
            variant={latest?.status === 'pending' || latest?.status === 'signed' ? 'secondary' : 'primary'}
            aria-expanded={sending}
            onClick={() => {
              setNotice(null);
              setSending((v) => !v);
            }}
          >
            Send for signature<span className="sr-only"> {name}</span>
          </Button>
        ) : null}
        {latest?.can.resend ? (
          <Button size="sm" variant="secondary" onClick={() => ask('resend')}>
            Resend the link
          </Button>
        ) : null}
        {latest?.can.void ? (
          <Button size="sm" variant="ghost" className="text-rust-700 hover:bg-rust-50" onClick={() => ask('void')}>
            Void the link
          </Button>
        ) : null}
      </div>

      {sending ? (
        <SendSignatureForm
          documentId={d.id}
          name={name}
          customerEmail={customerEmail}
          pending={latest?.status === 'pending' ? latest : null}
          timeZone={timeZone}
          onCancel={() => setSending(false)}
          onDone={(row) => {
            setSending(false);
            setNotice(`Signing link for ${name} is on its way to ${row.sentTo}. It works until ${formatZoned(row.expiresAt, timeZone)}.`);
          }}
        />
      ) : null}
      <LiveRegion>{notice ? <Alert tone="success" className="mt-3">{notice}</Alert> : null}</LiveRegion>

      {older.length > 0 ? (
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-semibold text-pine-700 underline hover:text-pine-900">Earlier links ({older.length})</summary>
          <ul className="mt-2 space-y-3">
            {older.map((row) => (
              <li key={row.id} className="rounded-md border border-canvas-200 bg-canvas-50 p-2">
                <RequestSummary row={row} timeZone={timeZone} />
                <SigningTrail events={row.events} timeZone={timeZone} label={`Signing trail of the link sent to ${row.sentTo} on ${formatZoned(row.createdAt, timeZone)}`} />
              </li>
            ))}
          </ul>
        </details>
      ) : null}

      <ConfirmDialog
        open={confirming !== null}
        title={confirming === 'resend' ? 'Send a fresh signing link?' : 'Void the signing link?'}
        confirmLabel={confirming === 'resend' ? 'Resend the link' : 'Void the link'}
        confirmVariant={confirming === 'void' ? 'danger' : 'primary'}
        isLoading={acting.isPending}
        error={acting.error ? errorMessage(acting.error) : null}
        onConfirm={act}
        onCancel={() => setConfirming(null)}
      >
        {latest ? (
          confirming === 'resend' ? (
            <p>A new link goes to {latest.sentTo}. The link sent {formatZoned(latest.createdAt, timeZone)} stops working.</p>
          ) : (
            <p>The link sent to {latest.sentTo} stops working at once. Nothing is signed; you can send a new link later.</p>
          )
        ) : null}
      </ConfirmDialog>
    </div>
  );
}

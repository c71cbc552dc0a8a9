import { useState } from 'react';
import type { InvoiceRow } from '@shared/schemas/invoices';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { errorMessage } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useRevokePayLinks } from '../api/revoke-pay-links';

/**
 * The invoice's card pay link, for the office to paste into a message or read out on the phone.
 * The invoice's e-mail carries one too; it opens this invoice's payment page without signing in.
 * Links end by themselves after a while; the office can end them all at once (a link sent to the
 * wrong person, or forwarded), after which a new one is sent the usual way.
 */
export function PayLink({ invoice, timeZone }: { invoice: InvoiceRow; timeZone: string }) {
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [revoked, setRevoked] = useState(false);
  const revoke = useRevokePayLinks();
  const url = invoice.payUrl;
  const copy = async () => {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  };
  return (
    <div className="space-y-3">
      {url ? (
        <div className="space-y-2">
          <label className="block text-sm font-medium text-canvas-900" htmlFor="pay-link">
            Card payment link{invoice.number ? ` for ${invoice.number}` : ''}
          </label>
          <div className="flex flex-wrap gap-2">
            <input
              id="pay-link"
              readOnly
              value={url}
              onFocus={(e) => e.currentTarget.select()}
              className="min-w-0 flex-1 rounded-md border border-canvas-300 bg-canvas-50 px-3 py-2 font-mono text-xs text-canvas-900"
            />
            <Button size="sm" variant="secondary" onClick={copy}>
              Copy
            </Button>
          </div>
          <p className="text-sm text-canvas-700" role="status">
            {copied === 'yes'
              ? 'Copied.'
              : copied === 'no'
                ? 'Copying is blocked here: select the link and copy it.'
                : 'The customer pays the balance (or a part) by card on a secure page; the payment shows here by itself.'}
          </p>
          {invoice.payLinkEndsAt ? <p className="text-sm text-canvas-700">This link works until {formatZoned(invoice.payLinkEndsAt, timeZone, false)}.</p> : null}
        </div>
      ) : (
        <p className="text-sm text-canvas-700">Nothing is left to pay by card. Links sent earlier still show the invoice and its receipts until they end.</p>
      )}
      <LiveRegion>
        {revoked ? (
          <Alert tone="success">
            Every earlier pay link of this invoice has stopped working: whoever opens one is asked to get a new link from you.
            {url ? ' The link above is new: e-mail the invoice again or copy it to send it.' : ''}
          </Alert>
        ) : null}
      </LiveRegion>
      {invoice.can.revokePayLink ? (
        <>
          <Button
            size="sm"
            variant="ghost"
            className="text-rust-700 hover:bg-rust-50"
            onClick={() => {
              revoke.reset();
              setRevoked(false);
              setConfirming(true);
            }}
          >
            Withdraw pay links
          </Button>
          <ConfirmDialog
            open={confirming}
            title="Withdraw this invoice’s pay links?"
            confirmLabel="Withdraw the links"
            confirmVariant="danger"
            isLoading={revoke.isPending}
            error={revoke.isError ? errorMessage(revoke.error) : null}
            onCancel={() => setConfirming(false)}
            onConfirm={() =>
              revoke.mutate(invoice.id, {
                onSuccess: () => {
                  setConfirming(false);
                  setRevoked(true);
                },
              })
            }
          >
            Every pay link of {invoice.number ?? 'this invoice'} sent or copied so far stops working at once. The invoice and its payments stay as they are; send the customer a
            new link afterwards.
          </ConfirmDialog>
        </>
      ) : null}
    </div>
  );
}

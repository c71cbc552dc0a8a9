import { useState } from 'react';
import { Button } from '@/components/ui/button';

/**
 * The invoice's card pay link, for the office to paste into a message or read out on the phone.
 * The same link is in the invoice's e-mail; it opens this invoice's payment page without signing in.
 */
export function PayLink({ url, number }: { url: string; number: string | null }) {
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(url);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  };
  return (
    <div className="space-y-2">
      <label className="block text-sm font-medium text-canvas-900" htmlFor="pay-link">
        Card payment link{number ? ` for ${number}` : ''}
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
        {copied === 'yes' ? 'Copied.' : copied === 'no' ? 'Copying is blocked here: select the link and copy it.' : 'The customer pays the balance (or a part) by card on a secure page; the payment shows here by itself.'}
      </p>
    </div>
  );
}

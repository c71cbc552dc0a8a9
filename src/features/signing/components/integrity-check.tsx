import { useState } from 'react';
import type { VerifyResult } from '@shared/schemas/signing';
import { Button } from '@/components/ui/button';
import { LiveRegion } from '@/components/ui/alert';
import { errorMessage } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useVerifyDocument } from '../api/verify-document';

function Line({ ok, children }: { ok: boolean; children: React.ReactNode }) {
  return (
    <li className={`flex items-start gap-1.5 ${ok ? 'text-pine-800' : 'font-semibold text-rust-700'}`}>
      <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0" fill="none" stroke="currentColor" strokeWidth="2.25">
        {ok ? <path d="m3 8 3.5 3.5L13 5" /> : <path d="M4 4l8 8M12 4l-8 8" />}
      </svg>
      <span>{children}</span>
    </li>
  );
}

function Verdict({ result }: { result: VerifyResult }) {
  const s = result.signature;
  return (
    <ul className="space-y-1">
      <Line ok={result.hashMatches}>
        {result.hashMatches ? 'Unchanged since it was issued' : 'Changed: the stored file no longer matches the SHA-256 recorded when it was issued.'}
      </Line>
      {s ? (
        s.signed && s.intact && s.coversWholeDocument ? (
          <Line ok>
            Digital signature valid, covers the whole file{s.signerCommonName ? ` (signed by ${s.signerCommonName})` : ''}
          </Line>
        ) : (
          <Line ok={false}>
            {!s.signed
              ? 'Changed: the digital signature is missing.'
              : !s.intact
                ? 'Changed: the digital signature no longer matches the file.'
                : 'Changed: the digital signature does not cover the whole file.'}
            {s.problem ? ` ${s.problem}` : ''}
          </Line>
        )
      ) : null}
    </ul>
  );
}

/** Hashes the stored file again (and checks a signed copy's signature) when asked, each time afresh. */
export function IntegrityCheck({ documentId, name, timeZone }: { documentId: string; name: string; timeZone: string }) {
  const [asked, setAsked] = useState(false);
  const verify = useVerifyDocument(documentId, { enabled: asked });
  const checking = asked && verify.isFetching;

  return (
    <div className="mt-3 flex flex-wrap items-start gap-x-3 gap-y-2 text-sm">
      <Button size="sm" variant="secondary" isLoading={checking} onClick={() => (asked ? void verify.refetch() : setAsked(true))}>
        Check integrity<span className="sr-only"> of {name}</span>
      </Button>
      <LiveRegion>
        {!asked || checking ? null : verify.isError ? (
          <p role="alert" className="font-semibold text-rust-700">
            The check could not run: {errorMessage(verify.error)}
          </p>
        ) : verify.data ? (
          <div className="pt-1">
            <Verdict result={verify.data} />
            <p className="mt-1 text-xs text-canvas-600">Checked {formatZoned(new Date(verify.dataUpdatedAt).toISOString(), timeZone)}</p>
          </div>
        ) : null}
      </LiveRegion>
    </div>
  );
}

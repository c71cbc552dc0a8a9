import { useState } from 'react';
import { DOCUMENT_KIND_LABELS, type DocumentRow } from '@shared/schemas/documents';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button, buttonClasses } from '@/components/ui/button';
import { linkClasses } from '@/components/ui/text-link';
import { formatZoned } from '@/lib/zoned-time';
import { IntegrityCheck } from '@/features/signing/components/integrity-check';
import { SignaturePanel } from '@/features/signing/components/signature-panel';
import { documentPdfInlineUrl, documentPdfUrl } from '../api/get-document-pdf';
import { CopyButton } from './copy-button';
import { DOCUMENT_STATUS_LABELS, DOCUMENT_STATUS_TONES, documentName, shortHash } from './document-labels';
import { DocumentSends } from './document-sends';
import { SendForm } from './send-form';

interface DocumentItemProps {
  document: DocumentRow;
  customerEmail: string;
  timeZone: string;
}

/** One issued document: what it is, its fingerprint, and what can be done with it. */
export function DocumentItem({ document: d, customerEmail, timeZone }: DocumentItemProps) {
  const [previewing, setPreviewing] = useState(false);
  const [sending, setSending] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const name = documentName(d);
  const previewId = `preview-${d.id}`;
  const current = d.status === 'issued';
  // The sr-only tail keeps every button's name unique in a list of several documents.
  const which = <span className="sr-only"> {name}</span>;

  return (
    <li className={`rounded-md border p-3 sm:p-4 ${current ? 'border-canvas-200 bg-white' : 'border-canvas-200 bg-canvas-50'}`} aria-label={name}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-canvas-900">
          {DOCUMENT_KIND_LABELS[d.kind]} {d.number}{' '}
          <span className="ml-2 text-sm font-normal text-canvas-700">version {d.version}</span>
        </h3>
        <Badge tone={DOCUMENT_STATUS_TONES[d.status]}>{DOCUMENT_STATUS_LABELS[d.status]}</Badge>
      </div>
      <dl className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-canvas-600">Created</dt>
        <dd className="text-canvas-900">{formatZoned(d.createdAt, timeZone)}</dd>
        <dt className="text-canvas-600">Issued by</dt>
        <dd className="text-canvas-900">{d.issuedBy ?? 'Guyline'}</dd>
        <dt className="text-canvas-600">SHA-256</dt>
        <dd className="flex flex-wrap items-center gap-x-2 text-canvas-900">
          <code className="font-mono text-xs break-all" title={d.sha256}>
            {shortHash(d.sha256)}
          </code>
          <CopyButton text={d.sha256} label={`Copy the SHA-256 of ${name}`} />
        </dd>
      </dl>
      <IntegrityCheck documentId={d.id} name={name} timeZone={timeZone} />

      <div className="mt-3 flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" aria-expanded={previewing} aria-controls={previewing ? previewId : undefined} onClick={() => setPreviewing((v) => !v)}>
          {previewing ? 'Hide preview' : 'Preview'}
          {which}
        </Button>
        <a href={documentPdfUrl(d.id)} download className={buttonClasses('secondary', 'sm')}>
          Download PDF{which}
        </a>
        {current && d.can.send ? (
          <Button
            size="sm"
            variant="secondary"
            aria-expanded={sending}
            onClick={() => {
              setNotice(null);
              setSending((v) => !v);
            }}
          >
            Send to customer{which}
          </Button>
        ) : null}
      </div>

      {sending ? (
        <SendForm
          document={d}
          customerEmail={customerEmail}
          onCancel={() => setSending(false)}
          onDone={(message) => {
            setSending(false);
            setNotice(message);
          }}
        />
      ) : null}
      <div aria-live="polite">{notice ? <Alert tone="success" className="mt-3">{notice}</Alert> : null}</div>

      <DocumentSends sends={d.sends} timeZone={timeZone} label={`E-mails of ${name}`} />
      {/* d.can.send is the server's "owner or office, on an issued document": the booking's can.issueDocuments for it. */}
      {d.kind === 'rental_agreement' ? <SignaturePanel document={d} name={name} customerEmail={customerEmail} timeZone={timeZone} /> : null}

      {previewing ? (
        <div id={previewId} className="mt-3">
          <iframe
            title={`Preview of ${d.number}`}
            src={documentPdfInlineUrl(d.id)}
            className="h-[70vh] min-h-96 w-full rounded-md border border-canvas-300 bg-canvas-100"
          />
          <p className="mt-1 text-sm text-canvas-700">
            No preview on your device?{' '}
            <a href={documentPdfInlineUrl(d.id)} target="_blank" rel="noopener" className={linkClasses}>
              Open the PDF in a new tab
            </a>
            .
          </p>
        </div>
      ) : null}
    </li>
  );
}

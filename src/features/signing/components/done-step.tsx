import type { RefObject } from 'react';
import type { SigningPage } from '@shared/schemas/signing';
import { Button } from '@/components/ui/button';
import { CompanyContact } from './signing-layout';
import { StepCard, StepHeading } from './step-heading';

/** Starts the download of the signed copy (a button, as the page's one action; the address is the server's). */
function download(url: string) {
  const a = document.createElement('a');
  a.href = url;
  a.download = '';
  a.rel = 'noopener';
  document.body.append(a);
  a.click();
  a.remove();
}

export function DoneStep({ page, signedPdfUrl, headingRef }: { page: SigningPage; signedPdfUrl: string | null; headingRef?: RefObject<HTMLHeadingElement | null> }) {
  return (
    <StepCard>
      <div className="flex items-start gap-3">
        <span aria-hidden="true" className="mt-0.5 flex size-8 shrink-0 items-center justify-center rounded-full bg-pine-700 text-white">
          <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="2.5">
            <path d="m3 8 3.5 3.5L13 5" />
          </svg>
        </span>
        <div>
          <StepHeading ref={headingRef}>Your agreement is signed</StepHeading>
          <p className="mt-2 text-canvas-800">
            Thank you, {page.customerName}. {page.company.name} has your signed {page.document.title.toLowerCase()} {page.document.number}, and a copy has been e-mailed
            to you.
          </p>
        </div>
      </div>
      {signedPdfUrl ? (
        <div className="mt-5">
          <Button onClick={() => download(signedPdfUrl)} className="w-full sm:w-auto">
            <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5" fill="none" stroke="currentColor" strokeWidth="1.75">
              <path d="M10 3v9m-4-4 4 4 4-4M4 15.5h12" />
            </svg>
            Download your signed copy
          </Button>
          <p className="mt-2 text-sm text-canvas-700">Keep it with your records: it is the agreement as signed, with a certificate page listing each step.</p>
        </div>
      ) : (
        <p className="mt-4 text-canvas-800">The download here has closed; use the copy in your e-mail, or ask {page.company.name} for another.</p>
      )}
      <p className="mt-5 text-sm text-canvas-700">Questions about your booking?</p>
      <CompanyContact company={page.company} />
    </StepCard>
  );
}

/** The customer chose not to sign electronically: what happens next. */
export function DeclinedView({ page, headingRef }: { page: SigningPage; headingRef?: RefObject<HTMLHeadingElement | null> }) {
  return (
    <StepCard>
      <StepHeading ref={headingRef}>You chose not to sign electronically</StepHeading>
      <div className="mt-2 space-y-2 text-canvas-800">
        <p>Nothing has been signed, and this link no longer works. {page.company.name} has been told.</p>
        <p>
          To go ahead with your booking, contact {page.company.name} to sign the agreement on paper or to ask for a new link if you change your mind.
        </p>
        <p className="whitespace-pre-line">{page.disclosure.paperCopyRequest}</p>
      </div>
      <CompanyContact company={page.company} />
    </StepCard>
  );
}

import { useId, useState, type RefObject } from 'react';
import type { Disclosure, SigningPage } from '@shared/schemas/signing';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { errorMessage } from '@/lib/api';
import { PdfLink } from './pdf-link';
import { StepCard, StepHeading } from './step-heading';

/** Each element of the disclosure (15 U.S.C. §7001(c)(1)) under a plain heading, in the statute's order. */
const DISCLOSURE_HEADINGS: Array<[keyof Disclosure, string]> = [
  ['paperCopy', 'You can have this agreement on paper'],
  ['withdrawal', 'You can withdraw your consent'],
  ['scope', 'What your consent covers'],
  ['procedures', 'How to withdraw consent or update your contact details'],
  ['paperCopyRequest', 'How to ask for a paper copy later'],
  ['requirements', 'What you need to open and keep the records'],
  ['demonstration', 'Showing that you can open the agreement'],
];

export const CONSENT_LABEL = 'I have opened the PDF and I agree to use electronic records and signatures for this agreement';

interface ConsentStepProps {
  page: SigningPage;
  headingRef: RefObject<HTMLHeadingElement | null>;
  pdfOpened: boolean;
  onPdfOpened: () => void;
  agreeing: boolean;
  agreeError: unknown;
  onAgree: () => void;
  onDecline: () => void;
}

export function ConsentStep({ page, headingRef, pdfOpened, onPdfOpened, agreeing, agreeError, onAgree, onDecline }: ConsentStepProps) {
  const [ticked, setTicked] = useState(false);
  const [tickError, setTickError] = useState<string | null>(null);
  const checkboxId = useId();

  const agree = () => {
    if (!ticked) {
      setTickError(pdfOpened ? 'Tick the box to agree.' : 'Open the PDF first, then tick the box to agree.');
      requestAnimationFrame(() => document.getElementById(checkboxId)?.querySelector('input')?.focus());
      return;
    }
    onAgree();
  };

  return (
    <StepCard>
      <StepHeading ref={headingRef}>Agree to sign electronically</StepHeading>
      <p className="mt-2 text-canvas-800">
        {page.company.name} asks you to sign your rental agreement on this page instead of on paper. Before you agree, read what that means.
      </p>

      <div className="mt-4 space-y-4">
        {DISCLOSURE_HEADINGS.map(([key, heading]) => (
          <section key={key} aria-labelledby={`disclosure-${key}`}>
            <h3 id={`disclosure-${key}`} className="font-semibold text-canvas-900">
              {heading}
            </h3>
            <p className="mt-1 whitespace-pre-line text-canvas-800">{page.disclosure[key]}</p>
          </section>
        ))}
      </div>

      <div className="mt-6 rounded-md border border-canvas-200 bg-canvas-50 p-4">
        <p className="text-sm text-canvas-800">Open the agreement to check that your device shows it. It opens in a new tab; come back here afterwards.</p>
        <PdfLink href={page.document.pdfUrl} onOpen={onPdfOpened} className="mt-3 w-full sm:w-auto" />
        <div id={checkboxId} className="mt-4">
          <Checkbox
            label={CONSENT_LABEL}
            checked={ticked}
            disabled={!pdfOpened}
            hint={pdfOpened ? undefined : 'Open the PDF above first; then you can tick this box.'}
            error={tickError ?? undefined}
            onChange={(event) => {
              setTicked(event.target.checked);
              setTickError(null);
            }}
          />
        </div>
      </div>

      <FormMessage message={agreeError ? errorMessage(agreeError) : null} />
      <div className="mt-5 flex flex-col gap-3 sm:flex-row sm:items-center">
        <Button onClick={agree} isLoading={agreeing} className="w-full sm:w-auto">
          I agree
        </Button>
        <Button variant="ghost" onClick={onDecline} disabled={agreeing} className="w-full sm:w-auto">
          I do not agree
        </Button>
      </div>
    </StepCard>
  );
}

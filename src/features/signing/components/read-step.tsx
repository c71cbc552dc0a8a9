import type { RefObject } from 'react';
import type { SigningPage } from '@shared/schemas/signing';
import { Button } from '@/components/ui/button';
import { AgreementText } from './agreement-text';
import { PdfLink } from './pdf-link';
import { StepCard, StepHeading } from './step-heading';

interface ReadStepProps {
  page: SigningPage;
  headingRef: RefObject<HTMLHeadingElement | null>;
  nextLabel: string;
  onNext: () => void;
}

/** The agreement exactly as issued, with its number, version and the PDF. */
export function ReadStep({ page, headingRef, nextLabel, onNext }: ReadStepProps) {
  const d = page.document;
  return (
    <StepCard>
      <StepHeading ref={headingRef}>Read the agreement</StepHeading>
      <p className="mt-2 text-canvas-800">
        {d.title} {d.number}, version {d.version}, for {page.customerName}. Take your time: the clauses you initial in the next step are in it.
      </p>
      <PdfLink href={d.pdfUrl} className="mt-3 w-full sm:w-auto" />
      <div className="mt-4">
        <AgreementText html={d.html} label={`${d.title} ${d.number}`} />
      </div>
      <div className="mt-5 flex flex-col gap-3 sm:flex-row">
        <Button onClick={onNext} className="w-full sm:w-auto">
          {nextLabel}
        </Button>
      </div>
    </StepCard>
  );
}

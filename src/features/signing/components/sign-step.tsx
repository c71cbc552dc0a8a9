import type { MutableRefObject, RefObject } from 'react';
import type { PointGroup } from 'signature_pad';
import type { SigningPage } from '@shared/schemas/signing';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { TextField } from '@/components/ui/text-field';
import { CompanyContact } from './signing-layout';
import { SIGNATURE_INK, SignaturePadField, type SignaturePadHandle } from './signature-pad-field';
import { StepCard, StepHeading } from './step-heading';

export const TYPED_ONLY_LABEL = 'I can’t draw a signature — sign with my typed name';

interface SignStepProps {
  page: SigningPage;
  headingRef: RefObject<HTMLHeadingElement | null>;
  formRef: RefObject<HTMLFormElement | null>;
  typedName: string;
  onTypedNameChange: (value: string) => void;
  typedOnly: boolean;
  onTypedOnlyChange: (value: boolean) => void;
  strokes: PointGroup[];
  onStrokesChange: (strokes: PointGroup[]) => void;
  padRef: MutableRefObject<SignaturePadHandle | null>;
  errors: Record<string, string>;
  formError: string | null;
  /** The items are no longer free on the event dates: signing cannot go ahead. */
  stockGone: string | null;
  signing: boolean;
  backLabel: string;
  onBack: () => void;
  onSign: () => void;
}

/** The typed name in the signature style the signed PDF uses: the italic face in pen blue. */
function TypedSignature({ name }: { name: string }) {
  return (
    <div className="rounded-md border-2 border-canvas-400 bg-white px-4 pt-6 pb-3">
      <p className="text-sm font-semibold text-canvas-800">Your signature will read:</p>
      <p
        className="mt-2 min-h-12 border-b border-canvas-400 pb-1 text-3xl break-words italic"
        style={{ color: SIGNATURE_INK }}
        aria-live="polite"
      >
        {name.trim() || <span className="text-base text-canvas-500 not-italic">Type your full legal name above.</span>}
      </p>
    </div>
  );
}

export function SignStep(props: SignStepProps) {
  const { page, headingRef, formRef, typedName, typedOnly, errors, formError, stockGone, signing } = props;
  return (
    <StepCard>
      <StepHeading ref={headingRef}>Sign the agreement</StepHeading>
      <p className="mt-2 text-canvas-800">
        You are signing {page.document.title} {page.document.number}, version {page.document.version}, with {page.company.name}.
      </p>
      <form
        ref={formRef}
        noValidate
        aria-label="Your signature"
        className="mt-4 space-y-5"
        onSubmit={(event) => {
          event.preventDefault();
          props.onSign();
        }}
      >
        <FormMessage message={formError} />
        {stockGone ? (
          <Alert tone="danger" title="The agreement could not be signed.">
            <p>{stockGone}</p>
            {/* The server's message already says the company has been told. */}
            <p className="mt-2">You can also contact {page.company.name} yourself:</p>
            <CompanyContact company={page.company} />
          </Alert>
        ) : null}
        <TextField
          label="Full legal name"
          name="typedName"
          autoComplete="name"
          autoCapitalize="words"
          spellCheck={false}
          value={typedName}
          error={errors.typedName}
          hint="As on your ID. It is printed under your signature."
          onChange={(event) => props.onTypedNameChange(event.target.value)}
        />

        {typedOnly ? (
          <TypedSignature name={typedName} />
        ) : (
          <SignaturePadField
            strokes={props.strokes}
            onStrokesChange={props.onStrokesChange}
            handleRef={props.padRef}
            error={errors.signatureImage}
            disabled={signing}
          />
        )}
        <Checkbox label={TYPED_ONLY_LABEL} checked={typedOnly} onChange={(event) => props.onTypedOnlyChange(event.target.checked)} />

        <p className="text-sm text-canvas-700">
          When you sign, {page.company.name} receives your name, signature and initials, with the time and your device’s internet address and browser. They are
          printed on a certificate page of the signed copy, which is sealed so any later change shows.
        </p>

        <div className="flex flex-col gap-3 sm:flex-row">
          <Button type="submit" isLoading={signing} disabled={Boolean(stockGone)} className="w-full sm:w-auto">
            Sign the agreement
          </Button>
          <Button variant="secondary" onClick={props.onBack} disabled={signing} className="w-full sm:w-auto">
            {props.backLabel}
          </Button>
        </div>
      </form>
    </StepCard>
  );
}

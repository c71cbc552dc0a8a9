import type { RefObject } from 'react';
import type { SigningPage } from '@shared/schemas/signing';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { StepCard, StepHeading } from './step-heading';

interface InitialsStepProps {
  page: SigningPage;
  headingRef: RefObject<HTMLHeadingElement | null>;
  formRef: RefObject<HTMLFormElement | null>;
  /** Suggested initials from the customer's name; written into a box only when the customer taps it. */
  suggestion: string;
  values: Record<string, string>;
  errors: Record<string, string>;
  formError: string | null;
  onChange: (clauseKey: string, value: string) => void;
  onBack: () => void;
  onNext: () => void;
}

/** One short box per clause that asks for initials; nothing is filled in for the customer. */
export function InitialsStep({ page, headingRef, formRef, suggestion, values, errors, formError, onChange, onBack, onNext }: InitialsStepProps) {
  const clauses = page.clauses.filter((c) => c.requiresInitials);
  return (
    <StepCard>
      <StepHeading ref={headingRef}>Initial the clauses</StepHeading>
      <p className="mt-2 text-canvas-800">
        Write your initials for each clause below to show you have read it. The clause text is in the agreement on the Read step.
      </p>
      <form
        ref={formRef}
        noValidate
        aria-label="Initials"
        className="mt-4 space-y-3"
        onSubmit={(event) => {
          event.preventDefault();
          onNext();
        }}
      >
        <FormMessage message={formError} />
        <ul className="space-y-3">
          {clauses.map((clause) => {
            const value = values[clause.key] ?? '';
            const error = errors[`initials.${clause.key}`];
            return (
              <li key={clause.key} className="rounded-md border border-canvas-200 bg-canvas-50 p-3">
                <p className="font-semibold text-canvas-900">{clause.title}</p>
                <div className="mt-2 flex flex-wrap items-start gap-2">
                  <TextField
                    label={`Initials for ${clause.title}`}
                    hideLabel
                    name={`initials.${clause.key}`}
                    value={value}
                    error={error}
                    maxLength={8}
                    autoComplete="off"
                    autoCapitalize="characters"
                    spellCheck={false}
                    placeholder="Initials"
                    className="w-32"
                    onChange={(event) => onChange(clause.key, event.target.value.toUpperCase())}
                  />
                  {suggestion && value !== suggestion ? (
                    <Button size="sm" variant="secondary" className="min-h-11" onClick={() => onChange(clause.key, suggestion)}>
                      Write {suggestion}
                      <span className="sr-only"> for {clause.title}</span>
                    </Button>
                  ) : null}
                </div>
              </li>
            );
          })}
        </ul>
        <div className="flex flex-col gap-3 pt-2 sm:flex-row">
          <Button type="submit" className="w-full sm:w-auto">
            Continue to sign
          </Button>
          <Button variant="secondary" onClick={onBack} className="w-full sm:w-auto">
            Back to the agreement
          </Button>
        </div>
      </form>
    </StepCard>
  );
}

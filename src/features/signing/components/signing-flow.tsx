import { useEffect, useRef, useState } from 'react';
import type { PointGroup } from 'signature_pad';
import { SignRequest, type SigningPage } from '@shared/schemas/signing';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Button } from '@/components/ui/button';
import { errorMessage, isApiError } from '@/lib/api';
import { zodFieldErrors, type FieldErrors } from '@/lib/form';
import { useGiveConsent } from '../api/give-consent';
import { useSignAgreement } from '../api/sign-agreement';
import { useWithdrawConsent } from '../api/withdraw-consent';
import { ConsentStep } from './consent-step';
import { DeclinedView, DoneStep } from './done-step';
import { InitialsStep } from './initials-step';
import { LinkStateView, linkStateFromError, STATUS_CODES } from './link-state';
import { ReadStep } from './read-step';
import { SignStep } from './sign-step';
import { initialsOf } from './signing-labels';
import { SigningLayout } from './signing-layout';
import { SigningProgress, SIGNING_STEP_LABELS, type SigningStep } from './signing-progress';
import type { SignaturePadHandle } from './signature-pad-field';

export const SIGNING_TITLE = 'Sign your rental agreement';

const CHECK_FIELDS = 'Check the highlighted fields.';
const INITIALS_MISSING = 'Write your initials in each box.';

const focusFirstInvalid = (form: HTMLFormElement | null) =>
  requestAnimationFrame(() => form?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());

/**
 * The customer's way through: consent, read, initial, sign, done. Everything typed or drawn is
 * kept here, above the steps, so going back or a refused submission never loses it.
 */
export function SigningFlow({ token, page }: { token: string; page: SigningPage }) {
  const needsInitials = page.clauses.some((c) => c.requiresInitials);
  const steps: SigningStep[] = needsInitials ? ['consent', 'read', 'initial', 'sign', 'done'] : ['consent', 'read', 'sign', 'done'];
  const [step, setStep] = useState<SigningStep>(page.status === 'signed' ? 'done' : page.consentedAt ? 'read' : 'consent');
  const [pdfOpened, setPdfOpened] = useState(Boolean(page.consentedAt));
  const [declining, setDeclining] = useState(false);
  const [initials, setInitials] = useState<Record<string, string>>({});
  const [typedName, setTypedName] = useState('');
  const [typedOnly, setTypedOnly] = useState(false);
  const [strokes, setStrokes] = useState<PointGroup[]>([]);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [stockGone, setStockGone] = useState<string | null>(null);
  const [signedPdfUrl, setSignedPdfUrl] = useState<string | null>(page.signedPdfUrl);
  const [ended, setEnded] = useState<ReturnType<typeof linkStateFromError>>(null);

  const consent = useGiveConsent(token);
  const withdraw = useWithdrawConsent(token);
  const sign = useSignAgreement();

  const headingRef = useRef<HTMLHeadingElement>(null);
  const initialsForm = useRef<HTMLFormElement>(null);
  const signForm = useRef<HTMLFormElement>(null);
  const padRef = useRef<SignaturePadHandle | null>(null);

  // A new step starts at its heading, at the top of the page; not on the first load.
  const shownStep = useRef(step);
  useEffect(() => {
    if (shownStep.current === step) return;
    shownStep.current = step;
    window.scrollTo({ top: 0 });
    headingRef.current?.focus({ preventScroll: true });
  }, [step]);

  // Once every highlighted field is put right, the summary above them goes too.
  useEffect(() => {
    if (Object.keys(errors).length === 0) setFormError((m) => (m === CHECK_FIELDS || m === INITIALS_MISSING ? null : m));
  }, [errors]);

  const clauseKeys = page.clauses.filter((c) => c.requiresInitials).map((c) => c.key);
  const after = (s: SigningStep) => steps[steps.indexOf(s) + 1];
  const before = (s: SigningStep) => steps[steps.indexOf(s) - 1];

  /** A 404/410 at any point: the link has ended under the customer (voided, replaced, expired). */
  const endedBy = (error: unknown) => {
    const state = linkStateFromError(error);
    if (state) setEnded(state);
    return Boolean(state);
  };

  const agree = () =>
    consent.mutate(undefined, {
      onSuccess: () => setStep('read'),
      onError: endedBy,
    });

  const decline = () =>
    withdraw.mutate(undefined, {
      onSuccess: () => setDeclining(false),
      onError: (error) => {
        if (endedBy(error)) setDeclining(false);
      },
    });

  const setInitial = (key: string, value: string) => {
    setInitials((prev) => ({ ...prev, [key]: value }));
    setErrors((prev) => {
      const path = `initials.${key}`;
      if (!(path in prev)) return prev;
      const next = { ...prev };
      delete next[path];
      return next;
    });
  };

  /** Every clause needs its box filled; the messages are the schema's, under the box they belong to. */
  const checkInitials = (): FieldErrors => {
    const picked = Object.fromEntries(clauseKeys.map((k) => [k, initials[k] ?? '']));
    const result = SignRequest.shape.initials.safeParse(picked);
    if (result.success) return {};
    const out: FieldErrors = {};
    for (const [key, message] of Object.entries(zodFieldErrors(result.error))) out[`initials.${key}`] = message;
    return out;
  };

  const continueFromInitials = () => {
    const found = checkInitials();
    setErrors(found);
    if (Object.keys(found).length > 0) {
      setFormError(INITIALS_MISSING);
      focusFirstInvalid(initialsForm.current);
      return;
    }
    setFormError(null);
    setStep('sign');
  };

  const submit = () => {
    setFormError(null);
    setStockGone(null);
    const pad = padRef.current;
    const drawn = !typedOnly && pad && !pad.isEmpty() ? pad.toPng() : undefined;
    const body: SignRequest = {
      typedName,
      initials: Object.fromEntries(clauseKeys.map((k) => [k, initials[k] ?? ''])),
      ...(drawn ? { signatureImage: drawn } : {}),
    };
    const parsed = SignRequest.safeParse(body);
    const found: FieldErrors = parsed.success ? {} : zodFieldErrors(parsed.error);
    if (!typedOnly && !drawn) found.signatureImage = 'Draw your signature in the box, or tick the box below to sign with your typed name.';
    if (Object.keys(found).length > 0) return showErrors(found, CHECK_FIELDS);

    sign.mutate(
      { token, body },
      {
        onSuccess: (result) => {
          setSignedPdfUrl(result.signedPdfUrl);
          setStep('done');
        },
        onError: (error) => {
          if (endedBy(error)) return;
          if (isApiError(error, 'stock_gone')) return setStockGone(error.message);
          if (isApiError(error, 'already_signed')) return setFormError(`${error.message} Your signed copy was e-mailed to you.`);
          if (isApiError(error) && Object.keys(error.fields).length > 0) return showErrors(error.fields, error.message);
          setFormError(errorMessage(error));
        },
      },
    );
  };

  /** Messages go to their boxes; initials live on the Initial step, so a problem there goes back to it. */
  const showErrors = (found: FieldErrors, message: string) => {
    setErrors(found);
    setFormError(message);
    const initialsWrong = Object.keys(found).some((k) => k.startsWith('initials.'));
    const signWrong = Object.keys(found).some((k) => !k.startsWith('initials.'));
    if (initialsWrong && !signWrong && needsInitials) {
      setStep('initial');
      focusFirstInvalid(initialsForm.current);
    } else {
      focusFirstInvalid(signForm.current);
    }
  };

  if (ended) return <LinkStateView code={ended.code} message={ended.message} company={ended.company ?? page.company} />;
  const endedCode = STATUS_CODES[page.status];
  if (endedCode) return <LinkStateView code={endedCode} company={page.company} />;

  if (page.status === 'declined') {
    return (
      <SigningLayout companyName={page.company.name} title={SIGNING_TITLE}>
        <DeclinedView page={page} headingRef={headingRef} />
      </SigningLayout>
    );
  }

  const shown: SigningStep = page.status === 'signed' ? 'done' : step;
  const nextAfterRead = after('read');

  return (
    <SigningLayout companyName={page.company.name} title={SIGNING_TITLE}>
      <SigningProgress steps={steps} current={shown} />
      {shown === 'consent' ? (
        <ConsentStep
          page={page}
          headingRef={headingRef}
          pdfOpened={pdfOpened}
          onPdfOpened={() => setPdfOpened(true)}
          agreeing={consent.isPending}
          agreeError={consent.error && !linkStateFromError(consent.error) ? consent.error : null}
          onAgree={agree}
          onDecline={() => {
            withdraw.reset();
            setDeclining(true);
          }}
        />
      ) : shown === 'read' ? (
        <ReadStep page={page} headingRef={headingRef} nextLabel={`Continue to ${SIGNING_STEP_LABELS[nextAfterRead].toLowerCase()}`} onNext={() => setStep(nextAfterRead)} />
      ) : shown === 'initial' ? (
        <InitialsStep
          page={page}
          headingRef={headingRef}
          formRef={initialsForm}
          suggestion={initialsOf(typedName || page.customerName)}
          values={initials}
          errors={errors}
          formError={formError}
          onChange={setInitial}
          onBack={() => setStep('read')}
          onNext={continueFromInitials}
        />
      ) : shown === 'sign' ? (
        <SignStep
          page={page}
          headingRef={headingRef}
          formRef={signForm}
          typedName={typedName}
          onTypedNameChange={(value) => {
            setTypedName(value);
            setErrors(({ typedName: _, ...rest }) => rest);
          }}
          typedOnly={typedOnly}
          onTypedOnlyChange={(value) => {
            setTypedOnly(value);
            setErrors(({ signatureImage: _, ...rest }) => rest);
          }}
          strokes={strokes}
          onStrokesChange={(next) => {
            setStrokes(next);
            if (next.length > 0) setErrors(({ signatureImage: _, ...rest }) => rest);
          }}
          padRef={padRef}
          errors={errors}
          formError={formError}
          stockGone={stockGone}
          signing={sign.isPending}
          backLabel={needsInitials ? 'Back to initials' : 'Back to the agreement'}
          onBack={() => {
            setFormError(null);
            setStep(before('sign'));
          }}
          onSign={submit}
        />
      ) : (
        <DoneStep page={page} signedPdfUrl={signedPdfUrl ?? page.signedPdfUrl} headingRef={headingRef} />
      )}

      {shown !== 'consent' && shown !== 'done' ? (
        <div className="mt-6 text-center">
          <Button
            size="sm"
            variant="ghost"
            onClick={() => {
              withdraw.reset();
              setDeclining(true);
            }}
          >
            Withdraw my consent to sign electronically
          </Button>
        </div>
      ) : null}

      <ConfirmDialog
        open={declining}
        title="Not sign electronically?"
        confirmLabel="Yes, decline"
        confirmVariant="danger"
        isLoading={withdraw.isPending}
        error={withdraw.error && !linkStateFromError(withdraw.error) ? errorMessage(withdraw.error) : null}
        onConfirm={decline}
        onCancel={() => setDeclining(false)}
      >
        <p>
          Nothing will be signed and this link stops working. {page.company.name} is told, and you can sign on paper instead: contact them to arrange it.
        </p>
      </ConfirmDialog>
    </SigningLayout>
  );
}

import { useId, useRef, useState } from 'react';
import { CheckoutRequest } from '@shared/schemas/portal';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { ApiError, errorMessage } from '@/lib/api';
import { parseDollars } from '@/lib/amounts';
import { zodFieldErrors } from '@/lib/form';
import { money } from './labels';

const MIN_CARD_CENTS = 50;

interface PayFormProps {
  /** What the button pays by default: the invoice's whole balance. */
  balanceCents: number;
  currency: string;
  /** "invoice INV-2027-0004", for the buttons' names. */
  what: string;
  companyName: string;
  /** Starts the card payment: no amount for the whole balance. */
  onPay: (body: CheckoutRequest) => void;
  isPending: boolean;
  /** Set once the payment page's address came back and the browser is on its way. */
  leaving: boolean;
  error: unknown;
}

/**
 * Pay by card: the whole balance with one tap, or a part of it typed in dollars. The card itself
 * is typed on the secure payment page, never here.
 */
export function PayForm({ balanceCents, currency, what, companyName, onPay, isPending, leaving, error }: PayFormProps) {
  const [part, setPart] = useState(false);
  const [amount, setAmount] = useState('');
  const [amountError, setAmountError] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const noteId = useId();
  const busy = isPending || leaving;

  // A server message about the amount goes under the field; anything else above the buttons.
  const serverFields = error instanceof ApiError ? error.fields : {};
  const serverAmountError = part ? (serverFields.amountCents ?? serverFields.amount) : undefined;
  const formError = error && !serverAmountError ? errorMessage(error) : null;
  const shownAmountError = amountError ?? serverAmountError ?? undefined;

  const focusAmount = () => requestAnimationFrame(() => formRef.current?.querySelector<HTMLInputElement>('input[name="amount"]')?.focus());

  const payPart = () => {
    const parsed = parseDollars(amount, null);
    if (!parsed.ok) return fail(parsed.message);
    if (parsed.value === null) return fail(`Enter the amount to pay, from ${money(MIN_CARD_CENTS, currency)} up to ${money(balanceCents, currency)}.`);
    const checked = CheckoutRequest.safeParse({ amountCents: parsed.value });
    if (!checked.success) return fail(zodFieldErrors(checked.error).amountCents ?? 'Check the amount.');
    if (parsed.value > balanceCents) return fail(`That is more than the balance of ${money(balanceCents, currency)}.`);
    setAmountError(null);
    // The whole balance typed out is the same payment as the one-tap button.
    onPay(parsed.value === balanceCents ? {} : { amountCents: parsed.value });
  };

  const fail = (message: string) => {
    setAmountError(message);
    focusAmount();
  };

  const canPart = balanceCents > MIN_CARD_CENTS;

  return (
    <form
      ref={formRef}
      noValidate
      aria-label={`Pay ${what} by card`}
      className="space-y-3"
      onSubmit={(event) => {
        event.preventDefault();
        if (part) payPart();
        else onPay({});
      }}
    >
      <FormMessage message={formError} />
      {part ? (
        <div className="space-y-3 rounded-md border border-canvas-200 bg-canvas-50 p-3">
          <TextField
            label="Amount to pay, in dollars"
            name="amount"
            inputMode="decimal"
            autoComplete="off"
            value={amount}
            error={shownAmountError}
            hint={`From ${money(MIN_CARD_CENTS, currency)} up to ${money(balanceCents, currency)}.`}
            onChange={(event) => {
              setAmount(event.target.value);
              setAmountError(null);
            }}
          />
          <div className="flex flex-col gap-2 sm:flex-row">
            <Button type="submit" isLoading={busy} className="w-full sm:w-auto" aria-describedby={noteId}>
              Pay this amount by card
            </Button>
            <Button
              variant="ghost"
              disabled={busy}
              className="w-full sm:w-auto"
              onClick={() => {
                setPart(false);
                setAmountError(null);
                // The button pressed goes away: focus lands on the one that now pays.
                requestAnimationFrame(() => formRef.current?.querySelector<HTMLButtonElement>('button[type="submit"]')?.focus());
              }}
            >
              Pay the whole balance instead
            </Button>
          </div>
        </div>
      ) : (
        <div className="flex flex-col gap-2 sm:flex-row sm:items-center">
          <Button type="submit" isLoading={busy} className="w-full sm:w-auto" aria-describedby={noteId}>
            Pay {money(balanceCents, currency)} by card
          </Button>
          {canPart ? (
            <Button variant="ghost" disabled={busy} className="w-full sm:w-auto" onClick={() => { setPart(true); focusAmount(); }}>
              Pay part of it
            </Button>
          ) : null}
        </div>
      )}
      <p id={noteId} className="text-sm text-canvas-600" aria-live="polite">
        {leaving
          ? 'Taking you to the secure payment page…'
          : `You type your card details on a secure payment page and come straight back here. ${companyName} never sees your card number.`}
      </p>
    </form>
  );
}

/** Leaves for the secure payment page; only a web address is followed. */
export function goToPaymentPage(url: string): boolean {
  try {
    const target = new URL(url, window.location.href);
    if (target.protocol !== 'https:' && target.protocol !== 'http:') return false;
    window.location.assign(target.toString());
    return true;
  } catch {
    return false;
  }
}

import { useEffect, useState } from 'react';
import { formatMoney } from '@shared/money';
import type { ChargeKind, ProposedCharges } from '@shared/schemas/field';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { centsToInput, parseDollars } from '@/lib/amounts';
import { errorMessage, isApiError } from '@/lib/api';
import type { FieldErrors } from '@/lib/form';
import { useCharges, useInvoiceCharges } from '../api/charges';

interface Row {
  key: string;
  charge: ChargeKind;
  description: string;
  amount: string;
  keep: boolean;
  replacement: number;
}

const rowsOf = (data: ProposedCharges): Row[] =>
  data.lines.flatMap((l) => l.proposed.map((p) => ({ key: l.key, charge: p.charge, description: p.description, amount: centsToInput(p.amountCents), keep: true, replacement: l.replacementValueCents })));

/**
 * The office's review of the pickup check-in: each damaged or missing line with a proposed amount
 * (replacement value; type the repair amount instead for damage), made into one draft
 * additional-charges invoice that the security deposit can then pay.
 */
export function ChargesPanel({ bookingId }: { bookingId: string }) {
  const charges = useCharges(bookingId);
  const make = useInvoiceCharges(bookingId);
  const [rows, setRows] = useState<Row[]>([]);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  useEffect(() => {
    if (charges.data) setRows(rowsOf(charges.data));
  }, [charges.data?.submittedAt, charges.data?.invoice?.id]); // eslint-disable-line react-hooks/exhaustive-deps

  if (charges.isPending) return <Spinner label="Loading the check-in…" className="text-canvas-600" />;
  if (charges.isError) return <Alert tone="danger">{errorMessage(charges.error)}</Alert>;
  const data = charges.data;
  const money = (cents: number) => formatMoney(cents, data.currency);

  if (!data.submittedAt) return <p className="text-sm text-canvas-700">The crew has not finished the pickup check-in yet.</p>;
  if (data.invoice) {
    return (
      <div className="space-y-2 text-sm">
        <p>
          The damage and missing items are on{' '}
          <TextLink to={paths.app.invoice.getHref(data.invoice.id)}>{data.invoice.number ? `invoice ${data.invoice.number}` : 'a draft additional-charges invoice'}</TextLink> ({money(data.invoice.totalCents)},{' '}
          {data.invoice.status.replace('_', ' ')}).
        </p>
        <p>
          Security deposit held: <span className="font-semibold">{money(data.securityDepositHeldCents)}</span>.{' '}
          {data.securityDepositHeldCents === 0
            ? 'No security deposit is held: the customer pays the invoice like any other.'
            : data.invoice.status === 'draft'
              ? 'Issue the invoice, then pay it from the security deposit in the Money panel.'
              : 'Pay it from the security deposit in the Money panel, and return what is left.'}
        </p>
        <TextLink to={paths.app.fieldCheckIn.getHref(bookingId)}>See the check-in and its photos</TextLink>
      </div>
    );
  }
  if (!data.lines.length) return <Alert tone="success">Everything came back undamaged. Nothing to charge; the security deposit can go back.</Alert>;

  const kept = rows.filter((r) => r.keep);
  const submit = () => {
    setFormError(null);
    const next: FieldErrors = {};
    const lines = rows.flatMap((r, i) => {
      if (!r.keep) return [];
      const p = parseDollars(r.amount, null);
      if (!p.ok || !p.value) next[`rows.${i}.amount`] = p.ok ? 'Enter an amount above zero.' : p.message;
      if (!r.description.trim()) next[`rows.${i}.description`] = 'Describe the charge.';
      return [{ key: r.key, charge: r.charge, description: r.description.trim(), amountCents: p.ok ? (p.value ?? 0) : 0 }];
    });
    setErrors(next);
    if (Object.keys(next).length) return setFormError('Check the highlighted amounts.');
    make.mutate(
      { bookingId, lines },
      {
        onError: (error) => {
          // The server names lines by their place among the kept ones.
          if (isApiError(error)) {
            const keptIndex = rows.map((r, i) => (r.keep ? i : -1)).filter((i) => i >= 0);
            const mapped: FieldErrors = {};
            for (const [k, m] of Object.entries(error.fields)) {
              const match = /^lines\.(\d+)\.(\w+)$/.exec(k);
              if (match) mapped[`rows.${keptIndex[Number(match[1])]}.${match[2] === 'amountCents' ? 'amount' : 'description'}`] = m;
            }
            setErrors(mapped);
          }
          setFormError(errorMessage(error));
        },
      },
    );
  };

  return (
    <div role="group" aria-label="Proposed charges" className="space-y-4 text-sm">
      <p>
        The crew checked it in. Missing units are proposed at their replacement value; for damage, type the repair amount if it is less. Untick what you will not
        charge. The invoice is made as a draft for you to issue.
      </p>
      <ul className="space-y-3">
        {rows.map((r, i) => (
          <li key={`${r.key}-${r.charge}`} className="rounded-md border border-canvas-200 bg-white p-3">
            <label className="flex items-center gap-2 font-semibold text-canvas-900">
              <input type="checkbox" className="size-5 accent-pine-700" checked={r.keep} onChange={(e) => setRows((x) => x.map((y, j) => (j === i ? { ...y, keep: e.target.checked } : y)))} />
              Charge {r.charge === 'missing' ? 'for missing' : 'for damage'}
            </label>
            <div className="mt-2 grid gap-3 sm:grid-cols-[1fr_10rem]">
              <TextField
                label="Description"
                value={r.description}
                disabled={!r.keep}
                maxLength={200}
                onChange={(e) => setRows((x) => x.map((y, j) => (j === i ? { ...y, description: e.target.value } : y)))}
                error={errors[`rows.${i}.description`]}
              />
              <TextField
                label="Amount"
                inputMode="decimal"
                value={r.amount}
                disabled={!r.keep}
                hint={`Replacement ${money(r.replacement)} each`}
                onChange={(e) => setRows((x) => x.map((y, j) => (j === i ? { ...y, amount: e.target.value } : y)))}
                error={errors[`rows.${i}.amount`]}
              />
            </div>
          </li>
        ))}
      </ul>
      <p>
        Security deposit held: {money(data.securityDepositHeldCents)}. <TextLink to={paths.app.fieldCheckIn.getHref(bookingId)}>See the check-in and its photos</TextLink>
      </p>
      <FormMessage message={formError} />
      {data.can.createInvoice ? (
        <Button disabled={!kept.length} isLoading={make.isPending} onClick={submit}>
          Make the additional-charges invoice
        </Button>
      ) : null}
    </div>
  );
}

import { useId, useRef, useState } from 'react';
import { AccountInput, type AccountRow } from '@shared/schemas/invoices';
import { Button } from '@/components/ui/button';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useUpdateAccount } from '../api/update-account';
import { ACCOUNT_TYPE_LABELS, accountPurpose } from './ledger-labels';

const purposeCell = (a: AccountRow) => accountPurpose(a.systemKey) || <span className="text-canvas-600">Your own account</span>;

/**
 * One account as a row whose code and name are a small form. A <form> cannot sit between table
 * cells, so it lives in the last cell with the button and the inputs join it by `form=`.
 */
function AccountFormRow({ account }: { account: AccountRow }) {
  const formId = useId();
  const rowRef = useRef<HTMLTableRowElement>(null);
  const update = useUpdateAccount();
  const form = useZodForm(AccountInput, { code: account.code, name: account.name });
  const [saved, setSaved] = useState(false);
  // The inputs are outside the <form>, so the form's own focusing cannot find them.
  const focusInvalid = () => requestAnimationFrame(() => rowRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
  const changed = form.values.code.trim() !== account.code || form.values.name.trim() !== account.name;

  const submit = form.handleSubmit((body) => {
    form.setFormError(null);
    setSaved(false);
    update.mutate(
      { id: account.id, body },
      {
        onSuccess: (next) => {
          form.reset({ code: next.code, name: next.name });
          setSaved(true);
        },
        onError: (error) => {
          form.showError(error);
          focusInvalid();
        },
      },
    );
  });

  return (
    <tr ref={rowRef} className="align-top">
      <Td className="w-24 px-2 sm:w-32 sm:min-w-28 sm:px-4">
        <TextField
          label={`Code of account ${account.code}`}
          hideLabel
          form={formId}
          autoComplete="off"
          spellCheck={false}
          maxLength={10}
          disabled={update.isPending}
          className="[&_input]:font-mono"
          {...form.field('code')}
          onChange={(e) => (setSaved(false), form.setValue('code', e.target.value))}
        />
      </Td>
      <Td className="px-2 sm:min-w-56 sm:px-4">
        <TextField
          label={`Name of account ${account.code}`}
          hideLabel
          form={formId}
          autoComplete="off"
          maxLength={120}
          disabled={update.isPending}
          {...form.field('name')}
          onChange={(e) => (setSaved(false), form.setValue('name', e.target.value))}
        />
        {/* On a phone the type and use columns are folded in here, so the Save button stays on screen. */}
        <p className="mt-1 text-xs text-canvas-600 sm:hidden">
          {ACCOUNT_TYPE_LABELS[account.type] ?? account.type} · {purposeCell(account)}
        </p>
      </Td>
      <Td className="whitespace-nowrap max-sm:hidden">{ACCOUNT_TYPE_LABELS[account.type] ?? account.type}</Td>
      <Td className="min-w-48 max-sm:hidden">{purposeCell(account)}</Td>
      <Td className="px-2 whitespace-nowrap sm:px-4">
        <form
          id={formId}
          ref={form.formRef}
          onSubmit={(e) => {
            submit(e);
            focusInvalid();
          }}
          noValidate
          aria-label={`Account ${account.code}`}
        >
          <Button type="submit" size="sm" variant={changed ? 'primary' : 'secondary'} isLoading={update.isPending}>
            Save<span className="sr-only"> account {account.code}</span>
          </Button>
        </form>
        <div aria-live="polite" className="mt-1 text-sm">
          {saved ? <span className="text-pine-800">Saved.</span> : null}
          {/* A message on a field says it there; only one with no field shows here. */}
          {form.formError && Object.keys(form.errors).length === 0 ? <span className="font-semibold text-rust-700">{form.formError}</span> : null}
        </div>
      </Td>
    </tr>
  );
}

/** The chart of accounts by code; the owner edits each account's code and name in its row. */
export function AccountsTable({ accounts, canUpdate }: { accounts: readonly AccountRow[]; canUpdate: boolean }) {
  return (
    <Table caption="Chart of accounts">
      <THead>
        <Tr>
          <Th className={canUpdate ? 'px-2 sm:px-4' : undefined}>Code</Th>
          <Th className={canUpdate ? 'px-2 sm:px-4' : undefined}>Name</Th>
          <Th className={canUpdate ? 'max-sm:hidden' : undefined}>Type</Th>
          <Th className={canUpdate ? 'max-sm:hidden' : undefined}>What Guyline uses it for</Th>
          {canUpdate ? (
            <Th className="px-2 sm:px-4">
              <span className="sr-only">Save</span>
            </Th>
          ) : null}
        </Tr>
      </THead>
      <TBody>
        {accounts.map((a) =>
          canUpdate ? (
            <AccountFormRow key={a.id} account={a} />
          ) : (
            <Tr key={a.id}>
              <Th scope="row" className="py-3 font-mono font-normal">
                {a.code}
              </Th>
              <Td className="min-w-56">{a.name}</Td>
              <Td className="whitespace-nowrap">{ACCOUNT_TYPE_LABELS[a.type] ?? a.type}</Td>
              <Td className="min-w-48">{purposeCell(a)}</Td>
            </Tr>
          ),
        )}
      </TBody>
    </Table>
  );
}

import { useId, useState } from 'react';
import type { CustomerRow } from '@shared/schemas/customers';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/text-field';
import { useDebounced } from '@/lib/use-debounced';
// The picker searches and adds customers through the customers feature's own endpoints and form.
import { useCustomer } from '@/features/customers/api/get-customer';
import { useCustomers } from '@/features/customers/api/get-customers';
import { CustomerForm } from '@/features/customers/components/customer-form';

interface CustomerPickerProps {
  customerId: string;
  /** The customer as the booking was loaded (so it shows before any search). */
  initial: { id: string; name: string; email: string; phone: string; taxExempt: boolean } | null;
  error?: string;
  readOnly: boolean;
  onChange: (customer: { id: string; name: string; taxExempt: boolean }) => void;
}

/** Search customers by name, e-mail or phone and choose one, or add a new one without leaving the booking. */
export function CustomerPicker({ customerId, initial, error, readOnly, onChange }: CustomerPickerProps) {
  const [search, setSearch] = useState('');
  const [changing, setChanging] = useState(!customerId);
  const [adding, setAdding] = useState(false);
  const q = useDebounced(search.trim(), 250);
  const results = useCustomers({ q: q || undefined, pageSize: 8 }, { enabled: changing && !readOnly });
  const loaded = useCustomer(customerId, { enabled: Boolean(customerId) && initial?.id !== customerId });
  const chosen = initial?.id === customerId ? initial : loaded.data ?? null;
  const listId = useId();

  const choose = (c: Pick<CustomerRow, 'id' | 'name' | 'taxExempt'>) => {
    onChange({ id: c.id, name: c.name, taxExempt: c.taxExempt });
    setChanging(false);
    setSearch('');
  };

  return (
    <div className="space-y-3">
      {customerId && chosen && !changing ? (
        <div className="flex flex-wrap items-center justify-between gap-3 rounded-md border border-canvas-200 bg-canvas-50 px-3 py-2">
          <div>
            <p className="font-semibold text-canvas-900">
              {chosen.name} {chosen.taxExempt ? <Badge tone="caution">Tax exempt</Badge> : null}
            </p>
            <p className="text-sm text-canvas-700">{[chosen.email, chosen.phone].filter(Boolean).join(' · ')}</p>
          </div>
          {readOnly ? null : (
            <Button size="sm" variant="secondary" onClick={() => setChanging(true)}>
              Change customer
            </Button>
          )}
        </div>
      ) : null}
      {changing && !readOnly ? (
        <div className="space-y-2">
          <TextField
            label="Find a customer"
            type="search"
            placeholder="Name, e-mail or phone"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            error={error}
            aria-controls={listId}
          />
          <ul id={listId} aria-label="Matching customers" className="divide-y divide-canvas-200 rounded-md border border-canvas-200 bg-white">
            {(results.data?.data ?? []).map((c) => (
              <li key={c.id}>
                <button type="button" onClick={() => choose(c)} className="block w-full px-3 py-2 text-left hover:bg-canvas-100">
                  <span className="font-semibold">Choose {c.name}</span>
                  <span className="block text-sm text-canvas-700">{[c.email, c.phone, c.billingCity].filter(Boolean).join(' · ') || 'No contact details'}</span>
                </button>
              </li>
            ))}
            {results.data && results.data.data.length === 0 ? <li className="px-3 py-2 text-sm text-canvas-700">No customer matches.</li> : null}
            {results.isPending ? <li className="px-3 py-2 text-sm text-canvas-700">Searching…</li> : null}
          </ul>
          <div className="flex flex-wrap gap-2">
            <Button size="sm" variant="secondary" onClick={() => setAdding(true)}>
              New customer
            </Button>
            {customerId ? (
              <Button size="sm" variant="ghost" onClick={() => setChanging(false)}>
                Keep the current customer
              </Button>
            ) : null}
          </div>
        </div>
      ) : null}
      {!changing && error ? <p className="text-sm font-semibold text-rust-700">{error}</p> : null}
      <Dialog open={adding} title="New customer" onClose={() => setAdding(false)} footer={null} wide>
        <CustomerForm
          customer={null}
          compact
          onCancel={() => setAdding(false)}
          onSaved={(c) => {
            setAdding(false);
            choose(c);
          }}
        />
      </Dialog>
    </div>
  );
}

import { useEffect, useState } from 'react';
import type { z } from 'zod';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';

export interface PeriodField {
  name: string;
  label: string;
  type: 'date' | 'month' | 'number';
  hint?: string;
}

/**
 * The dates a report is for. Checked with the same zod schema the server validates with, so a
 * period that ends before it starts is named on its field before anything is asked; the server's
 * own field messages (a 400) land on the same fields.
 */
export function PeriodForm({
  label,
  fields,
  values,
  schema,
  serverErrors,
  onApply,
}: {
  label: string;
  fields: PeriodField[];
  values: Record<string, string>;
  schema: z.ZodType;
  serverErrors?: Record<string, string>;
  onApply: (values: Record<string, string>) => void;
}) {
  const [draft, setDraft] = useState(values);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const key = JSON.stringify(values);
  // The URL is the truth: going back or forward in history refills the fields.
  useEffect(() => setDraft(values), [key]); // eslint-disable-line react-hooks/exhaustive-deps

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    const present = Object.fromEntries(Object.entries(draft).filter(([, v]) => v !== ''));
    const result = schema.safeParse(present);
    if (!result.success) {
      const next: Record<string, string> = {};
      for (const issue of result.error.issues) {
        const k = String(issue.path[0] ?? fields[0].name);
        next[k] ??= issue.message;
      }
      setErrors(next);
      return;
    }
    setErrors({});
    onApply(present as Record<string, string>);
  };

  return (
    <form aria-label={label} className="mb-4 flex flex-wrap items-start gap-4" onSubmit={submit} noValidate>
      {fields.map((f) => (
        <TextField
          key={f.name}
          className="w-44"
          label={f.label}
          hint={f.hint}
          type={f.type}
          inputMode={f.type === 'number' ? 'numeric' : undefined}
          value={draft[f.name] ?? ''}
          error={errors[f.name] ?? serverErrors?.[f.name]}
          onChange={(e) => setDraft((d) => ({ ...d, [f.name]: e.target.value }))}
        />
      ))}
      {/* Level with the inputs, under their labels. */}
      <div className="pt-6">
        <Button type="submit" variant="secondary">
          Show
        </Button>
      </div>
    </form>
  );
}

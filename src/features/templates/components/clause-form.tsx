import { useRef, useState } from 'react';
import { ClauseInput, type ClauseRow, type TemplateProblem } from '@shared/schemas/documents';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Checkbox } from '@/components/ui/checkbox';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { useCreateClause } from '../api/create-clause';
import { problemsOf } from '../api/template-problems';
import { useUpdateClause } from '../api/update-clause';
import { ProblemList } from './problem-list';
import { SourceEditor, type SourceEditorHandle } from './source-editor';
import { VariablePicker } from './variable-picker';

type Values = { key: string; title: string; body: string; requiresInitials: string; active: string; position: string };

const toValues = (c: ClauseRow | null, nextPosition: number): Values => ({
  key: c?.key ?? '',
  title: c?.title ?? '',
  body: c?.body ?? '',
  requiresInitials: String(c?.requiresInitials ?? false),
  active: String(c?.active ?? true),
  position: String(c?.position ?? nextPosition),
});

function toInput(v: Values) {
  const position = v.position.trim() === '' ? Number.NaN : Number(v.position);
  const errors: Record<string, string> = {};
  if (!Number.isInteger(position)) errors.position = 'Enter a whole number, like 10.';
  return {
    input: { key: v.key, title: v.title, body: v.body, requiresInitials: v.requiresInitials === 'true', active: v.active === 'true', position: Number.isInteger(position) ? position : 0 },
    errors,
  };
}

interface ClauseFormProps {
  clause: ClauseRow | null;
  nextPosition: number;
  /** The variables a clause may use (the rental agreement's). */
  variables: readonly string[];
  onSaved: (clause: ClauseRow) => void;
  onCancel: () => void;
}

/** A new clause or changes to one; the server checks the body's variables and syntax. */
export function ClauseForm({ clause, nextPosition, variables, onSaved, onCancel }: ClauseFormProps) {
  const form = useZodForm(ClauseInput, toValues(clause, nextPosition), { toInput });
  const create = useCreateClause();
  const update = useUpdateClause();
  const [problems, setProblems] = useState<TemplateProblem[]>([]);
  const editor = useRef<SourceEditorHandle>(null);
  const saving = create.isPending || update.isPending;

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setProblems([]);
    const done = {
      onSuccess: onSaved,
      onError: (error: unknown) => {
        form.showError(error);
        const found = problemsOf(error);
        if (found) {
          setProblems(found);
          if (isApiError(error) && !error.fields.body && found[0]) form.setErrors({ ...error.fields, body: `Line ${found[0].line}: ${found[0].message}` });
        }
      },
    };
    if (clause) update.mutate({ id: clause.id, body: data }, done);
    else create.mutate(data, done);
  });

  const check = (name: 'requiresInitials' | 'active') => ({
    checked: form.values[name] === 'true',
    onChange: (e: React.ChangeEvent<HTMLInputElement>) => form.setValue(name, String(e.target.checked)),
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label={clause ? `Edit clause ${clause.title}` : 'New clause'} className="space-y-4">
      <FormMessage message={form.formError} />
      <fieldset disabled={saving} className="space-y-4">
        <div className="grid gap-4 sm:grid-cols-[2fr_1fr_8rem]">
          <TextField label="Title" {...form.field('title')} />
          <TextField label="Key" hint="Lowercase letters, digits and hyphens; names the clause in templates." autoCapitalize="off" spellCheck={false} {...form.field('key')} />
          <TextField label="Position" inputMode="numeric" hint="Lower comes first." {...form.field('position')} />
        </div>
        <SourceEditor
          ref={editor}
          name="body"
          label="Clause text"
          hint="Markdown with template variables, like {{company.name}}. Line numbers in problems count within this text."
          rows={12}
          value={form.values.body}
          onChange={(v) => {
            form.setValue('body', v);
            setProblems([]);
          }}
          error={form.errors.body}
          problemLines={new Set(problems.map((p) => p.line))}
        />
        <ProblemList problems={problems} onGoToLine={(line) => editor.current?.goToLine(line)} />
        <div className="flex flex-wrap gap-6">
          <Checkbox label="Asks for the customer’s initials" hint="An initials box is printed beside the clause." {...check('requiresInitials')} />
          <Checkbox label="Active" hint="Only active clauses go into new rental agreements." {...check('active')} />
        </div>
        <details className="rounded-md border border-canvas-200 p-3">
          <summary className="cursor-pointer text-sm font-semibold text-canvas-800">Variables to insert</summary>
          <div className="mt-3">
            <VariablePicker variables={variables} onInsert={(text) => editor.current?.insert(text)} />
          </div>
        </details>
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={saving}>
          {saving ? 'Saving…' : clause ? 'Save clause' : 'Add clause'}
        </Button>
        <Button variant="ghost" onClick={onCancel} disabled={saving}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

import { useId, useMemo, useState } from 'react';
import { TextField } from '@/components/ui/text-field';

/** The variables a template may use; a click inserts `{{variable}}` where the cursor is. */
export function VariablePicker({ variables, onInsert, disabled }: { variables: readonly string[]; onInsert?: (text: string) => void; disabled?: boolean }) {
  const [filter, setFilter] = useState('');
  const listId = useId();
  const shown = useMemo(() => {
    const f = filter.trim().toLowerCase();
    return f ? variables.filter((v) => v.toLowerCase().includes(f)) : variables;
  }, [variables, filter]);

  return (
    <div className="space-y-2">
      <TextField label="Find a variable" type="search" value={filter} onChange={(e) => setFilter(e.target.value)} aria-controls={listId} placeholder="customer, booking, total…" />
      <p className="text-sm text-canvas-600">{onInsert ? 'Click one to insert it at the cursor.' : 'The values a template can show.'}</p>
      <ul id={listId} aria-label="Variables" className="flex max-h-72 flex-wrap gap-1.5 overflow-y-auto rounded-md border border-canvas-200 bg-canvas-50 p-2">
        {shown.map((v) => (
          <li key={v}>
            {onInsert ? (
              <button
                type="button"
                disabled={disabled}
                onClick={() => onInsert(`{{${v}}}`)}
                className="rounded border border-canvas-300 bg-white px-2 py-1 font-mono text-xs text-canvas-900 hover:border-pine-600 hover:bg-pine-50 disabled:text-canvas-500"
              >
                {/* Named by its content, not aria-label, so it never answers to a form field's label. */}
                <span className="sr-only">Insert </span>
                {`{{${v}}}`}
              </button>
            ) : (
              <code className="inline-block rounded border border-canvas-200 bg-white px-2 py-1 font-mono text-xs">{`{{${v}}}`}</code>
            )}
          </li>
        ))}
        {shown.length === 0 ? <li className="px-1 text-sm text-canvas-700">No variable matches.</li> : null}
      </ul>
    </div>
  );
}

import type { ClauseRow } from '@shared/schemas/documents';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';

interface ClausesListProps {
  clauses: readonly ClauseRow[];
  canEdit: boolean;
  /** While a move is saving, the buttons wait. */
  busy: boolean;
  onEdit: (clause: ClauseRow) => void;
  onMove: (index: number, by: -1 | 1) => void;
  onDelete: (clause: ClauseRow) => void;
}

/** The clause library in the order the rental agreement prints it. */
export function ClausesList({ clauses, canEdit, busy, onEdit, onMove, onDelete }: ClausesListProps) {
  return (
    <ol aria-label="Clauses" className="space-y-3">
      {clauses.map((c, i) => (
        <li key={c.id} aria-label={c.title} className={`rounded-lg border bg-white p-4 shadow-sm ${c.active ? 'border-canvas-200' : 'border-dashed border-canvas-300 bg-canvas-50'}`}>
          <div className="flex flex-wrap items-start justify-between gap-3">
            <div className="min-w-0">
              <h2 className="font-semibold text-canvas-900">
                <span className="mr-2 text-canvas-600 tabular-nums">{i + 1}.</span>
                {c.title}
              </h2>
              <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-canvas-700">
                <code className="font-mono text-xs">{c.key}</code>
                <span className="text-canvas-500" aria-hidden="true">
                  ·
                </span>
                <span>position {c.position}</span>
                {c.requiresInitials ? <Badge tone="caution">Initials</Badge> : null}
                {c.active ? <Badge tone="positive">Active</Badge> : <Badge>Not used</Badge>}
              </p>
            </div>
            {canEdit ? (
              <div className="flex flex-wrap gap-1">
                <Button size="sm" variant="ghost" disabled={busy || i === 0} onClick={() => onMove(i, -1)} aria-label={`Move up: ${c.title}`}>
                  Move up
                </Button>
                <Button size="sm" variant="ghost" disabled={busy || i === clauses.length - 1} onClick={() => onMove(i, 1)} aria-label={`Move down: ${c.title}`}>
                  Move down
                </Button>
                <Button size="sm" variant="secondary" disabled={busy} onClick={() => onEdit(c)} aria-label={`Edit ${c.title}`}>
                  Edit
                </Button>
                <Button size="sm" variant="ghost" className="text-rust-700 hover:bg-rust-50" disabled={busy} onClick={() => onDelete(c)} aria-label={`Delete ${c.title}`}>
                  Delete
                </Button>
              </div>
            ) : null}
          </div>
          <details className="mt-2">
            <summary className="cursor-pointer text-sm font-semibold text-pine-700">Show the text</summary>
            <pre className="mt-2 max-h-80 overflow-auto rounded-md bg-canvas-50 p-3 font-mono text-xs whitespace-pre-wrap text-canvas-900">{c.body}</pre>
          </details>
        </li>
      ))}
    </ol>
  );
}

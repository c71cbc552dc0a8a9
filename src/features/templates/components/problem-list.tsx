import type { TemplateProblem } from '@shared/schemas/documents';
import { Button } from '@/components/ui/button';

/** The server's message may already start with "line 12:"; the list says the line itself. */
const withoutLine = (message: string) => message.replace(/^line \d+(,? column \d+)?:\s*/i, '');

/** Problems found on saving or previewing, each with its line and a way to jump to it. */
export function ProblemList({ problems, onGoToLine, title = 'Problems to fix' }: { problems: readonly TemplateProblem[]; onGoToLine?: (line: number) => void; title?: string }) {
  if (problems.length === 0) return null;
  return (
    <div role="alert" className="rounded-md border border-rust-200 bg-rust-50 px-4 py-3 text-sm text-rust-800">
      <p className="font-semibold">
        {title} ({problems.length})
      </p>
      <ul aria-label={title} className="mt-2 space-y-2">
        {problems.map((p, i) => (
          <li key={`${p.line}-${p.column ?? 0}-${i}`} className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span>
              <span className="font-semibold">
                Line {p.line}
                {p.column ? `, column ${p.column}` : ''}:
              </span>{' '}
              {withoutLine(p.message)}
              {p.variable && !p.message.includes(p.variable) ? (
                <>
                  {' '}
                  (<code className="font-mono">{p.variable}</code>)
                </>
              ) : null}
            </span>
            {onGoToLine ? (
              <Button size="sm" variant="ghost" className="min-h-7 px-2 text-rust-800 underline hover:bg-rust-100" onClick={() => onGoToLine(p.line)}>
                Go to line {p.line}
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}

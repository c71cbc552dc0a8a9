import { useId, useImperativeHandle, useMemo, useRef, useState, type ReactNode, type Ref } from 'react';
import { describedBy, FieldError, FieldHint, FieldLabel } from '@/components/ui/field';
import { cn } from '@/lib/cn';

/** What a parent may do to the editor: insert at the cursor, or go to a line named in a problem. */
export interface SourceEditorHandle {
  insert: (text: string) => void;
  goToLine: (line: number) => void;
}

interface SourceEditorProps {
  label: ReactNode;
  value: string;
  onChange: (value: string) => void;
  hint?: ReactNode;
  error?: string;
  /** Lines (from 1) that have a problem: their numbers and rows are marked. */
  problemLines?: ReadonlySet<number>;
  readOnly?: boolean;
  disabled?: boolean;
  rows?: number;
  name?: string;
  ref?: Ref<SourceEditorHandle>;
}

// The gutter and the marks line up with the text only with a fixed line height and no wrapping.
const LINE_PX = 24;
const PAD_PX = 8;

/**
 * A monospace textarea with line numbers: the numbers and a band behind the text mark the lines
 * with problems. Lines do not wrap, so line 12 on screen is line 12 in the server's message.
 */
export function SourceEditor({ label, value, onChange, hint, error, problemLines, readOnly, disabled, rows = 24, name, ref }: SourceEditorProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const textarea = useRef<HTMLTextAreaElement>(null);
  const [scrollTop, setScrollTop] = useState(0);
  const lineCount = useMemo(() => value.split('\n').length, [value]);
  const marked = useMemo(() => [...(problemLines ?? [])].filter((l) => l >= 1 && l <= lineCount), [problemLines, lineCount]);

  useImperativeHandle(ref, () => ({
    insert(text) {
      const el = textarea.current;
      if (!el) return;
      const start = el.selectionStart ?? value.length;
      const end = el.selectionEnd ?? start;
      onChange(value.slice(0, start) + text + value.slice(end));
      // After React writes the new value, put the cursor after what was inserted.
      requestAnimationFrame(() => {
        el.focus();
        el.setSelectionRange(start + text.length, start + text.length);
      });
    },
    goToLine(line) {
      const el = textarea.current;
      if (!el) return;
      const lines = value.split('\n');
      const n = Math.min(Math.max(1, line), lines.length);
      const start = lines.slice(0, n - 1).reduce((sum, l) => sum + l.length + 1, 0);
      el.focus();
      el.setSelectionRange(start, start + lines[n - 1].length);
      el.scrollTop = Math.max(0, (n - 1) * LINE_PX - el.clientHeight / 3);
      el.scrollLeft = 0;
    },
  }));

  return (
    <div>
      <FieldLabel htmlFor={id}>{label}</FieldLabel>
      <div className={cn('flex overflow-hidden rounded-md border bg-white', error ? 'border-rust-600' : 'border-canvas-400', (disabled || readOnly) && 'bg-canvas-50')}>
        <div aria-hidden="true" className="relative w-12 shrink-0 overflow-hidden border-r border-canvas-200 bg-canvas-100 font-mono text-xs text-canvas-600 select-none">
          {/* Absolute, so a long file's numbers never make the box taller than the textarea. */}
          <div className="absolute inset-x-0 top-0" style={{ transform: `translateY(${PAD_PX - scrollTop}px)` }}>
            {Array.from({ length: lineCount }, (_, i) => (
              <div key={i} style={{ height: LINE_PX, lineHeight: `${LINE_PX}px` }} className={cn('pr-2 text-right', problemLines?.has(i + 1) && 'bg-rust-600 font-bold text-white')}>
                {i + 1}
              </div>
            ))}
          </div>
        </div>
        <div className="relative min-w-0 flex-1">
          <div aria-hidden="true" className="pointer-events-none absolute inset-0 overflow-hidden">
            {marked.map((line) => (
              <div key={line} className="absolute inset-x-0 bg-rust-100" style={{ top: PAD_PX + (line - 1) * LINE_PX - scrollTop, height: LINE_PX }} />
            ))}
          </div>
          <textarea
            ref={textarea}
            id={id}
            name={name}
            rows={rows}
            wrap="off"
            spellCheck={false}
            autoCapitalize="off"
            autoCorrect="off"
            value={value}
            readOnly={readOnly}
            disabled={disabled}
            onChange={(e) => onChange(e.target.value)}
            onScroll={(e) => setScrollTop(e.currentTarget.scrollTop)}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy(hint ? hintId : undefined, error ? errorId : undefined)}
            style={{ lineHeight: `${LINE_PX}px`, paddingTop: PAD_PX, paddingBottom: PAD_PX }}
            className="relative block w-full resize-y bg-transparent px-3 font-mono text-sm whitespace-pre text-canvas-900 focus:outline-none focus-visible:outline-3 focus-visible:outline-offset-0 focus-visible:outline-[#b5651d]"
          />
        </div>
      </div>
      <FieldHint id={hintId}>{hint}</FieldHint>
      <FieldError id={errorId}>{error}</FieldError>
    </div>
  );
}

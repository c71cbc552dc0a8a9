import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';

/** Copies a text to the clipboard and says so for a moment; the accessible name says what is copied. */
export function CopyButton({ text, label }: { text: string; label: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  useEffect(() => {
    if (state === 'idle') return;
    const timer = setTimeout(() => setState('idle'), 2500);
    return () => clearTimeout(timer);
  }, [state]);

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setState('copied');
    } catch {
      // Without clipboard access (an insecure origin, a refused permission) the person copies it by hand.
      setState('failed');
    }
  };

  return (
    <span className="inline-flex items-center gap-2">
      <Button size="sm" variant="ghost" className="min-h-7 px-2 text-xs" aria-label={label} onClick={() => void copy()}>
        Copy
      </Button>
      <span aria-live="polite" className="text-xs text-canvas-700">
        {state === 'copied' ? 'Copied' : state === 'failed' ? `Could not copy; the full value is ${text}` : ''}
      </span>
    </span>
  );
}

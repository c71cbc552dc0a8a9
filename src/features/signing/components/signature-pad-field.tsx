import { useEffect, useId, useRef, type MutableRefObject } from 'react';
import SignaturePad, { type PointGroup } from 'signature_pad';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field';
import { cn } from '@/lib/cn';

/** The pen's ink: the same blue the signed PDF writes typed signatures and initials in. */
export const SIGNATURE_INK = '#1c3f7a';

export interface SignaturePadHandle {
  isEmpty: () => boolean;
  toPng: () => string;
}

interface SignaturePadFieldProps {
  /** The strokes so far, kept by the parent so they survive going back a step. */
  strokes: PointGroup[];
  onStrokesChange: (strokes: PointGroup[]) => void;
  handleRef: MutableRefObject<SignaturePadHandle | null>;
  error?: string;
  disabled?: boolean;
}

/**
 * A drawing pad on a canvas sized for the device's pixel ratio, so strokes stay sharp on a phone.
 * On a size change (rotating the phone) the canvas is sized again and the strokes redrawn.
 */
export function SignaturePadField({ strokes, onStrokesChange, handleRef, error, disabled }: SignaturePadFieldProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const padRef = useRef<SignaturePad | null>(null);
  const strokesRef = useRef(strokes);
  strokesRef.current = strokes;
  const changeRef = useRef(onStrokesChange);
  changeRef.current = onStrokesChange;
  const hintId = useId();
  const errorId = useId();

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const pad = new SignaturePad(canvas, { penColor: SIGNATURE_INK, minWidth: 0.8, maxWidth: 2.6 });
    padRef.current = pad;

    let width = 0;
    const fit = () => {
      const ratio = Math.max(window.devicePixelRatio || 1, 1);
      const rect = canvas.getBoundingClientRect();
      if (rect.width === 0 || Math.round(rect.width) === width) return;
      width = Math.round(rect.width);
      canvas.width = Math.round(rect.width * ratio);
      canvas.height = Math.round(rect.height * ratio);
      canvas.getContext('2d')?.scale(ratio, ratio);
      // Sizing a canvas wipes it: draw the kept strokes again (points are in CSS pixels).
      pad.clear();
      if (strokesRef.current.length > 0) pad.fromData(strokesRef.current);
    };
    fit();
    const observer = new ResizeObserver(fit);
    observer.observe(canvas);

    const onEnd = () => changeRef.current(pad.toData());
    pad.addEventListener('endStroke', onEnd);
    handleRef.current = { isEmpty: () => pad.isEmpty(), toPng: () => pad.toDataURL('image/png') };

    return () => {
      observer.disconnect();
      pad.removeEventListener('endStroke', onEnd);
      pad.off();
      padRef.current = null;
      handleRef.current = null;
    };
  }, [handleRef]);

  useEffect(() => {
    const pad = padRef.current;
    if (!pad) return;
    if (disabled) pad.off();
    else pad.on();
  }, [disabled]);

  const clear = () => {
    padRef.current?.clear();
    onStrokesChange([]);
  };

  return (
    <div>
      <p id={hintId} className="mb-1 text-sm font-semibold text-canvas-800">
        Draw your signature in the box with your finger, a stylus or the mouse.
      </p>
      <div className={cn('relative rounded-md border-2 bg-white', error ? 'border-rust-600' : 'border-canvas-400')}>
        <canvas
          ref={canvasRef}
          role="img"
          aria-label="Signature drawing pad"
          aria-describedby={error ? `${hintId} ${errorId}` : hintId}
          className="block h-44 w-full touch-none rounded-md sm:h-48"
        />
        {/* The line people sign on, drawn in CSS so it never ends up in the image. */}
        <div aria-hidden="true" className="pointer-events-none absolute right-4 bottom-10 left-4 flex items-end gap-1 border-b border-canvas-400 text-canvas-500">
          <span className="-mb-1 text-lg leading-none">×</span>
        </div>
      </div>
      <FieldError id={errorId}>{error}</FieldError>
      <div className="mt-2">
        <Button size="sm" variant="secondary" onClick={clear} disabled={disabled} className="min-h-10">
          Clear
        </Button>
      </div>
    </div>
  );
}

import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button, type ButtonVariant } from './button';
import { keepFocusInDialog } from './dialog';

interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children?: ReactNode;
  confirmLabel: string;
  confirmVariant?: ButtonVariant;
  isLoading?: boolean;
  error?: string | null;
  onConfirm: () => void;
  onCancel: () => void;
}

/** A modal question on the native <dialog>: focus is trapped (keepFocusInDialog) and Escape cancels. */
export function ConfirmDialog({ open, title, children, confirmLabel, confirmVariant = 'primary', isLoading, error, onConfirm, onCancel }: ConfirmDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const bodyId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={children ? bodyId : undefined}
      onKeyDown={keepFocusInDialog}
      onCancel={(event) => {
        event.preventDefault();
        if (!isLoading) onCancel();
      }}
      className="m-auto w-[min(28rem,calc(100vw-2rem))] rounded-lg border border-canvas-200 bg-white p-6 text-canvas-900 shadow-xl backdrop:bg-canvas-900/40"
    >
      <h2 id={titleId} className="text-lg font-semibold">
        {title}
      </h2>
      {children ? (
        <div id={bodyId} className="mt-2 text-canvas-700">
          {children}
        </div>
      ) : null}
      {error ? (
        <p role="alert" className="mt-3 text-sm font-semibold text-rust-700">
          {error}
        </p>
      ) : null}
      <div className="mt-6 flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={isLoading}>
          Cancel
        </Button>
        <Button variant={confirmVariant} onClick={onConfirm} isLoading={isLoading}>
          {confirmLabel}
        </Button>
      </div>
    </dialog>
  );
}

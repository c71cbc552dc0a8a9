import { useEffect, useId, useRef, type ReactNode } from 'react';
import { createPortal } from 'react-dom';

interface DialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  /** The buttons; the dialog does not add its own. */
  footer?: ReactNode;
  onClose: () => void;
  /** While true, Escape does not close it (a request is running). */
  busy?: boolean;
  wide?: boolean;
}

/**
 * A modal on the native <dialog>: focus is trapped and Escape closes it. It is put at the end of
 * <body>, so a form inside it never sits inside the page's own form.
 */
export function Dialog({ open, title, children, footer, onClose, busy, wide }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return createPortal(
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        if (!busy) onClose();
      }}
      className={`m-auto max-h-[calc(100dvh-2rem)] ${wide ? 'w-[min(44rem,calc(100vw-2rem))]' : 'w-[min(28rem,calc(100vw-2rem))]'} overflow-y-auto rounded-lg border border-canvas-200 bg-white p-6 text-canvas-900 shadow-xl backdrop:bg-canvas-900/40`}
    >
      <h2 id={titleId} className="text-lg font-semibold">
        {title}
      </h2>
      {open ? <div className="mt-3 text-canvas-800">{children}</div> : null}
      {footer ? <div className="mt-6 flex flex-wrap justify-end gap-2">{footer}</div> : null}
    </dialog>,
    document.body,
  );
}

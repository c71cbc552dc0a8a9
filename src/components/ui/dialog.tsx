import { useEffect, useId, useRef, type KeyboardEvent, type ReactNode } from 'react';
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

const TABBABLE = 'a[href], button, input, select, textarea, summary, iframe, [tabindex]';

/**
 * Tab from the dialog's last control goes back to its first, and Shift+Tab from the first to the
 * last. The native modal <dialog> makes the page behind it inert but lets the focus step out to
 * the browser's own toolbar once a round; keyboard users expect it to stay in the dialog.
 */
export function keepFocusInDialog(event: KeyboardEvent<HTMLDialogElement>) {
  if (event.key !== 'Tab' || event.altKey || event.ctrlKey || event.metaKey) return;
  const dialog = event.currentTarget;
  const controls = [...dialog.querySelectorAll<HTMLElement>(TABBABLE)].filter(
    (el) => el.tabIndex >= 0 && !(el as HTMLButtonElement).disabled && el.getClientRects().length > 0 && !el.closest('[inert]'),
  );
  if (controls.length === 0) return;
  const first = controls[0];
  const last = controls[controls.length - 1];
  const active = document.activeElement;
  if (event.shiftKey && (active === first || active === dialog)) {
    event.preventDefault();
    last.focus();
  } else if (!event.shiftKey && active === last) {
    event.preventDefault();
    first.focus();
  }
}

/**
 * A modal on the native <dialog>: focus is trapped (keepFocusInDialog) and Escape closes it; on
 * closing, the browser puts the focus back on what opened it. It is put at the end of
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
      onKeyDown={keepFocusInDialog}
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

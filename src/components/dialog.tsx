import { useEffect, useId, useRef, type ReactNode } from 'react';

export interface DialogProps {
  /** Open when true; the parent owns this state. */
  open: boolean;
  /** Called on Escape, the close button, or a click on the backdrop. */
  onClose: () => void;
  title: string;
  children?: ReactNode;
  /** Buttons at the bottom (e.g. Cancel + the action). */
  footer?: ReactNode;
  /** 'center' = modal dialog; 'right' = a drawer sliding from the right (detail panes). */
  placement?: 'center' | 'right';
}

/**
 * A modal dialog or drawer on the native <dialog> element: focus is trapped and
 * restored by the browser, Escape closes, the title names it.
 */
export function Dialog({ open, onClose, title, children, footer, placement = 'center' }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      if (typeof dialog.showModal === 'function') dialog.showModal();
      else dialog.setAttribute('open', '');
    } else if (!open && dialog.open) {
      if (typeof dialog.close === 'function') dialog.close();
      else dialog.removeAttribute('open');
    }
  }, [open]);
  const frame =
    placement === 'right'
      ? 'm-0 ml-auto h-dvh max-h-dvh w-full max-w-xl rounded-none border-l'
      : 'm-auto w-full max-w-lg rounded-lg border';
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      onClick={(event) => {
        if (event.target === ref.current) onClose();
      }}
      className={`${frame} border-rule bg-surface p-0 text-ink shadow-xl backdrop:bg-ink/35`}
    >
      {open ? (
        <div className="flex h-full flex-col">
          <header className="flex items-center justify-between gap-4 border-b border-rule px-5 py-3">
            <h2 id={titleId} className="text-lg font-semibold">
              {title}
            </h2>
            <button
              type="button"
              onClick={onClose}
              className="rounded-md px-2 py-1 text-ink-muted hover:bg-paper-deep focus-visible:outline-2 focus-visible:outline-focus"
              aria-label="Close"
            >
              ✕
            </button>
          </header>
          <div className="flex-1 overflow-auto px-5 py-4">{children}</div>
          {footer ? <footer className="flex justify-end gap-2 border-t border-rule px-5 py-3">{footer}</footer> : null}
        </div>
      ) : null}
    </dialog>
  );
}

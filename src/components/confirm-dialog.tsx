import { useEffect, useId, useState, type ReactNode } from 'react';
import { ErrorAlert } from './alert';
import { Button, type ButtonVariant } from './button';
import { controlClasses } from './field';

export interface ConfirmDialogProps {
  open: boolean;
  /** What is about to happen, as a question or a plain title ("Publish No. 41?"). */
  title: string;
  /** What will happen, in words (who is mailed, what becomes payable, what cannot be undone). */
  children?: ReactNode;
  /** The button that does it, named after the action ("Publish No. 41"). */
  confirmLabel: string;
  confirmVariant?: ButtonVariant;
  busy?: boolean;
  /** The action's error, shown inside the dialog. */
  error?: unknown;
  /** Ask for a reason (recorded with the action): its label; the action is disabled until 5 characters are given. */
  reasonLabel?: string | undefined;
  /** Disables the action with this explanation (e.g. only an admin may). */
  blockedBecause?: string | undefined;
  onConfirm: (reason: string | undefined) => void;
  onCancel: () => void;
}

/**
 * Confirmation of an irreversible or consequential step. A modal on the native <dialog>
 * (focus trapped, Escape cancels); the action button says what it does, and the body says
 * what will happen. With `reasonLabel` it also asks why (e.g. an override of a guard).
 */
export function ConfirmDialog(props: ConfirmDialogProps) {
  const { open, busy = false, onCancel } = props;
  const titleId = useId();
  const [dialog, setDialog] = useState<HTMLDialogElement | null>(null);
  useEffect(() => {
    if (!dialog) return;
    if (open && !dialog.open) {
      if (typeof dialog.showModal === 'function') dialog.showModal();
      else dialog.setAttribute('open', '');
    } else if (!open && dialog.open) {
      if (typeof dialog.close === 'function') dialog.close();
      else dialog.removeAttribute('open');
    }
  }, [open, dialog]);
  return (
    <dialog
      ref={setDialog}
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onCancel();
      }}
      className="m-auto w-full max-w-lg rounded-lg border border-rule bg-surface p-0 text-ink shadow-xl backdrop:bg-ink/35"
    >
      {open ? <ConfirmForm {...props} titleId={titleId} /> : null}
    </dialog>
  );
}

/** The dialog's content, mounted while it is open (so the reason starts empty every time). */
function ConfirmForm({ title, titleId, children, confirmLabel, confirmVariant = 'primary', busy = false, error, reasonLabel, blockedBecause, onConfirm, onCancel }: ConfirmDialogProps & { titleId: string }) {
  const [reason, setReason] = useState('');
  const reasonId = useId();
  const needsReason = reasonLabel !== undefined;
  const reasonOk = !needsReason || reason.trim().length >= 5;
  return (
        <form
          method="dialog"
          className="flex flex-col"
          onSubmit={(e) => {
            e.preventDefault();
            if (reasonOk && !blockedBecause) onConfirm(needsReason ? reason.trim() : undefined);
          }}
        >
          <header className="border-b border-rule px-5 py-3">
            <h2 id={titleId} className="text-lg font-semibold">
              {title}
            </h2>
          </header>
          <div className="flex flex-col gap-3 px-5 py-4 text-sm">
            {children}
            {needsReason ? (
              <div className="flex flex-col gap-1">
                <label htmlFor={reasonId} className="font-semibold">
                  {reasonLabel}
                </label>
                <textarea id={reasonId} className={`${controlClasses} h-auto py-2`} rows={3} value={reason} onChange={(e) => setReason(e.target.value)} required minLength={5} />
                <p className="text-ink-muted">Recorded with the edition, with your name and the time.</p>
              </div>
            ) : null}
            {blockedBecause ? <p className="font-medium text-danger">{blockedBecause}</p> : null}
            <ErrorAlert error={error} title="Not done" />
          </div>
          <footer className="flex justify-end gap-2 border-t border-rule px-5 py-3">
            <Button onClick={onCancel} disabled={busy}>
              Cancel
            </Button>
            <Button type="submit" variant={confirmVariant} busy={busy} disabled={!reasonOk || Boolean(blockedBecause)}>
              {confirmLabel}
            </Button>
          </footer>
        </form>
  );
}

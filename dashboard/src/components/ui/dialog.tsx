import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from './button';
import { ErrorState } from './states';

/**
 * A modal dialog on the native <dialog> element: the browser traps focus, Escape closes it, and focus
 * returns to the opener when it closes.
 */
export function Dialog({
  open,
  onClose,
  title,
  children,
  footer,
  size = 'md',
}: {
  open: boolean;
  onClose: () => void;
  title: string;
  children: ReactNode;
  footer?: ReactNode;
  /** md for confirmations and short forms, lg for forms with columns. */
  size?: 'md' | 'lg';
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
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
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className={`m-auto ${size === 'lg' ? 'w-[min(48rem,calc(100vw-2rem))]' : 'w-[min(32rem,calc(100vw-2rem))]'} rounded-xl border border-ink-100 bg-white p-0 text-ink-950 shadow-2xl backdrop:bg-ink-950/50`}
    >
      {open ? (
        <div className="space-y-4 p-6">
          <h2 id={titleId} className="text-lg font-semibold text-ink-900">
            {title}
          </h2>
          <div className="space-y-3 text-sm text-ink-800">{children}</div>
          {footer ? <div className="flex justify-end gap-2 pt-2">{footer}</div> : null}
        </div>
      ) : null}
    </dialog>
  );
}

/** Asks before something that cannot be undone (delete, revoke, deactivate). */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  busy = false,
  onConfirm,
  onCancel,
}: {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}) {
  return (
    <Dialog
      open={open}
      onClose={onCancel}
      title={title}
      footer={
        <>
          <Button variant="secondary" onClick={onCancel} autoFocus>
            Cancel
          </Button>
          <Button variant="danger" onClick={onConfirm} disabled={busy}>
            {busy ? 'Working…' : confirmLabel}
          </Button>
        </>
      }
    >
      {children}
    </Dialog>
  );
}

/**
 * The end of a form in a dialog: the mutation's error when it failed, Cancel, and the submit button
 * (disabled while the mutation runs or when `canSubmit` is false, with `pendingLabel` meanwhile).
 */
export function FormFooter({
  mutation,
  onCancel,
  submitLabel,
  pendingLabel = 'Saving…',
  canSubmit = true,
}: {
  mutation: { isPending: boolean; isError: boolean; error: unknown };
  onCancel: () => void;
  submitLabel: string;
  pendingLabel?: string;
  canSubmit?: boolean;
}) {
  return (
    <>
      {mutation.isError ? <ErrorState error={mutation.error} /> : null}
      <div className="flex justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" disabled={mutation.isPending || !canSubmit}>
          {mutation.isPending ? pendingLabel : submitLabel}
        </Button>
      </div>
    </>
  );
}

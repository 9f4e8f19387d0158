import { useEffect, useId, useRef, type ReactNode } from 'react';
import { createPortal } from 'react-dom';
import { Button } from './Button';
import { FormError } from './FormError';

interface ConfirmDialogProps {
  open: boolean;
  title: ReactNode;
  /** What will happen, in words (who loses what). */
  children?: ReactNode;
  /** The verb on the confirm button: "Remove Ana", "Revoke invitation". */
  confirmLabel: string;
  cancelLabel?: string;
  /** `danger` for anything that cannot be undone. */
  tone?: 'danger' | 'primary';
  busy?: boolean;
  /** Shown inside the dialog when the action failed. */
  error?: unknown;
  onConfirm: () => void;
  onCancel: () => void;
}

/**
 * A modal question before an action that cannot be undone. Focus goes to
 * Cancel (the safe choice); Escape and the backdrop cancel; Tab stays inside.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  cancelLabel = 'Cancel',
  tone = 'danger',
  busy = false,
  error,
  onConfirm,
  onCancel,
}: ConfirmDialogProps) {
  const titleId = useId();
  const bodyId = useId();
  const boxRef = useRef<HTMLDivElement>(null);
  const cancelRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    const previous = document.activeElement as HTMLElement | null;
    cancelRef.current?.focus();
    return () => previous?.focus?.();
  }, [open]);

  if (!open) return null;

  const onKeyDown = (event: React.KeyboardEvent) => {
    if (event.key === 'Escape' && !busy) {
      event.stopPropagation();
      onCancel();
    }
    if (event.key === 'Tab' && boxRef.current) {
      const focusables = boxRef.current.querySelectorAll<HTMLElement>('button:not([disabled]), [href], input, select, textarea');
      if (focusables.length === 0) return;
      const first = focusables[0];
      const last = focusables[focusables.length - 1];
      if (event.shiftKey && document.activeElement === first) {
        event.preventDefault();
        last.focus();
      } else if (!event.shiftKey && document.activeElement === last) {
        event.preventDefault();
        first.focus();
      }
    }
  };

  return createPortal(
    <div className="fixed inset-0 z-50 flex items-end justify-center bg-scrim p-3 sm:items-center" onMouseDown={() => !busy && onCancel()}>
      <div
        ref={boxRef}
        role="alertdialog"
        aria-modal="true"
        aria-labelledby={titleId}
        aria-describedby={children ? bodyId : undefined}
        className="w-full max-w-md rounded-panel border border-line bg-surface p-5 text-ink shadow-xl"
        onMouseDown={(e) => e.stopPropagation()}
        onKeyDown={onKeyDown}
      >
        <h2 id={titleId} className="text-xl font-bold">
          {title}
        </h2>
        {children ? (
          <div id={bodyId} className="mt-2 text-ink">
            {children}
          </div>
        ) : null}
        {error ? (
          <div className="mt-3">
            <FormError error={error} />
          </div>
        ) : null}
        <div className="mt-5 flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button ref={cancelRef} onClick={onCancel} disabled={busy}>
            {cancelLabel}
          </Button>
          <Button tone={tone} onClick={onConfirm} busy={busy}>
            {confirmLabel}
          </Button>
        </div>
      </div>
    </div>,
    document.body,
  );
}

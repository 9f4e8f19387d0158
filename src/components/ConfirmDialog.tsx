import { useRef, type ReactNode } from 'react';
import { Button } from './Button';
import { FormError } from './FormError';
import { Modal } from './Modal';

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
  const cancelRef = useRef<HTMLButtonElement>(null);
  return (
    <Modal
      open={open}
      role="alertdialog"
      title={title}
      onClose={onCancel}
      busy={busy}
      initialFocus={cancelRef}
      footer={
        <>
          <Button ref={cancelRef} onClick={onCancel} disabled={busy}>
            {cancelLabel}
          </Button>
          <Button tone={tone} onClick={onConfirm} busy={busy}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      {children}
      {error ? (
        <div className="mt-3">
          <FormError error={error} />
        </div>
      ) : null}
    </Modal>
  );
}

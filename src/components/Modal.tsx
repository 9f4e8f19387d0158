import { useEffect, useId, useRef, type ReactNode, type RefObject } from 'react';
import { createPortal } from 'react-dom';
import { cx } from '@/lib/cx';

interface ModalProps {
  open: boolean;
  title: ReactNode;
  children?: ReactNode;
  /** Buttons at the bottom; on phones they stack, the last one on top. */
  footer?: ReactNode;
  /** Escape, the backdrop and the close button call it. Not called while `busy`. */
  onClose: () => void;
  busy?: boolean;
  /** Element to focus on open; otherwise the first focusable element inside. */
  initialFocus?: RefObject<HTMLElement | null>;
  /** `alertdialog` for questions that need an answer (ConfirmDialog uses it). */
  role?: 'dialog' | 'alertdialog';
  size?: 'sm' | 'md' | 'lg';
}

const widths = { sm: 'max-w-md', md: 'max-w-xl', lg: 'max-w-3xl' } as const;

/**
 * A modal box over the page: focus moves in and back out, Tab stays inside,
 * Escape and the backdrop close it. On phones it sits at the bottom, in thumb reach.
 */
export function Modal({ open, title, children, footer, onClose, busy = false, initialFocus, role = 'dialog', size = 'sm' }: ModalProps) {
  const titleId = useId();
  const boxRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const previous = document.activeElement as HTMLElement | null;
    const target =
      initialFocus?.current ?? boxRef.current?.querySelector<HTMLElement>('input, select, textarea, button:not([disabled]), [href]');
    target?.focus();
    return () => previous?.focus?.();
  }, [open, initialFocus]);

  if (!open) return null;

  const onKeyDown = (event: React.KeyboardEvent) => {
    if (event.key === 'Escape' && !busy) {
      event.stopPropagation();
      onClose();
    }
    if (event.key === 'Tab' && boxRef.current) {
      const focusables = boxRef.current.querySelectorAll<HTMLElement>('button:not([disabled]), [href], input:not([disabled]), select, textarea');
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
    <div className="fixed inset-0 z-50 flex items-end justify-center bg-scrim p-3 sm:items-center" onMouseDown={() => !busy && onClose()}>
      <div
        ref={boxRef}
        role={role}
        aria-modal="true"
        aria-labelledby={titleId}
        className={cx('max-h-[90dvh] w-full overflow-y-auto rounded-panel border border-line bg-surface p-5 text-ink shadow-xl', widths[size])}
        onMouseDown={(e) => e.stopPropagation()}
        onKeyDown={onKeyDown}
      >
        <h2 id={titleId} className="text-xl font-bold">
          {title}
        </h2>
        {children ? <div className="mt-2">{children}</div> : null}
        {footer ? <div className="mt-5 flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">{footer}</div> : null}
      </div>
    </div>,
    document.body,
  );
}

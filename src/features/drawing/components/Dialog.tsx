import { useEffect, useId, useRef, type ReactNode } from 'react';
import { createPortal } from 'react-dom';

/** A modal panel with a title; focus moves into it and Escape calls onClose. */
export function Dialog({ title, children, onClose }: { title: ReactNode; children: ReactNode; onClose: () => void }) {
  const id = useId();
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = ref.current;
    el?.querySelector<HTMLElement>('button, textarea, input, select')?.focus();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') onClose();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [onClose]);
  return createPortal(
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-scrim p-4">
      <div ref={ref} role="dialog" aria-modal="true" aria-labelledby={id} className="w-full max-w-lg rounded-panel border border-line bg-surface p-5 text-ink shadow-xl">
        <h2 id={id} className="mb-3 text-xl font-bold">
          {title}
        </h2>
        {children}
      </div>
    </div>,
    document.body,
  );
}

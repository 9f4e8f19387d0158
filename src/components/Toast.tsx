import { createContext, useCallback, useContext, useMemo, useRef, useState, type ReactNode } from 'react';
import { cx } from '@/lib/cx';

export type NoticeTone = 'ok' | 'bad' | 'info';

export interface Notice {
  id: number;
  tone: NoticeTone;
  text: string;
}

interface ToastApi {
  /** Shows a short notice at the bottom of the screen; `ok` and `info` leave by themselves after 6 s, `bad` stays until dismissed. */
  notify: (text: string, tone?: NoticeTone) => void;
}

const ToastContext = createContext<ToastApi | null>(null);

const marks: Record<NoticeTone, string> = { ok: '✓', bad: '✗', info: 'i' };
const toneClass: Record<NoticeTone, string> = {
  ok: 'border-ok text-ok',
  bad: 'border-bad text-bad',
  info: 'border-field text-ink',
};

/** Holds the notice area; put it once near the root (src/app/providers.tsx does). */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [notices, setNotices] = useState<Notice[]>([]);
  const next = useRef(1);

  const dismiss = useCallback((id: number) => setNotices((list) => list.filter((n) => n.id !== id)), []);
  const notify = useCallback(
    (text: string, tone: NoticeTone = 'ok') => {
      const id = next.current++;
      setNotices((list) => [...list.slice(-3), { id, tone, text }]);
      if (tone !== 'bad') setTimeout(() => dismiss(id), 6000);
    },
    [dismiss],
  );
  const value = useMemo(() => ({ notify }), [notify]);

  return (
    <ToastContext.Provider value={value}>
      {children}
      <div
        aria-live="polite"
        role="status"
        className="no-print pointer-events-none fixed inset-x-0 bottom-0 z-40 flex flex-col items-center gap-2 p-3"
      >
        {notices.map((n) => (
          <div
            key={n.id}
            className={cx(
              'pointer-events-auto flex w-full max-w-md items-start gap-3 rounded-panel border-2 bg-surface px-4 py-3 shadow-lg',
              toneClass[n.tone],
            )}
          >
            <span aria-hidden="true" className="font-bold">
              {marks[n.tone]}
            </span>
            <p className="flex-1 text-ink">{n.text}</p>
            <button
              type="button"
              onClick={() => dismiss(n.id)}
              className="touch -my-2 -mr-2 rounded-control text-ink-muted hover:bg-sunken"
              aria-label="Dismiss notice"
            >
              ×
            </button>
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}

/** `const { notify } = useToast(); notify('Invitation sent to ana@shop.com')`. */
export function useToast(): ToastApi {
  const ctx = useContext(ToastContext);
  if (!ctx) throw new Error('useToast needs <ToastProvider> above it');
  return ctx;
}

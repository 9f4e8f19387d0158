/**
 * The drawing editor's frame on a narrow screen (a phone at the machine): one
 * toolbar row whose less used tools fold into a panel, the drawing over all
 * the rest, a bar at the bottom within reach of the thumb, and the add list
 * and side panel as sheets over the lower part of the drawing.
 */
import { useEffect, useId, useRef, useState, type ReactNode, type RefObject } from 'react';
import { cx } from '@/lib/cx';

const iconButton =
  'inline-flex size-11 shrink-0 items-center justify-center rounded-control border text-ink hover:bg-sunken disabled:cursor-not-allowed disabled:opacity-40';

function Icon({ d }: { d: string }) {
  return (
    <svg viewBox="0 0 24 24" className="size-6" aria-hidden="true">
      <path d={d} fill="none" stroke="currentColor" strokeWidth="2.25" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

const dialogOpen = () => !!document.querySelector('[role="dialog"]');

/** One row: the name (and the save state under it), undo, redo, and the rest of the tools behind one button. */
export function CompactToolbar({ title, subtitle, status, canUndo, canRedo, onUndo, onRedo, tools }: {
  title: string;
  subtitle: string;
  status: ReactNode;
  canUndo: boolean;
  canRedo: boolean;
  onUndo: () => void;
  onRedo: () => void;
  /** The folded tools: pressing any of their buttons folds them again. */
  tools: ReactNode;
}) {
  const [open, setOpen] = useState(false);
  const id = useId();
  const button = useRef<HTMLButtonElement>(null);
  const panel = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    panel.current?.querySelector<HTMLElement>('button, select')?.focus();
    // Escape folds the tools before it closes any sheet (capture, then no one else hears it).
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape' || dialogOpen()) return;
      e.stopPropagation();
      setOpen(false);
      button.current?.focus();
    };
    const onDown = (e: PointerEvent) => {
      const t = e.target as Node;
      if (!panel.current?.contains(t) && !button.current?.contains(t)) setOpen(false);
    };
    window.addEventListener('keydown', onKey, true);
    window.addEventListener('pointerdown', onDown, true);
    return () => {
      window.removeEventListener('keydown', onKey, true);
      window.removeEventListener('pointerdown', onDown, true);
    };
  }, [open]);
  return (
    <div className="relative flex items-center gap-1 border-b border-line bg-surface py-1 pr-1 pl-3" role="toolbar" aria-label="Drawing tools">
      <div className="min-w-0 flex-1">
        <h1 className="truncate text-base leading-tight font-bold">
          {title} <span className="sr-only">{subtitle}</span>
        </h1>
        <div className="flex min-w-0 items-center gap-1 text-xs text-ink-muted">
          <span aria-hidden="true" className="shrink-0">
            {subtitle} ·
          </span>
          {status}
        </div>
      </div>
      <button type="button" className={cx(iconButton, 'border-transparent')} onClick={onUndo} disabled={!canUndo} aria-label="Undo" title="Undo">
        <Icon d="M9 14 4 9l5-5M4 9h10.5a5.5 5.5 0 0 1 0 11H11" />
      </button>
      <button type="button" className={cx(iconButton, 'border-transparent')} onClick={onRedo} disabled={!canRedo} aria-label="Redo" title="Redo">
        <Icon d="m15 14 5-5-5-5M20 9H9.5a5.5 5.5 0 0 0 0 11H13" />
      </button>
      <button
        ref={button}
        type="button"
        className={cx(iconButton, 'w-auto gap-1 border-field px-2 font-medium', open && 'bg-accent-soft')}
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
      >
        <Icon d="M5 12h.01M12 12h.01M19 12h.01" />
        Tools
      </button>
      {open ? (
        <div
          ref={panel}
          id={id}
          role="group"
          aria-label="More drawing tools"
          className="absolute top-full right-1 z-40 mt-1 flex w-[min(20rem,calc(100vw-1rem))] flex-col gap-2 rounded-panel border border-line bg-surface p-3 shadow-xl"
          onClick={(e) => {
            // After the button's own action: fold, focus back on Tools (a dialog it opened takes focus after).
            if ((e.target as Element).closest('button')) {
              setOpen(false);
              button.current?.focus();
            }
          }}
        >
          {tools}
        </div>
      ) : null}
    </div>
  );
}

/** The bar under the drawing: the add list and the side panel, each a sheet. */
export function CompactBar({ sheet, onAdd, onPanel, addRef, panelRef, panelControls, problems }: {
  sheet: 'add' | 'panel' | null;
  onAdd: () => void;
  onPanel: () => void;
  addRef: RefObject<HTMLButtonElement | null>;
  panelRef: RefObject<HTMLButtonElement | null>;
  panelControls: string;
  problems: number;
}) {
  const tab = (on: boolean) =>
    cx('flex min-h-12 flex-1 items-center justify-center gap-2 rounded-control px-3 font-medium', on ? 'bg-accent-soft text-accent' : 'text-ink hover:bg-sunken');
  return (
    <div className="flex shrink-0 gap-2 border-t border-line bg-surface p-1">
      <button ref={addRef} type="button" className={tab(sheet === 'add')} aria-expanded={sheet === 'add'} aria-controls="ww-add-sheet" onClick={onAdd}>
        <Icon d="M12 5v14M5 12h14" />
        Add
      </button>
      <button ref={panelRef} type="button" className={tab(sheet === 'panel')} aria-expanded={sheet === 'panel'} aria-controls={panelControls} onClick={onPanel}>
        <Icon d="M4 6h16M4 12h16M4 18h10" />
        Panel
        {problems ? <span className="text-bad">· ✗ {problems}</span> : null}
      </button>
    </div>
  );
}

/** The header of a sheet: what is in it (tabs or a title) and a close button. */
export function SheetHeader({ children, onClose, closeLabel }: { children: ReactNode; onClose: () => void; closeLabel: string }) {
  return (
    <div className="flex shrink-0 items-center gap-1 border-b border-line pr-1">
      <div className="min-w-0 flex-1">{children}</div>
      <button type="button" className={cx(iconButton, 'border-transparent')} onClick={onClose} aria-label={closeLabel} title={closeLabel}>
        <Icon d="M6 6l12 12M18 6 6 18" />
      </button>
    </div>
  );
}

/** A sheet over the lower part of the drawing (not modal: the drawing above stays in use). */
export const sheetClass = 'absolute inset-x-0 bottom-0 z-30 flex h-[min(60%,30rem)] flex-col rounded-t-panel border-t border-line bg-surface shadow-[0_-6px_20px_rgb(0_0_0/0.18)]';

/** Escape closes the open sheet (unless a dialog is open, which has its own). */
export function useEscape(active: boolean, onEscape: () => void) {
  const latest = useRef(onEscape);
  useEffect(() => {
    latest.current = onEscape;
  });
  useEffect(() => {
    if (!active) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape' && !dialogOpen()) latest.current();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [active]);
}

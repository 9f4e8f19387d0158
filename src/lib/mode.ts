/**
 * Display mode: "bench" (light, for the office and the report) or "bay"
 * (dark, for an engine bay at dusk). Kept in localStorage under
 * `wirewalk.mode` and applied as `data-mode` on <html>; public/mode.js does
 * the same before the first paint.
 */
import { useCallback, useSyncExternalStore } from 'react';

export type Mode = 'bench' | 'bay';
export const MODE_STORAGE_KEY = 'wirewalk.mode';
export const modeLabels: Record<Mode, string> = { bench: 'Bench (light)', bay: 'Bay (dark)' };

const listeners = new Set<() => void>();

export function readMode(): Mode {
  const attr = document.documentElement.getAttribute('data-mode');
  if (attr === 'bench' || attr === 'bay') return attr;
  try {
    const saved = localStorage.getItem(MODE_STORAGE_KEY);
    if (saved === 'bench' || saved === 'bay') return saved;
  } catch {
    /* storage blocked */
  }
  return 'bench';
}

export function setMode(mode: Mode): void {
  document.documentElement.setAttribute('data-mode', mode);
  try {
    localStorage.setItem(MODE_STORAGE_KEY, mode);
  } catch {
    /* storage blocked: the mode holds for this page only */
  }
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (event: StorageEvent) => {
    if (event.key === MODE_STORAGE_KEY && (event.newValue === 'bench' || event.newValue === 'bay')) {
      document.documentElement.setAttribute('data-mode', event.newValue);
      listener();
    }
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/** The current mode and a setter; every component using it follows changes (also from other tabs). */
export function useMode(): [Mode, (mode: Mode) => void] {
  const mode = useSyncExternalStore(subscribe, readMode, () => 'bench' as Mode);
  const set = useCallback((next: Mode) => setMode(next), []);
  return [mode, set];
}

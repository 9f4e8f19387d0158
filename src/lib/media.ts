import { useSyncExternalStore } from 'react';

/** Whether a CSS media query matches now, re-rendering when that changes (false where matchMedia is missing). */
export function useMediaQuery(query: string): boolean {
  return useSyncExternalStore(
    (onChange) => {
      if (typeof window === 'undefined' || !window.matchMedia) return () => {};
      const list = window.matchMedia(query);
      list.addEventListener?.('change', onChange);
      return () => list.removeEventListener?.('change', onChange);
    },
    () => (typeof window !== 'undefined' && window.matchMedia ? window.matchMedia(query).matches : false),
    () => false,
  );
}

/** Below Tailwind's `lg`: phones and tablets held upright, where the editor's panels become sheets. */
export const COMPACT_SCREEN = '(max-width: 63.99rem)';

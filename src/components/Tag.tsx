import type { ReactNode } from 'react';
import { cx } from '@/lib/cx';

/**
 * A small label for a state in words ("Draft", "Published", "Waiting for parts").
 * Ink only, by design: the word carries the meaning. `strong` fills it for the one
 * state that needs to stand out in a list (e.g. the current revision).
 */
export function Tag({ children, strong = false, className }: { children: ReactNode; strong?: boolean; className?: string }) {
  return (
    <span
      className={cx(
        'inline-flex items-center rounded-control border px-2 py-0.5 text-sm font-medium whitespace-nowrap',
        strong ? 'border-ink bg-ink text-ground' : 'border-field text-ink',
        className,
      )}
    >
      {children}
    </span>
  );
}

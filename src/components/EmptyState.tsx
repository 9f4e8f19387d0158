import type { ReactNode } from 'react';

/** What to show where a list has nothing yet: what would be here, and what to do next. */
export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-panel border border-dashed border-field px-4 py-8 text-center">
      <p className="text-lg font-bold">{title}</p>
      {children ? <div className="mx-auto mt-1 max-w-prose text-ink-muted">{children}</div> : null}
      {action ? <div className="mt-4 flex justify-center">{action}</div> : null}
    </div>
  );
}

import type { HTMLAttributes, ReactNode } from 'react';
import { cx } from '@/lib/cx';

/** A plain surface on the ground: a bordered box for one thing. */
export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cx('rounded-panel border border-line bg-surface p-4', className)} {...rest} />;
}

interface PanelProps {
  /** Heading of the panel; rendered as h2 unless `level` says otherwise. */
  title: ReactNode;
  level?: 2 | 3;
  /** Buttons or links at the right of the heading. */
  actions?: ReactNode;
  description?: ReactNode;
  children?: ReactNode;
  className?: string;
}

/** A titled section on a surface, with optional actions beside the title. */
export function Panel({ title, level = 2, actions, description, children, className }: PanelProps) {
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <section className={cx('rounded-panel border border-line bg-surface', className)}>
      <header className="flex flex-wrap items-center justify-between gap-2 border-b border-line px-4 py-3">
        <div>
          <Heading className="text-lg font-bold">{title}</Heading>
          {description ? <p className="text-sm text-ink-muted">{description}</p> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </header>
      <div className="p-4">{children}</div>
    </section>
  );
}

import { useEffect, useState } from 'react';
import { cx } from '@/lib/cx';

interface ProgressBarProps {
  /** What is going on, in words ("Laying out the drawing"). Always shown. */
  label: string;
  /** 0..1 when the share done is known; leave out for "working, share unknown". */
  value?: number;
  className?: string;
}

/**
 * A progress bar for anything that can take over a second (layout, import,
 * PDF, capture parsing). Determinate when `value` is given.
 */
export function ProgressBar({ label, value, className }: ProgressBarProps) {
  const known = typeof value === 'number' && Number.isFinite(value);
  const share = known ? Math.min(1, Math.max(0, value)) : 0;
  return (
    <div className={cx('w-full', className)}>
      <div className="mb-1 flex justify-between gap-4 text-sm text-ink-muted">
        <span>{label}</span>
        {known ? <span className="tabular">{Math.round(share * 100)} %</span> : null}
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={known ? 0 : undefined}
        aria-valuemax={known ? 100 : undefined}
        aria-valuenow={known ? Math.round(share * 100) : undefined}
        className="relative h-2 w-full overflow-hidden rounded-full bg-sunken"
      >
        {known ? (
          <div className="h-full bg-accent transition-[width] duration-150" style={{ width: `${share * 100}%` }} />
        ) : (
          <div className="ww-indeterminate absolute inset-y-0 w-1/3 bg-accent" />
        )}
      </div>
    </div>
  );
}

/**
 * For a page or panel that is waiting on the server: nothing for the first
 * moment (most answers come quickly), then a progress bar with its label.
 */
export function Loading({ label = 'Loading', delayMs = 250 }: { label?: string; delayMs?: number }) {
  const [shown, setShown] = useState(delayMs <= 0);
  useEffect(() => {
    if (delayMs <= 0) return;
    const timer = setTimeout(() => setShown(true), delayMs);
    return () => clearTimeout(timer);
  }, [delayMs]);
  return (
    <div className="mx-auto w-full max-w-sm py-10" aria-busy="true">
      {shown ? <ProgressBar label={label} /> : <span className="sr-only">{label}</span>}
    </div>
  );
}

import { cx } from '@/lib/cx';

/** A small turning ring for a button or a line of text. Give it a label when it stands alone. */
export function Spinner({ label, className }: { label?: string; className?: string }) {
  return (
    <span role={label ? 'status' : undefined} className={cx('inline-flex items-center gap-2', className)}>
      <svg viewBox="0 0 24 24" className="size-5 animate-spin motion-reduce:animate-none" aria-hidden="true">
        <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
        <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
      </svg>
      {label ? <span>{label}</span> : null}
    </span>
  );
}

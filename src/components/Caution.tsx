import type { ReactNode } from 'react';
import { cx } from '@/lib/cx';
import { cautions, type CautionId, type CautionText } from './cautions';

function WarningSign() {
  return (
    <svg viewBox="0 0 24 24" width="28" height="28" className="size-7 shrink-0" aria-hidden="true">
      <path d="M12 2.5 22.5 21h-21Z" fill="var(--ww-caution-rule)" stroke="#1b1c1e" strokeWidth="1.5" strokeLinejoin="round" />
      <path d="M12 9v6" stroke="#1b1c1e" strokeWidth="2.2" strokeLinecap="round" />
      <circle cx="12" cy="18" r="1.3" fill="#1b1c1e" />
    </svg>
  );
}

type CautionProps = ({ id: CautionId; caution?: never } | { caution: CautionText; id?: never }) & {
  children?: ReactNode;
  className?: string;
  /** A slimmer block for lists of steps. */
  compact?: boolean;
};

/** A safety notice: warning sign, headline in words, and what to do. Never hidden behind a hover. */
export function Caution({ id, caution, children, className, compact = false }: CautionProps) {
  const c = caution ?? cautions[id as CautionId];
  return (
    <aside
      role="note"
      aria-label={`Caution: ${c.title}`}
      className={cx(
        'flex gap-3 rounded-control border-l-8 border-caution-rule bg-caution-soft text-ink',
        compact ? 'px-3 py-2' : 'px-4 py-3',
        className,
      )}
    >
      <WarningSign />
      <div>
        <p className="font-bold text-caution">
          <span className="uppercase">Caution:</span> {c.title}
        </p>
        <p>{c.text}</p>
        {children}
      </div>
    </aside>
  );
}

/** Several cautions one under the other. */
export function CautionList({ ids, className }: { ids: readonly CautionId[]; className?: string }) {
  return (
    <div className={cx('flex flex-col gap-2', className)}>
      {ids.map((id) => (
        <Caution key={id} id={id} compact />
      ))}
    </div>
  );
}

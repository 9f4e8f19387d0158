import { cx } from '@/lib/cx';

/**
 * A reading's mark: tick or cross, the words (OK / OUT, the value, the expected
 * range) and colour last, at reading contrast. `null` = not known yet.
 */
export function Verdict({ inRange, text, className }: { inRange: boolean | null; text: string; className?: string }) {
  return (
    <span
      data-verdict={inRange === null ? 'pending' : inRange ? 'in' : 'out'}
      className={cx(
        'tabular inline-flex items-start gap-1.5 rounded-control border-2 px-2 py-0.5 text-base font-bold',
        inRange === null ? 'border-field text-ink-muted' : inRange ? 'border-ok bg-ok-soft text-ok' : 'border-bad bg-bad-soft text-bad',
        className,
      )}
    >
      <span aria-hidden="true">{inRange === null ? '…' : inRange ? '✓' : '✗'}</span>
      <span>{text}</span>
    </span>
  );
}

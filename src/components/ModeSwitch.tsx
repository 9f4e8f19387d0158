import { useMode, modeLabels, type Mode } from '@/lib/mode';
import { cx } from '@/lib/cx';

const modes: Mode[] = ['bench', 'bay'];

/** Two-way switch between bench (light) and bay (dark) mode; the choice is kept on this device. */
export function ModeSwitch({ className }: { className?: string }) {
  const [mode, setMode] = useMode();
  return (
    <fieldset className={cx('flex flex-col gap-1', className)}>
      <legend className="mb-1 font-medium">Display mode</legend>
      <div className="inline-flex w-fit rounded-control border border-field p-0.5">
        {modes.map((m) => (
          <label
            key={m}
            className={cx(
              'touch flex cursor-pointer items-center rounded-control px-3 has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-focus',
              mode === m ? 'bg-ink text-ground font-bold' : 'text-ink hover:bg-sunken',
            )}
          >
            <input type="radio" name="ww-mode" value={m} checked={mode === m} onChange={() => setMode(m)} className="sr-only" />
            {modeLabels[m]}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

/** A compact button for the header that flips the mode. */
export function ModeToggleButton({ className }: { className?: string }) {
  const [mode, setMode] = useMode();
  const next: Mode = mode === 'bench' ? 'bay' : 'bench';
  return (
    <button
      type="button"
      onClick={() => setMode(next)}
      className={cx('touch inline-flex items-center justify-center gap-1 rounded-control px-2 text-ink hover:bg-sunken', className)}
      aria-label={`Switch to ${modeLabels[next]} mode`}
      title={`Switch to ${modeLabels[next]} mode`}
    >
      <svg viewBox="0 0 24 24" className="size-6" aria-hidden="true">
        {mode === 'bench' ? (
          <path d="M20 14.5A8 8 0 0 1 9.5 4a8 8 0 1 0 10.5 10.5Z" fill="currentColor" />
        ) : (
          <g stroke="currentColor" strokeWidth="2" strokeLinecap="round">
            <circle cx="12" cy="12" r="4" fill="currentColor" />
            <path d="M12 2v2M12 20v2M2 12h2M20 12h2M4.9 4.9l1.4 1.4M17.7 17.7l1.4 1.4M4.9 19.1l1.4-1.4M17.7 6.3l1.4-1.4" />
          </g>
        )}
      </svg>
    </button>
  );
}

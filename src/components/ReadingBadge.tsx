import { cx } from '@/lib/cx';

export interface ExpectedRange {
  min: number;
  max: number;
}

/** Formats a value with a fixed number of decimals; infinite resistance reads "OL" (open line). */
export function formatValue(value: number, unit: string, digits = 1): string {
  if (!Number.isFinite(value)) return `OL ${unit}`.trim();
  return `${value.toFixed(digits)} ${unit}`.trim();
}

/** "12.4–12.8 V", or "12.6 V" when min and max are the same. */
export function formatRange(range: ExpectedRange, unit: string, digits = 1): string {
  if (range.min === range.max) return formatValue(range.min, unit, digits);
  const hi = Number.isFinite(range.max) ? range.max.toFixed(digits) : 'OL';
  return `${range.min.toFixed(digits)}–${hi} ${unit}`.trim();
}

/** True when the measured value lies inside the expected range (bounds included). */
export function isInRange(value: number, range: ExpectedRange): boolean {
  if (Number.isNaN(value)) return false;
  return value >= range.min && value <= range.max;
}

/** The words a badge says: "IN: 12.6 V, expected 12.4–12.8 V" or "OUT: 0.0 V, expected 12.4–12.8 V". */
export function readingText(value: number, range: ExpectedRange, unit: string, digits = 1): string {
  const verdict = isInRange(value, range) ? 'IN' : 'OUT';
  return `${verdict}: ${formatValue(value, unit, digits)}, expected ${formatRange(range, unit, digits)}`;
}

interface ReadingBadgeProps {
  /** The measured value; Infinity for an open line (OL). */
  value: number;
  /** The expected range, tolerance included. */
  expected: ExpectedRange;
  /** "V", "Ω", "A", "mV" ... */
  unit: string;
  /** Decimals shown; 1 by default. */
  digits?: number;
  size?: 'md' | 'lg';
  className?: string;
}

/**
 * A measured reading against its expected range: tick or cross, the word IN
 * or OUT, the value and the range, and colour last (7:1 contrast).
 */
export function ReadingBadge({ value, expected, unit, digits = 1, size = 'md', className }: ReadingBadgeProps) {
  const ok = isInRange(value, expected);
  return (
    <span
      className={cx(
        'tabular inline-flex items-center gap-1.5 rounded-control border-2 px-2 py-0.5 font-bold',
        size === 'lg' ? 'text-reading' : 'text-base',
        ok ? 'border-ok bg-ok-soft text-ok' : 'border-bad bg-bad-soft text-bad',
        className,
      )}
    >
      <span aria-hidden="true">{ok ? '✓' : '✗'}</span>
      <span>{readingText(value, expected, unit, digits)}</span>
    </span>
  );
}

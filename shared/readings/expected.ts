/**
 * What a meter reading may show and still be "in range", from the value the engine expects.
 *
 * The default bands follow the trade's rules of thumb (references.md, "from memory"):
 * more than about 0.5 V lost along a power feed, or 0.2 V along a ground path, points to a
 * poor connection or a damaged wire. So a pin expected at a supply voltage may read up to
 * 0.5 V below it (and a little above, for meter and charging variation); a pin expected at
 * ground may read up to 0.2 V. Resistance allows 10 % or 0.3 Ω, whichever is more, because
 * meter leads and probe contact alone add a few tenths of an ohm (common practice).
 * A lead may set a cavity's own band, which then replaces the default for volts.
 */

export type ReadingUnit = 'V' | 'Ω';

export interface Tolerance {
  /** Volts the reading may be below the expected value. */
  below: number;
  /** Volts the reading may be above the expected value. */
  above: number;
}

export interface ExpectedRange {
  value: number | null;
  min: number | null;
  max: number | null;
  unit: ReadingUnit | null;
  /** In words: "12.1–12.8 V", "0.0–0.2 V", "no steady reading", "open (OL)". */
  text: string;
}

/** The voltage at or below which a pin counts as "at ground". */
const GROUND_VOLTS = 0.1;
export const FEED_DROP_VOLTS = 0.5;
export const GROUND_DROP_VOLTS = 0.2;
const ABOVE_VOLTS = 0.3;
/** A resistance this high reads as open on a shop meter. */
export const OPEN_OHMS = 1e6;

const fmtVolts = (v: number) => (Math.abs(v) < 0.005 ? '0.0' : v.toFixed(Math.abs(v) < 10 ? 2 : 1));
export function formatOhms(ohms: number): string {
  if (ohms >= 1e6) return `${(ohms / 1e6).toPrecision(3)} MΩ`;
  if (ohms >= 1e3) return `${(ohms / 1e3).toPrecision(3)} kΩ`;
  if (ohms >= 10) return `${ohms.toFixed(1)} Ω`;
  return `${ohms.toFixed(2)} Ω`;
}
export const formatVolts = (v: number) => `${fmtVolts(v)} V`;

export function defaultVoltsTolerance(expected: number): Tolerance {
  if (Math.abs(expected) <= GROUND_VOLTS) return { below: GROUND_DROP_VOLTS, above: GROUND_DROP_VOLTS };
  return { below: FEED_DROP_VOLTS, above: ABOVE_VOLTS };
}

export function expectedVolts(expected: number | null, tolerance?: Tolerance | null): ExpectedRange {
  if (expected === null) return { value: null, min: null, max: null, unit: null, text: 'no steady reading (floating)' };
  const t = tolerance ?? defaultVoltsTolerance(expected);
  const min = expected - t.below;
  const max = expected + t.above;
  return { value: expected, min, max, unit: 'V', text: `${fmtVolts(min)}–${fmtVolts(max)} V` };
}

export function expectedOhms(expected: number | null): ExpectedRange {
  if (expected === null) return { value: null, min: OPEN_OHMS, max: null, unit: 'Ω', text: 'open (OL)' };
  const slack = Math.max(0.1 * expected, 0.3);
  const min = Math.max(0, expected - slack);
  const max = expected + slack;
  return { value: expected, min, max, unit: 'Ω', text: `${formatOhms(min)}–${formatOhms(max)}` };
}

/** In range? `null` measured means "no steady reading" for volts and "open" for ohms. */
export function inRange(range: ExpectedRange, measured: number | null): boolean {
  if (range.unit === 'Ω') {
    if (range.value === null) return measured === null || measured >= OPEN_OHMS;
    if (measured === null) return false;
    return measured >= (range.min ?? -Infinity) && measured <= (range.max ?? Infinity);
  }
  if (range.value === null) return measured === null;
  if (measured === null) return false;
  return measured >= (range.min ?? -Infinity) && measured <= (range.max ?? Infinity);
}

/** "OK: 12.5 V, expected 12.1–12.9 V" or "OUT: 0.0 V, expected 12.1–12.9 V". */
export function verdict(range: ExpectedRange, measured: number | null, ok: boolean): string {
  const shown =
    range.unit === 'Ω' ? (measured === null || measured >= OPEN_OHMS ? 'open (OL)' : formatOhms(measured)) : measured === null ? 'no steady reading' : formatVolts(measured);
  return `${ok ? 'OK' : 'OUT'}: ${shown}, expected ${range.text}`;
}

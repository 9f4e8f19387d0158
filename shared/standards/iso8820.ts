/**
 * Blade fuse body colours by current rating (ISO 8820-3).
 *
 * Pure data and lookups: no input throws; an unknown rating answers null.
 */

export interface FuseColour {
  /** English colour name as printed on a pin card, e.g. "red". */
  name: string;
  /** Display colour for a swatch, `#rrggbb`. */
  hex: string;
}

export interface BladeFuseRating extends FuseColour {
  amps: number;
}

/** The standard blade fuse ratings in ascending order, each with its body colour. */
export const bladeFuseRatings: readonly BladeFuseRating[] = Object.freeze([
  { amps: 1, name: 'black', hex: '#1a1a1a' },
  { amps: 2, name: 'grey', hex: '#8c8c8c' },
  { amps: 3, name: 'violet', hex: '#7b3fa0' },
  { amps: 4, name: 'pink', hex: '#f28cb8' },
  { amps: 5, name: 'tan', hex: '#c8a77a' },
  { amps: 7.5, name: 'brown', hex: '#7a4a24' },
  { amps: 10, name: 'red', hex: '#d21f1f' },
  { amps: 15, name: 'blue', hex: '#1f5fd2' },
  { amps: 20, name: 'yellow', hex: '#f2d21f' },
  { amps: 25, name: 'natural (white)', hex: '#f4f1e8' },
  { amps: 30, name: 'green', hex: '#2a9a3a' },
  { amps: 40, name: 'orange', hex: '#f28a1f' },
].map((r) => Object.freeze(r)));

/** Just the standard ratings in amps, ascending. */
export const standardBladeFuseAmps: readonly number[] = Object.freeze(bladeFuseRatings.map((r) => r.amps));

/**
 * The body colour of a blade fuse of the given rating, or null when the
 * rating is not one of the standard ones (or is not a finite number).
 */
export function bladeFuseColour(amps: number): FuseColour | null {
  if (typeof amps !== 'number' || !Number.isFinite(amps)) return null;
  for (const r of bladeFuseRatings) {
    if (Math.abs(r.amps - amps) < 1e-9) return { name: r.name, hex: r.hex };
  }
  return null;
}

/** True when `amps` is a standard blade fuse rating. */
export function isStandardBladeFuseRating(amps: number): boolean {
  return bladeFuseColour(amps) !== null;
}

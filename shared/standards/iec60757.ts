/**
 * Wire colour letter codes (IEC 60757) and swatch helpers.
 *
 * A wire colour is written as a base code, optionally followed by a stripe
 * (tracer) code: `RD`, `RD/WH`. `GNYE` is the single code for green-and-yellow.
 * Nothing here throws: text that is not a colour answers null.
 */

export const wireColourCodes = [
  'BK', 'BN', 'RD', 'OG', 'YE', 'GN', 'BU', 'VT', 'GY', 'WH', 'PK', 'GD', 'TQ', 'SR', 'GNYE',
] as const;

export type WireColourCode = (typeof wireColourCodes)[number];

export interface WireColourInfo {
  code: WireColourCode;
  /** English name, lower case, as it reads in a sentence. */
  name: string;
  /** Display colour for a swatch, `#rrggbb`. */
  hex: string;
  /** For two-colour codes (GNYE): the second colour of the swatch. */
  secondHex?: string;
}

const table: Record<WireColourCode, WireColourInfo> = {
  BK: { code: 'BK', name: 'black', hex: '#1a1a1a' },
  BN: { code: 'BN', name: 'brown', hex: '#7a4a24' },
  RD: { code: 'RD', name: 'red', hex: '#d21f1f' },
  OG: { code: 'OG', name: 'orange', hex: '#f28a1f' },
  YE: { code: 'YE', name: 'yellow', hex: '#f2d21f' },
  GN: { code: 'GN', name: 'green', hex: '#2a9a3a' },
  BU: { code: 'BU', name: 'blue', hex: '#1f5fd2' },
  VT: { code: 'VT', name: 'violet', hex: '#7b3fa0' },
  GY: { code: 'GY', name: 'grey', hex: '#8c8c8c' },
  WH: { code: 'WH', name: 'white', hex: '#f7f7f7' },
  PK: { code: 'PK', name: 'pink', hex: '#f28cb8' },
  GD: { code: 'GD', name: 'gold', hex: '#c9a227' },
  TQ: { code: 'TQ', name: 'turquoise', hex: '#2ec4c0' },
  SR: { code: 'SR', name: 'silver', hex: '#c0c4c8' },
  GNYE: { code: 'GNYE', name: 'green-yellow', hex: '#2a9a3a', secondHex: '#f2d21f' },
};

/** Every code with its name and display colour, in the order of `wireColourCodes`. */
export const wireColours: readonly WireColourInfo[] = Object.freeze(wireColourCodes.map((c) => Object.freeze({ ...table[c] })));

export function isWireColourCode(text: unknown): text is WireColourCode {
  return typeof text === 'string' && Object.prototype.hasOwnProperty.call(table, text);
}

/** Name and display colour of one code (case-insensitive), or null. */
export function wireColourInfo(code: string): WireColourInfo | null {
  if (typeof code !== 'string') return null;
  const c = code.trim().toUpperCase();
  return isWireColourCode(c) ? { ...table[c] } : null;
}

export interface WireColour {
  base: WireColourCode;
  stripe?: WireColourCode;
}

/**
 * Reads a wire colour such as `RD`, `RD/WH`, `rd-wh`, `RD WH` or `GNYE`.
 * The separator between base and stripe may be `/`, `-`, `_`, or spaces.
 * A four-letter run of two codes without a separator (`RDWH`) is read as
 * base and stripe, except `GNYE`, which is its own code.
 * Answers null for anything else, and for a stripe equal to its base.
 */
export function parseWireColour(text: string): WireColour | null {
  if (typeof text !== 'string' || text.length > 32) return null;
  const t = text.trim().toUpperCase();
  if (t === '') return null;
  const parts = t.split(/\s*[/\-_]\s*|\s+/);
  let base: string;
  let stripe: string | undefined;
  if (parts.length === 1) {
    const only = parts[0];
    if (isWireColourCode(only)) return { base: only };
    if (only.length === 4) {
      base = only.slice(0, 2);
      stripe = only.slice(2);
    } else if (only.length === 6 && only.startsWith('GNYE')) {
      base = 'GNYE';
      stripe = only.slice(4);
    } else if (only.length === 6 && only.endsWith('GNYE')) {
      base = only.slice(0, 2);
      stripe = 'GNYE';
    } else return null;
  } else if (parts.length === 2) {
    [base, stripe] = parts;
  } else return null;
  if (!isWireColourCode(base) || !isWireColourCode(stripe) || base === stripe) return null;
  return { base, stripe };
}

/** Canonical text of a wire colour: `RD` or `RD/WH`. */
export function formatWireColour(colour: WireColour): string {
  return colour.stripe ? `${colour.base}/${colour.stripe}` : colour.base;
}

/** "red", "red with white stripe", "green-yellow"; null when the text is not a colour. */
export function wireColourLabel(text: string): string | null {
  const c = parseWireColour(text);
  if (!c) return null;
  const base = table[c.base].name;
  return c.stripe ? `${base} with ${table[c.stripe].name} stripe` : base;
}

// ---------------------------------------------------------------------------
// Contrast of ink on a swatch (WCAG 2.x relative luminance and contrast ratio)

/** `#rgb` or `#rrggbb` (the `#` optional, any case) as 0–255 channels, or null. */
export function parseHexColour(hex: string): { r: number; g: number; b: number } | null {
  if (typeof hex !== 'string') return null;
  let h = hex.trim();
  if (h.startsWith('#')) h = h.slice(1);
  if (!/^[0-9a-fA-F]{3}$|^[0-9a-fA-F]{6}$/.test(h)) return null;
  if (h.length === 3) h = h[0] + h[0] + h[1] + h[1] + h[2] + h[2];
  const n = parseInt(h, 16);
  return { r: (n >> 16) & 0xff, g: (n >> 8) & 0xff, b: n & 0xff };
}

function linearChannel(c8: number): number {
  const c = c8 / 255;
  // WCAG 2.x: sRGB transfer function; the 0.04045 threshold is the sRGB
  // standard's (WCAG 2.0 printed 0.03928; no 8-bit value lies between them).
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** WCAG 2.x relative luminance (0 for black, 1 for white), or null for bad hex. */
export function relativeLuminance(hex: string): number | null {
  const rgb = parseHexColour(hex);
  if (!rgb) return null;
  return 0.2126 * linearChannel(rgb.r) + 0.7152 * linearChannel(rgb.g) + 0.0722 * linearChannel(rgb.b);
}

/** WCAG 2.x contrast ratio between two colours (1 to 21), or null for bad hex. */
export function contrastRatio(hexA: string, hexB: string): number | null {
  const a = relativeLuminance(hexA);
  const b = relativeLuminance(hexB);
  if (a === null || b === null) return null;
  const hi = Math.max(a, b);
  const lo = Math.min(a, b);
  return (hi + 0.05) / (lo + 0.05);
}

export interface SwatchInk {
  /** `#000000` or `#ffffff`, whichever contrasts more with the swatch. */
  ink: '#000000' | '#ffffff';
  /** Contrast ratio of that ink on the swatch; never below 4.5 for any colour. */
  ratio: number;
}

/**
 * Black or white text for a label on a swatch of the given colour: the one
 * with the higher WCAG contrast. For every sRGB colour the better of the two
 * reaches at least about 4.58:1, so labels meet the 4.5:1 text minimum.
 */
export function swatchInk(hex: string): SwatchInk | null {
  const l = relativeLuminance(hex);
  if (l === null) return null;
  const onBlack = (l + 0.05) / 0.05;
  const onWhite = 1.05 / (l + 0.05);
  return onBlack >= onWhite ? { ink: '#000000', ratio: onBlack } : { ink: '#ffffff', ratio: onWhite };
}

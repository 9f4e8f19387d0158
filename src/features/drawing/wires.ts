/**
 * Wires on the drawing: their paint (IEC 60757 colour and stripe), their
 * label (id, size, circuit) and their path between two pins. Pure.
 */
import { parseWireColour, wireColourInfo } from '@shared/standards/iec60757';
import type { Wire, WireSize } from '@shared/harness';
import type { Side } from './geometry';

export interface WirePaint {
  base: string;
  stripe?: string;
  /** The letter code as written (`RD/WH`), or null for a wire without colour. */
  code: string | null;
}

/** Grey ink for a wire whose colour is not documented. */
export const UNKNOWN_WIRE = '#6b6f75';

export function wirePaint(color: string | undefined): WirePaint {
  if (!color) return { base: UNKNOWN_WIRE, code: null };
  const c = parseWireColour(color);
  if (!c) return { base: UNKNOWN_WIRE, code: color };
  const base = wireColourInfo(c.base)!;
  const stripe = c.stripe ? wireColourInfo(c.stripe)!.hex : base.secondHex;
  return { base: base.hex, stripe, code: color };
}

export function sizeText(size: WireSize | undefined): string {
  if (!size) return '';
  if ('mm2' in size) return `${size.mm2} mm²`;
  return `${size.awg} AWG`;
}

/** `W101 · RD/WH · 1 mm² · A12` (colour code spelled out for colour-blind readers and print). */
export function wireLabel(w: Pick<Wire, 'id' | 'size' | 'circuit' | 'color'>): string {
  return [w.id, w.color, sizeText(w.size), w.circuit].filter(Boolean).join(' · ');
}

/** A cubic curve leaving each pin away from its node. Answers the path and its midpoint. */
export function wirePath(sx: number, sy: number, sSide: Side | 'center', tx: number, ty: number, tSide: Side | 'center'): { d: string; mx: number; my: number } {
  const dist = Math.max(30, Math.min(160, Math.abs(tx - sx) / 2 + 20));
  const out = (side: Side | 'center', x: number, toward: number) => (side === 'left' ? x - dist : side === 'right' ? x + dist : x + Math.sign(toward - x || 1) * dist);
  const c1x = out(sSide, sx, tx);
  const c2x = out(tSide, tx, sx);
  const d = `M${r(sx)} ${r(sy)}C${r(c1x)} ${r(sy)} ${r(c2x)} ${r(ty)} ${r(tx)} ${r(ty)}`;
  // Point at t = 0.5 of the cubic.
  const mx = 0.125 * sx + 0.375 * c1x + 0.375 * c2x + 0.125 * tx;
  const my = 0.5 * sy + 0.5 * ty;
  return { d, mx, my };
}

const r = (n: number) => Math.round(n * 10) / 10;

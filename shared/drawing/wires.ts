/**
 * Wires on the drawing: their paint (IEC 60757 colour and stripe), their
 * label (id, size, circuit) and their path between two pins. Pure.
 */
import { parseWireColour, wireColourInfo } from '../standards/iec60757';
import type { Wire, WireSize } from '../harness';
import { splitRef, type NodeGeom, type Positions, type Side } from './geometry';
import type { Shape } from './symbols';

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

export interface WirePath {
  d: string;
  /** Midpoint (t = 0.5), where the label goes. */
  mx: number;
  my: number;
  /** The cubic's four points: start, two controls, end. */
  c: [number, number, number, number, number, number, number, number];
}

/** A cubic curve leaving each pin away from its node. Answers the path and its midpoint. */
export function wirePath(sx: number, sy: number, sSide: Side | 'center', tx: number, ty: number, tSide: Side | 'center'): WirePath {
  const dist = Math.max(30, Math.min(160, Math.abs(tx - sx) / 2 + 20));
  const out = (side: Side | 'center', x: number, toward: number) => (side === 'left' ? x - dist : side === 'right' ? x + dist : x + Math.sign(toward - x || 1) * dist);
  const c1x = out(sSide, sx, tx);
  const c2x = out(tSide, tx, sx);
  const d = `M${r(sx)} ${r(sy)}C${r(c1x)} ${r(sy)} ${r(c2x)} ${r(ty)} ${r(tx)} ${r(ty)}`;
  // Point at t = 0.5 of the cubic.
  const mx = 0.125 * sx + 0.375 * c1x + 0.375 * c2x + 0.125 * tx;
  const my = 0.5 * sy + 0.5 * ty;
  return { d, mx, my, c: [sx, sy, c1x, sy, c2x, ty, tx, ty] };
}

function cubicAt(c: WirePath['c'], t: number): [number, number] {
  const u = 1 - t;
  const a = u * u * u, b = 3 * u * u * t, cc = 3 * u * t * t, d = t * t * t;
  return [a * c[0] + b * c[2] + cc * c[4] + d * c[6], a * c[1] + b * c[3] + cc * c[5] + d * c[7]];
}

/**
 * The point at fraction `at` of the wire's drawn length (a clamp's `at` is a
 * fraction of the wire's length), and the wire's direction there in degrees.
 */
export function pointAlong(path: WirePath, at: number): { x: number; y: number; angle: number } {
  const STEPS = 24;
  const pts: Array<[number, number]> = [];
  const len: number[] = [0];
  for (let i = 0; i <= STEPS; i++) {
    pts.push(cubicAt(path.c, i / STEPS));
    if (i) len.push(len[i - 1] + Math.hypot(pts[i][0] - pts[i - 1][0], pts[i][1] - pts[i - 1][1]));
  }
  const want = Math.min(1, Math.max(0, at)) * len[STEPS];
  let i = 1;
  while (i < STEPS && len[i] < want) i++;
  const seg = len[i] - len[i - 1] || 1;
  const f = (want - len[i - 1]) / seg;
  const [x0, y0] = pts[i - 1];
  const [x1, y1] = pts[i];
  return { x: x0 + (x1 - x0) * f, y: y0 + (y1 - y0) * f, angle: (Math.atan2(y1 - y0, x1 - x0) * 180) / Math.PI };
}

/**
 * Wirewalk's clamp, in its own coordinates (the wire runs along x through 0, 0):
 * a band across the wire and the tab that fixes it to the frame, ending in its bolt.
 */
export const clampShapes: Shape[] = [
  { t: 'path', d: 'M0 9V17', stroke: 'ink', sw: 2 },
  { t: 'circle', cx: 0, cy: 20, r: 3, stroke: 'ink', fill: 'surface', sw: 2 },
  { t: 'rect', x: -5, y: -10, w: 10, h: 20, rx: 3, stroke: 'ink', fill: 'surface', sw: 2 },
  { t: 'path', d: 'M-5 0H5', stroke: 'muted', sw: 1 },
];

/** Where a clamp's id is printed: just past its bolt (which turns with the wire), upright. */
export function clampLabelAt(p: { x: number; y: number; angle: number }): { x: number; y: number } {
  const r = (p.angle * Math.PI) / 180;
  return { x: p.x - 20 * Math.sin(r) + 6, y: p.y + 20 * Math.cos(r) + 4 };
}

/** A clamp near the wire's middle would sit on its label: the label then moves past the band. */
export function labelClearOf(at: number[]): boolean {
  return at.some((a) => Math.abs(a - 0.5) < 0.12);
}

const r = (n: number) => Math.round(n * 10) / 10;

/** Where a pin is drawn: its component's place plus the port's offset, and the side it leaves by. */
export function pinPoint(ref: string, geom: ReadonlyMap<string, NodeGeom>, pos: Positions): { x: number; y: number; side: Side } | null {
  const parts = splitRef(ref);
  if (!parts) return null;
  const g = geom.get(parts[0]);
  const p = pos[parts[0]];
  const port = g?.ports.find((q) => q.pin === parts[1]);
  if (!g || !p || !port) return null;
  return { x: p.x + port.x, y: p.y + port.y, side: port.side };
}

/** A wire's curve between its two pins as placed (a splice's wires leave from its centre). */
export function routeOfWire(w: { from: string; to: string }, kindOf: ReadonlyMap<string, string>, geom: ReadonlyMap<string, NodeGeom>, pos: Positions): WirePath | null {
  const a = pinPoint(w.from, geom, pos);
  const b = pinPoint(w.to, geom, pos);
  if (!a || !b) return null;
  const sSide = kindOf.get(splitRef(w.from)![0]) === 'splice' ? 'center' : a.side;
  const tSide = kindOf.get(splitRef(w.to)![0]) === 'splice' ? 'center' : b.side;
  return wirePath(a.x, a.y, sSide, b.x, b.y, tSide);
}

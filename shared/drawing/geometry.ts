/**
 * The drawing's geometry: each component's box size and where its pins sit,
 * shared by the editor nodes, the elkjs layout (ports in fixed order) and the
 * DOM-free SVG renderer. Pure: no React, no browser API.
 */
import type { Component, HarnessDocument } from '../harness';
import { componentPinIds } from '../harness/pins';

export type Side = 'left' | 'right';

export interface PortGeom {
  pin: string;
  /** What the drawing prints beside the pin: the cavity's function, the module pin's role … */
  caption?: string;
  side: Side;
  /** Centre of the pin's handle, relative to the node's top-left corner. */
  x: number;
  y: number;
}

export interface NodeGeom {
  width: number;
  height: number;
  ports: PortGeom[];
}

export interface Point {
  x: number;
  y: number;
}

export type Positions = Record<string, Point>;

export const ROW = 24;
export const HEADER = 28;
const PAD = 8;

/** Which half of a mated pair a connector is: 'a' declares `matesWith`, 'b' is named by another half. */
export type MateRole = 'a' | 'b' | null;

/** Mate roles of every connector of the document (by component id). */
export function mateRoles(doc: Pick<HarnessDocument, 'components'>): Map<string, MateRole> {
  const ids = new Set(doc.components.map((c) => c.id));
  const roles = new Map<string, MateRole>();
  for (const c of doc.components) {
    if (c.kind === 'connector' && c.matesWith && ids.has(c.matesWith) && c.matesWith !== c.id) {
      roles.set(c.id, 'a');
      if (!roles.has(c.matesWith)) roles.set(c.matesWith, 'b');
    }
  }
  return roles;
}

/** The mated pairs as [a, b] component ids. */
export function matePairs(doc: Pick<HarnessDocument, 'components'>): Array<[string, string]> {
  const ids = new Set(doc.components.map((c) => c.id));
  const seen = new Set<string>();
  const pairs: Array<[string, string]> = [];
  for (const c of doc.components) {
    if (c.kind === 'connector' && c.matesWith && ids.has(c.matesWith) && c.matesWith !== c.id && !seen.has(c.id) && !seen.has(c.matesWith)) {
      pairs.push([c.id, c.matesWith]);
      seen.add(c.id);
      seen.add(c.matesWith);
    }
  }
  return pairs;
}

const roleCaption: Record<string, string> = {
  supply: 'supply',
  ground: 'ground',
  can_h: 'CAN high',
  can_l: 'CAN low',
  output: 'output',
  ref5: '5 V ref',
  input: 'input',
};

function rows(pins: Array<{ pin: string; caption?: string }>, side: Side, width: number, top = HEADER): PortGeom[] {
  return pins.map((p, i) => ({ ...p, side, x: side === 'left' ? 0 : width, y: top + ROW / 2 + i * ROW }));
}

/** Size and pin places of one component. */
export function componentGeometry(c: Component, mate: MateRole = null): NodeGeom {
  switch (c.kind) {
    case 'battery':
      return { width: 76, height: 76, ports: [
        { pin: '+', side: 'right', x: 76, y: 26 },
        { pin: '-', side: 'right', x: 76, y: 56 },
      ] };
    case 'ground':
      return { width: 48, height: 56, ports: [{ pin: 'G', side: 'left', x: 0, y: 16 }] };
    case 'fuse':
    case 'resistor':
      return { width: 88, height: 44, ports: [
        { pin: '1', side: 'left', x: 0, y: 22 },
        { pin: '2', side: 'right', x: 88, y: 22 },
      ] };
    case 'load':
      return { width: 96, height: 56, ports: [
        { pin: '1', side: 'left', x: 0, y: 28 },
        { pin: '2', side: 'right', x: 96, y: 28 },
      ] };
    case 'splice':
      return { width: 18, height: 18, ports: [{ pin: 'S', side: 'left', x: 9, y: 9 }] };
    case 'relay': {
      const width = 120;
      const pins = ['85', '86', '30', '87', ...(c.normallyClosed ? ['87a'] : [])];
      const place: Record<string, [Side, number]> = { '85': ['left', 0], '86': ['right', 0], '30': ['left', 1], '87': ['right', 1], '87a': ['right', 2] };
      const height = HEADER + (c.normallyClosed ? 3 : 2) * ROW + PAD;
      return { width, height, ports: pins.map((pin) => {
        const [side, row] = place[pin];
        return { pin, side, x: side === 'left' ? 0 : width, y: HEADER + ROW / 2 + row * ROW };
      }) };
    }
    case 'connector': {
      const width = 104;
      const pins = c.cavities.map((cv) => (typeof cv === 'string' ? { pin: cv } : { pin: cv.id, caption: cv.function ?? cv.label }));
      const side: Side = mate === 'b' ? 'right' : 'left';
      return { width, height: HEADER + Math.max(1, pins.length) * ROW + PAD, ports: rows(pins, side, width) };
    }
    case 'switch': {
      const width = 112;
      const pins = c.pins.map((p) => ({ pin: p }));
      return { width, height: HEADER + Math.max(1, pins.length) * ROW + PAD, ports: rows(pins, 'left', width) };
    }
    case 'module': {
      const width = 168;
      const pins = c.pins.map((p) => ({ pin: p.id, caption: p.function ?? p.label ?? roleCaption[p.role] ?? p.role }));
      return { width, height: HEADER + Math.max(1, pins.length) * ROW + PAD, ports: rows(pins, 'left', width) };
    }
  }
}

/** Geometry of every component, by id (mate roles taken into account). */
export function documentGeometry(doc: Pick<HarnessDocument, 'components'>): Map<string, NodeGeom> {
  const roles = mateRoles(doc);
  const out = new Map<string, NodeGeom>();
  for (const c of doc.components) out.set(c.id, componentGeometry(c, roles.get(c.id) ?? null));
  return out;
}

/** `X12.3` → ['X12', '3']; null when there is no dot. */
export function splitRef(ref: string): [string, string] | null {
  const dot = ref.indexOf('.');
  if (dot <= 0 || dot === ref.length - 1) return null;
  return [ref.slice(0, dot), ref.slice(dot + 1)];
}

/** Every pin ref of the document in component and cavity order. */
export function allPinRefs(doc: Pick<HarnessDocument, 'components'>): string[] {
  const out: string[] = [];
  for (const c of doc.components) for (const p of componentPinIds(c)) out.push(`${c.id}.${p}`);
  return out;
}

/** Gap between the mating faces of a pair. */
export const MATE_GAP = 10;

/**
 * Positions for components that have none yet: a simple grid to the right
 * of what is placed, so nothing lands on top of anything (the layout
 * worker does the real job; this is the instant fallback).
 */
export function fillPositions(doc: Pick<HarnessDocument, 'components'>, positions: Positions): Positions {
  const missing = doc.components.filter((c) => !positions[c.id]);
  if (missing.length === 0) return positions;
  const geom = documentGeometry(doc);
  let maxX = 0;
  for (const c of doc.components) {
    const p = positions[c.id];
    if (p) maxX = Math.max(maxX, p.x + (geom.get(c.id)?.width ?? 0));
  }
  const next: Positions = { ...positions };
  const cols = Math.max(1, Math.ceil(Math.sqrt(missing.length)));
  const x0 = Object.keys(positions).length ? maxX + 120 : 0;
  missing.forEach((c, i) => {
    next[c.id] = { x: x0 + (i % cols) * 220, y: Math.floor(i / cols) * 180 };
  });
  return next;
}

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** The box round every placed component, `margin` wide on each side (a small sheet when there are none). */
export function drawingBounds(doc: Pick<HarnessDocument, 'components'>, pos: Positions, geom: ReadonlyMap<string, NodeGeom>, margin = 40): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const c of doc.components) {
    const p = pos[c.id];
    const g = geom.get(c.id);
    if (!p || !g) continue;
    minX = Math.min(minX, p.x - margin);
    minY = Math.min(minY, p.y - margin);
    maxX = Math.max(maxX, p.x + g.width + margin);
    maxY = Math.max(maxY, p.y + g.height + margin);
  }
  if (!Number.isFinite(minX)) return { x: 0, y: 0, w: 400, h: 200 };
  return { x: minX, y: minY, w: maxX - minX, h: maxY - minY };
}

/** The placed components' boxes, and where the battery is (the first component when there is none). */
export function placedBoxes(doc: Pick<HarnessDocument, 'components'>, positions: Positions): { boxes: Box[]; home: Point | null } {
  const geom = documentGeometry(doc);
  const boxes: Box[] = [];
  for (const c of doc.components) {
    const p = positions[c.id];
    const g = geom.get(c.id);
    if (p && g) boxes.push({ x: p.x, y: p.y, w: g.width, h: g.height });
  }
  const battery = doc.components.find((c) => c.kind === 'battery');
  return { boxes, home: (battery && positions[battery.id]) ?? boxes[0] ?? null };
}

/**
 * Where a big drawing opens at working zoom: the view-sized window with the
 * most components wholly in it (a laid-out drawing has wide empty stretches,
 * and its battery often sits alone at the far left), the one nearest `home`
 * when several are as full.
 */
export function openingViewport(boxes: Box[], home: Point | null, view: { width: number; height: number }, zoom: number): { x: number; y: number; zoom: number } {
  const margin = 40 / zoom;
  const w = view.width / zoom;
  const h = view.height / zoom;
  const at = home ?? { x: 0, y: 0 };
  let best = { x: at.x - margin, y: at.y - margin, count: -1, dist: Infinity };
  // Candidate windows start at each component's top-left corner, less a margin.
  for (const b of boxes) {
    const x0 = b.x - margin;
    const y0 = b.y - margin;
    let count = 0;
    for (const o of boxes) if (o.x >= x0 && o.y >= y0 && o.x + o.w <= x0 + w && o.y + o.h <= y0 + h) count++;
    const dist = Math.hypot(x0 + w / 2 - at.x, y0 + h / 2 - at.y);
    if (count > best.count || (count === best.count && dist < best.dist)) best = { x: x0, y: y0, count, dist };
  }
  return { x: -best.x * zoom, y: -best.y * zoom, zoom };
}

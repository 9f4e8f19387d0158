/**
 * What each component looks like, as plain shapes and texts in the node's own
 * coordinates. The editor's React nodes and the DOM-free SVG renderer both
 * draw from these, so the drawing looks the same on screen, in a repair order
 * and in a report.
 *
 * The ground, fuse, resistor and relay follow the IEC 60617 symbols, drawn in
 * Wirewalk's own line style (2 px ink, round joins); the connector halves
 * (a box with its cavity grid and a heavy mating face), the splice and the
 * controller box are Wirewalk's own compact shapes.
 */
import type { Component } from '../harness';
import { HEADER, ROW, type MateRole, type NodeGeom } from './geometry';

export type Paint = 'ink' | 'muted' | 'surface' | 'sunken' | 'none' | 'accent';

/** The paints as printed (black ink on white paper), for the SVG and the overview picture. */
export const printPaints: Record<Paint, string> = { ink: '#1b1c1e', muted: '#4f5257', surface: '#ffffff', sunken: '#ecebe7', none: 'none', accent: '#4536a6' };

export type Shape =
  | { t: 'path'; d: string; stroke?: Paint; fill?: Paint; sw?: number }
  | { t: 'rect'; x: number; y: number; w: number; h: number; rx?: number; stroke?: Paint; fill?: Paint; sw?: number }
  | { t: 'circle'; cx: number; cy: number; r: number; stroke?: Paint; fill?: Paint; sw?: number };

export type TextRole = 'id' | 'label' | 'pin' | 'caption' | 'value';

export interface TextItem {
  x: number;
  y: number;
  text: string;
  anchor: 'start' | 'middle' | 'end';
  role: TextRole;
  /** Hidden when zoomed far out (compact view). */
  detail: boolean;
}

export interface Drawing {
  shapes: Shape[];
  texts: TextItem[];
}

const fmt = (n: number) => (Number.isInteger(n) ? String(n) : String(Math.round(n * 1000) / 1000));

function ohmsText(ohms: number): string {
  if (ohms >= 1000) return `${fmt(ohms / 1000)} kΩ`;
  return `${fmt(ohms)} Ω`;
}

/** One line of what the component's value is (12.6 V, 10 A, 120 Ω, 21 W). */
export function valueText(c: Component): string | null {
  switch (c.kind) {
    case 'battery': return `${fmt(c.volts)} V`;
    case 'fuse': return `${fmt(c.amps)} A`;
    case 'resistor': return ohmsText(c.ohms);
    case 'load': return c.ohms !== undefined ? ohmsText(c.ohms) : c.watts !== undefined ? `${fmt(c.watts)} W` : null;
    case 'relay': return `coil ${ohmsText(c.coilOhms)}`;
    case 'ground': return c.bondOhms ? `bond ${ohmsText(c.bondOhms)}` : null;
    default: return null;
  }
}

function boxed(c: Component, g: NodeGeom, kindWord: string, mate: MateRole): Drawing {
  const shapes: Shape[] = [
    { t: 'rect', x: 0, y: 0, w: g.width, h: g.height, rx: 4, stroke: 'ink', fill: 'surface', sw: 2 },
    { t: 'rect', x: 1, y: 1, w: g.width - 2, h: HEADER - 2, rx: 3, fill: 'sunken', stroke: 'none' },
    { t: 'path', d: `M0 ${HEADER}H${g.width}`, stroke: 'ink', sw: 1 },
  ];
  const texts: TextItem[] = [
    { x: 8, y: 19, text: c.id, anchor: 'start', role: 'id', detail: false },
    { x: g.width - 8, y: 19, text: kindWord, anchor: 'end', role: 'label', detail: true },
  ];
  if (c.kind === 'connector') {
    // The mating face: a heavy bar on the side that meets the other half.
    if (mate === 'a') shapes.push({ t: 'path', d: `M${g.width - 2} 3V${g.height - 3}`, stroke: 'ink', sw: 5 });
    if (mate === 'b') shapes.push({ t: 'path', d: `M2 3V${g.height - 3}`, stroke: 'ink', sw: 5 });
  }
  for (const p of g.ports) {
    const left = p.side === 'left';
    const cellX = left ? 6 : g.width - 26;
    // The cavity (or pin) cell of the grid, with its number in it.
    shapes.push({ t: 'rect', x: cellX, y: p.y - 9, w: 20, h: 18, rx: 2, stroke: 'muted', fill: 'surface', sw: 1 });
    texts.push({ x: cellX + 10, y: p.y + 5, text: p.pin, anchor: 'middle', role: 'pin', detail: false });
    if (p.caption) {
      texts.push({ x: left ? cellX + 26 : cellX - 6, y: p.y + 5, text: p.caption, anchor: left ? 'start' : 'end', role: 'caption', detail: true });
    }
  }
  if (c.kind === 'switch') {
    // A small open contact in the header: a switch, whatever its positions.
    const x = g.width - 62;
    shapes.push({ t: 'circle', cx: x, cy: 14, r: 2.5, stroke: 'ink', fill: 'surface', sw: 1.5 });
    shapes.push({ t: 'path', d: `M${x + 2} 13L${x + 16} 6`, stroke: 'ink', sw: 1.5 });
    shapes.push({ t: 'circle', cx: x + 18, cy: 14, r: 2.5, stroke: 'ink', fill: 'surface', sw: 1.5 });
  }
  return { shapes, texts };
}

/** The shapes and texts of one component in its node's coordinates. */
export function componentDrawing(c: Component, g: NodeGeom, mate: MateRole = null): Drawing {
  const value = valueText(c);
  const label = c.label ?? '';
  switch (c.kind) {
    case 'battery': {
      // Two cells in series: short thick plate (−), long thin plate (+); leads out to the pins on the right.
      const shapes: Shape[] = [
        { t: 'rect', x: 0, y: 0, w: g.width, h: g.height, rx: 6, stroke: 'ink', fill: 'surface', sw: 2.5 },
        { t: 'path', d: 'M22 21V31', stroke: 'ink', sw: 5 },
        { t: 'path', d: 'M30 16V36', stroke: 'ink', sw: 2 },
        { t: 'path', d: 'M38 21V31', stroke: 'ink', sw: 5 },
        { t: 'path', d: 'M46 16V36', stroke: 'ink', sw: 2 },
        { t: 'path', d: 'M46 26H76M22 26H12V56H76', stroke: 'ink', sw: 2, fill: 'none' },
      ];
      const texts: TextItem[] = [
        { x: 68, y: 20, text: '+', anchor: 'middle', role: 'pin', detail: false },
        { x: 68, y: 52, text: '−', anchor: 'middle', role: 'pin', detail: false },
        { x: 4, y: -6, text: c.id, anchor: 'start', role: 'id', detail: false },
        { x: 38, y: 72, text: value ?? '', anchor: 'middle', role: 'value', detail: true },
      ];
      if (label) texts.push({ x: 4, y: g.height + 16, text: label, anchor: 'start', role: 'label', detail: true });
      return { shapes, texts };
    }
    case 'ground': {
      // IEC 60617 earth/chassis: a lead down to three bars, each shorter.
      const shapes: Shape[] = [
        { t: 'path', d: 'M0 16H24V30', stroke: 'ink', sw: 2, fill: 'none' },
        { t: 'path', d: 'M8 30H40', stroke: 'ink', sw: 3 },
        { t: 'path', d: 'M14 37H34', stroke: 'ink', sw: 3 },
        { t: 'path', d: 'M20 44H28', stroke: 'ink', sw: 3 },
      ];
      const texts: TextItem[] = [{ x: 28, y: 10, text: c.id, anchor: 'start', role: 'id', detail: false }];
      if (label) texts.push({ x: 24, y: 60, text: label, anchor: 'middle', role: 'label', detail: true });
      return { shapes, texts };
    }
    case 'fuse':
    case 'resistor': {
      // IEC 60617: a rectangle; the fuse has its element drawn through it.
      const w = g.width;
      const shapes: Shape[] = [
        { t: 'path', d: `M0 22H24M${w - 24} 22H${w}`, stroke: 'ink', sw: 2 },
        { t: 'rect', x: 24, y: 14, w: w - 48, h: 16, rx: 1, stroke: 'ink', fill: 'surface', sw: 2 },
      ];
      if (c.kind === 'fuse') shapes.push({ t: 'path', d: `M18 22H${w - 18}`, stroke: 'ink', sw: 1.5 });
      const texts: TextItem[] = [
        { x: w / 2, y: 9, text: c.id, anchor: 'middle', role: 'id', detail: false },
        { x: w / 2, y: 43, text: [value, label].filter(Boolean).join(' · '), anchor: 'middle', role: 'value', detail: true },
      ];
      return { shapes, texts };
    }
    case 'load': {
      // Wirewalk's load: a round-ended body with a heavy bar at its return end.
      const w = g.width;
      const shapes: Shape[] = [
        { t: 'path', d: `M0 28H20M${w - 20} 28H${w}`, stroke: 'ink', sw: 2 },
        { t: 'rect', x: 20, y: 14, w: w - 40, h: 28, rx: 14, stroke: 'ink', fill: 'surface', sw: 2 },
        { t: 'path', d: `M${w - 30} 18V38`, stroke: 'ink', sw: 4 },
      ];
      const texts: TextItem[] = [
        { x: w / 2 - 4, y: 33, text: c.id, anchor: 'middle', role: 'id', detail: false },
        { x: w / 2, y: 9, text: label, anchor: 'middle', role: 'label', detail: true },
        { x: w / 2, y: 55, text: value ?? '', anchor: 'middle', role: 'value', detail: true },
      ];
      return { shapes, texts };
    }
    case 'splice': {
      const shapes: Shape[] = [{ t: 'circle', cx: 9, cy: 9, r: 7, stroke: 'ink', fill: 'ink', sw: 1 }];
      const texts: TextItem[] = [{ x: 9, y: -5, text: c.id, anchor: 'middle', role: 'id', detail: true }];
      return { shapes, texts };
    }
    case 'relay': {
      const base = boxed(c, g, 'relay', mate);
      // IEC 60617: the coil (a rectangle) between 85 and 86; the contact between 30 and 87.
      const y1 = HEADER + ROW / 2;
      const y2 = y1 + ROW;
      const mid = g.width / 2;
      base.shapes.push(
        { t: 'path', d: `M30 ${y1}H${mid - 14}M${mid + 14} ${y1}H${g.width - 30}`, stroke: 'ink', sw: 1.5 },
        { t: 'rect', x: mid - 14, y: y1 - 7, w: 28, h: 14, stroke: 'ink', fill: 'surface', sw: 2 },
        { t: 'path', d: `M30 ${y2}H${mid - 12}L${mid + 10} ${y2 - 9}M${mid + 12} ${y2}H${g.width - 30}`, stroke: 'ink', sw: 1.5, fill: 'none' },
        { t: 'path', d: `M${mid} ${y1 + 7}V${y2 - 5}`, stroke: 'muted', sw: 1 },
      );
      if (c.normallyClosed) {
        const y3 = y2 + ROW;
        base.shapes.push({ t: 'path', d: `M${mid + 6} ${y2 - 2}L${mid + 6} ${y3}H${g.width - 30}`, stroke: 'muted', sw: 1.5, fill: 'none' });
      }
      return base;
    }
    case 'connector':
      return boxed(c, g, mate ? 'half' : 'connector', mate);
    case 'switch':
      return boxed(c, g, 'switch', mate);
    case 'module':
      return boxed(c, g, 'controller', mate);
  }
}

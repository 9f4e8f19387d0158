/**
 * The drawing as an SVG string, with no DOM: for a repair order's frozen,
 * marked-up drawing, the report PDF and the server. Black ink on white, wire
 * colours as they are (with the letter code printed on every wire), the
 * walked path in the accent colour, numbered markers with their labels.
 *
 * Pure TypeScript: no React, no browser API.
 */
import type { HarnessDocument } from '../harness';
import { documentGeometry, drawingBounds, fillPositions, mateRoles, matePairs, splitRef, type NodeGeom, type Positions } from './geometry';
import { componentDrawing, printPaints, type Shape, type TextItem } from './symbols';
import { clampLabelAt, clampShapes, labelClearOf, pinPoint, pointAlong, routeOfWire, wireLabel, wirePaint, type WirePath } from './wires';

export interface Highlight {
  pins?: string[];
  wires?: string[];
}

export interface Marker {
  /** A pin (`X12.3`), a wire id, a component id or a clamp id. */
  ref: string;
  label: string;
}

export interface SvgOptions {
  /** Leave out the labels of wires and pin captions (a smaller image). */
  compact?: boolean;
  title?: string;
}

const paints = printPaints;
const { ink: INK, muted: MUTED, accent: ACCENT } = paints;

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const n = (v: number) => String(Math.round(v * 10) / 10);

function shapeSvg(s: Shape, accent: boolean): string {
  const stroke = s.stroke ? (accent && s.stroke === 'ink' ? ACCENT : paints[s.stroke]) : 'none';
  const fill = s.fill ? paints[s.fill] : 'none';
  const sw = s.sw ?? 1;
  const common = `stroke="${stroke}" fill="${fill}" stroke-width="${sw}" stroke-linejoin="round" stroke-linecap="round"`;
  switch (s.t) {
    case 'path': return `<path d="${s.d}" ${common}/>`;
    case 'rect': return `<rect x="${n(s.x)}" y="${n(s.y)}" width="${n(s.w)}" height="${n(s.h)}"${s.rx ? ` rx="${s.rx}"` : ''} ${common}/>`;
    case 'circle': return `<circle cx="${n(s.cx)}" cy="${n(s.cy)}" r="${n(s.r)}" ${common}/>`;
  }
}

const textStyle: Record<TextItem['role'], string> = {
  id: 'font-weight="700" font-size="14"',
  label: `font-size="12" fill="${MUTED}"`,
  pin: 'font-weight="700" font-size="12"',
  caption: 'font-size="12"',
  value: `font-size="12" fill="${MUTED}"`,
};

function textSvg(t: TextItem): string {
  if (!t.text) return '';
  return `<text x="${n(t.x)}" y="${n(t.y)}" text-anchor="${t.anchor}" ${textStyle[t.role]}>${esc(t.text)}</text>`;
}

/**
 * Renders the drawing. Components without a position get a simple grid place
 * (the editor saves real ones). Answers a complete `<svg>` document.
 */
export function renderDrawingSvg(
  doc: HarnessDocument,
  positions: Positions,
  highlight: Highlight = {},
  markers: Marker[] = [],
  options: SvgOptions = {},
): string {
  const pos = fillPositions(doc, positions ?? {});
  const geom = documentGeometry(doc);
  const roles = mateRoles(doc);
  const hlPins = new Set(highlight.pins ?? []);
  const hlWires = new Set(highlight.wires ?? []);
  const hlComps = new Set([...hlPins].map((p) => splitRef(p)?.[0]).filter((x): x is string => !!x));

  const { x: minX, y: minY, w: width, h: height } = drawingBounds(doc, pos, geom);

  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="${n(minX)} ${n(minY)} ${n(width)} ${n(height)}" width="${n(width)}" height="${n(height)}" font-family="'Roboto Condensed', 'Arial Narrow', sans-serif" fill="${INK}">`,
  );
  out.push(`<title>${esc(options.title ?? doc.name)}</title>`);
  out.push(`<rect x="${n(minX)}" y="${n(minY)}" width="${n(width)}" height="${n(height)}" fill="#ffffff"/>`);

  // Mated pairs: a double bar between the mating faces.
  out.push('<g class="mates">');
  for (const [a, b] of matePairs(doc)) {
    const pa = pos[a];
    const pb = pos[b];
    const ga = geom.get(a)!;
    const ax = pa.x + ga.width;
    const ay = pa.y + 14;
    const bx = pb.x;
    const by = pb.y + 14;
    out.push(`<path d="M${n(ax)} ${n(ay - 3)}L${n(bx)} ${n(by - 3)}M${n(ax)} ${n(ay + 3)}L${n(bx)} ${n(by + 3)}" stroke="${INK}" stroke-width="2" fill="none"/>`);
  }
  out.push('</g>');

  // Wires.
  out.push('<g class="wires" fill="none" stroke-linecap="round">');
  const labels: string[] = [];
  const kindOf = new Map(doc.components.map((c) => [c.id, c.kind]));
  const clampsOf = new Map<string, Array<{ id: string; label?: string; at: number }>>();
  for (const cl of doc.clamps ?? []) for (const wid of cl.wires) clampsOf.set(wid, [...(clampsOf.get(wid) ?? []), { id: cl.id, label: cl.label, at: cl.at ?? 0.5 }]);
  const clampMarks: string[] = [];
  for (const w of doc.wires) {
    const path = routeOfWire(w, kindOf, geom, pos);
    if (!path) continue;
    const paint = wirePaint(w.color);
    const hl = hlWires.has(w.id);
    if (hl) out.push(`<path d="${path.d}" stroke="${ACCENT}" stroke-width="11" stroke-opacity="0.45"/>`);
    out.push(`<path d="${path.d}" stroke="${INK}" stroke-width="${hl ? 6.5 : 5.5}"/>`);
    out.push(`<path d="${path.d}" stroke="${paint.base}" stroke-width="${hl ? 4.5 : 3.5}"><title>${esc(wireLabel(w))}</title></path>`);
    if (paint.stripe) out.push(`<path d="${path.d}" stroke="${paint.stripe}" stroke-width="${hl ? 4.5 : 3.5}" stroke-dasharray="7 7" stroke-linecap="butt"/>`);
    const clamps = clampsOf.get(w.id) ?? [];
    for (const cl of clamps) clampMarks.push(clampSvg(path, cl, !options.compact));
    const clear = labelClearOf(clamps.map((c) => c.at));
    if (!options.compact) {
      labels.push(
        `<text x="${n(clear ? path.mx + 10 : path.mx)}" y="${n(path.my - 6)}" text-anchor="${clear ? 'start' : 'middle'}" font-size="12" fill="${hl ? ACCENT : INK}" font-weight="${hl ? 700 : 400}" stroke="#ffffff" stroke-width="4" paint-order="stroke">${esc(wireLabel(w))}</text>`,
      );
    }
  }
  out.push('</g>');
  out.push(`<g class="clamps">${clampMarks.join('')}</g>`);

  // Components.
  out.push('<g class="components">');
  for (const c of doc.components) {
    const p = pos[c.id];
    const g = geom.get(c.id)!;
    const d = componentDrawing(c, g, roles.get(c.id) ?? null);
    const accent = hlComps.has(c.id);
    out.push(`<g transform="translate(${n(p.x)} ${n(p.y)})" data-id="${esc(c.id)}">`);
    for (const s of d.shapes) out.push(shapeSvg(s, accent));
    for (const t of d.texts) if (!(options.compact && t.detail)) out.push(textSvg(t));
    for (const port of g.ports) {
      if (hlPins.has(`${c.id}.${port.pin}`)) out.push(`<circle cx="${n(port.x)}" cy="${n(port.y)}" r="6" fill="${ACCENT}" stroke="#ffffff" stroke-width="2"/>`);
    }
    out.push('</g>');
  }
  out.push('</g>');
  out.push(`<g class="labels">${labels.join('')}</g>`);

  // Markers: numbered discs at what they refer to, their labels in a key at the bottom.
  if (markers.length) {
    out.push('<g class="markers">');
    markers.forEach((m, i) => {
      const at = markerPoint(m.ref, doc, geom, pos);
      if (!at) return;
      out.push(`<circle cx="${n(at.x)}" cy="${n(at.y - 18)}" r="11" fill="${ACCENT}" stroke="#ffffff" stroke-width="2"/>`);
      out.push(`<text x="${n(at.x)}" y="${n(at.y - 13.5)}" text-anchor="middle" font-size="13" font-weight="700" fill="#ffffff">${i + 1}</text>`);
      out.push(`<text x="${n(at.x + 15)}" y="${n(at.y - 14)}" font-size="13" font-weight="700" fill="${ACCENT}" stroke="#ffffff" stroke-width="4" paint-order="stroke">${esc(m.label)}</text>`);
    });
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('');
}

/** What the zoomed-out overview marks over its picture, in the drawing's coordinates. */
export interface OverviewMarks {
  /** The wire paths to mark (walked, selected or live). */
  wires: Array<{ id: string; d: string; kind: 'walk' | 'selected' | 'live' }>;
  /** The boxes of the components to mark. */
  boxes: Array<{ id: string; x: number; y: number; w: number; h: number; kind: 'walk' | 'selected' }>;
}

/**
 * The marks the overview draws over its picture: the walked and selected wires and components, and
 * (with volts) the wires carrying more than half a volt. Only these are computed, not the whole drawing.
 */
export function overviewMarks(
  doc: HarnessDocument,
  positions: Positions,
  marks: { walkPins?: Iterable<string>; walkWires?: Iterable<string>; selectedComponents?: Iterable<string>; selectedWires?: Iterable<string>; volts?: ReadonlyMap<string, number | null> | null },
): OverviewMarks {
  const pos = fillPositions(doc, positions ?? {});
  const geom = documentGeometry(doc);
  const kindOf = new Map(doc.components.map((c) => [c.id, c.kind]));
  const walkWires = new Set(marks.walkWires ?? []);
  const selWires = new Set(marks.selectedWires ?? []);
  const volts = marks.volts;
  const wires: OverviewMarks['wires'] = [];
  for (const w of doc.wires) {
    const kind = selWires.has(w.id) ? 'selected' : walkWires.has(w.id) ? 'walk' : volts && Math.max(Math.abs(volts.get(w.from) ?? 0), Math.abs(volts.get(w.to) ?? 0)) > 0.5 ? 'live' : null;
    if (!kind) continue;
    const path = routeOfWire(w, kindOf, geom, pos);
    if (path) wires.push({ id: w.id, d: path.d, kind });
  }
  const boxes: OverviewMarks['boxes'] = [];
  const walkComps = new Set([...(marks.walkPins ?? [])].map((p) => splitRef(p)?.[0]).filter((x): x is string => !!x));
  const selComps = new Set(marks.selectedComponents ?? []);
  for (const id of new Set([...selComps, ...walkComps])) {
    const p = pos[id];
    const g = geom.get(id);
    if (p && g) boxes.push({ id, x: p.x, y: p.y, w: g.width, h: g.height, kind: selComps.has(id) ? 'selected' : 'walk' });
  }
  return { wires, boxes };
}

/** A clamp on its wire, as the editor draws it. */
function clampSvg(path: WirePath, cl: { id: string; label?: string; at: number }, withLabel: boolean): string {
  const p = pointAlong(path, cl.at);
  const t = clampLabelAt(p);
  const shapes = clampShapes.map((s) => shapeSvg(s, false)).join('');
  const label = withLabel ? `<text x="${n(t.x)}" y="${n(t.y)}" font-size="11" font-weight="700" stroke="#ffffff" stroke-width="3" paint-order="stroke">${esc(cl.id)}</text>` : '';
  const title = `<title>${esc(cl.label ? `${cl.id}: ${cl.label}` : cl.id)}</title>`;
  return `<g data-clamp="${esc(cl.id)}">${title}<g transform="translate(${n(p.x)} ${n(p.y)}) rotate(${Math.round(p.angle)})">${shapes}</g>${label}</g>`;
}

function markerPoint(ref: string, doc: HarnessDocument, geom: Map<string, NodeGeom>, pos: Positions): { x: number; y: number } | null {
  const pin = pinPoint(ref, geom, pos);
  if (pin) return pin;
  const comp = pos[ref];
  if (comp && geom.has(ref)) return { x: comp.x + geom.get(ref)!.width / 2, y: comp.y };
  const clamp = doc.clamps.find((c) => c.id === ref);
  const clampWire = clamp ? doc.wires.find((w) => w.id === clamp.wires[0]) : undefined;
  if (clamp && clampWire) {
    // On the clamp itself, where it is drawn on its first wire.
    const path = routeOfWire(clampWire, new Map(doc.components.map((c) => [c.id, c.kind])), geom, pos);
    if (path) return pointAlong(path, clamp.at ?? 0.5);
  }
  const wire = doc.wires.find((w) => w.id === ref) ?? clampWire;
  if (wire) {
    const a = pinPoint(wire.from, geom, pos);
    const b = pinPoint(wire.to, geom, pos);
    if (a && b) return { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
  }
  return null;
}

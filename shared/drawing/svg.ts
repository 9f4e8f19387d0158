/**
 * The drawing as an SVG string, with no DOM: the editor's drawing for a repair order's frozen,
 * marked-up view, the order page and the report PDF. Black ink on white, wire colours as they are
 * (with the letter code printed on every wire), the walked path in the accent colour, numbered
 * fault and note markers, optionally cropped to a viewport with a legend of the markers' notes.
 *
 * Pure TypeScript: no React, no browser API.
 */
import type { HarnessDocument } from '../harness';
import { documentGeometry, drawingBounds, fillPositions, mateRoles, matePairs, splitRef, type Box, type NodeGeom, type Point, type Positions } from './geometry';
import { componentDrawing, printPaints, type Shape, type TextItem } from './symbols';
import { clampLabelAt, clampShapes, labelClearOf, pinPoint, pointAlong, routeOfWire, wireLabel, wirePaint, type WirePath } from './wires';

export interface Highlight {
  /** Pin refs (`X12.3`): a dot on each, and their components in the accent colour. */
  pins?: string[];
  wires?: string[];
  /** Components drawn in the accent colour. */
  components?: string[];
}

export type MarkerKind = 'fault' | 'note';

export interface Marker {
  /** A fault (a red disc with a cross) or a note (a dark square); a note when absent. */
  kind?: MarkerKind;
  /** What it points at: a pin (`X12.3`), a wire id, a component id or a clamp id. */
  ref?: string | null;
  /** Its centre in drawing coordinates; beside `ref` when absent (see `markerCentres`). */
  x?: number;
  y?: number;
  label: string;
}

/** A part of the drawing, in drawing coordinates. */
export interface Viewport {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface SvgOptions {
  /** Leave out the labels of wires and pin captions (a smaller image). */
  compact?: boolean;
  title?: string;
  /** Show only this part of the drawing; the whole drawing (and every marker) when absent. */
  viewport?: Viewport | null;
  /** List the markers' notes under the drawing, numbered as on it, instead of beside each marker. */
  legend?: boolean;
  /** The widest the image says it is, in px; a wider view is scaled down, the legend's text stays this legible. */
  maxWidth?: number;
}

const paints = printPaints;
const { ink: INK, muted: MUTED, accent: ACCENT } = paints;
/** The bench mode's "bad" ink: faults read as faults in print too (with their own shape and word). */
const FAULT = '#8a1712';
const RULE = '#9a968d';

/** Text for XML: the five special characters escaped, characters XML 1.0 does not allow removed. */
export const escapeXml = (s: string) =>
  s
    .replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] as string)
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '');
const esc = escapeXml;
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

/** Components a highlight touches: its components, its pins' components and its wires' ends. */
function touched(doc: HarnessDocument, highlight: Highlight): Set<string> {
  const out = new Set(highlight.components ?? []);
  for (const p of highlight.pins ?? []) {
    const c = splitRef(p)?.[0];
    if (c) out.add(c);
  }
  const wires = new Set(highlight.wires ?? []);
  for (const w of doc.wires) {
    if (!wires.has(w.id)) continue;
    for (const end of [w.from, w.to]) {
      const c = splitRef(end)?.[0];
      if (c) out.add(c);
    }
  }
  return out;
}

/** Room round what a frame shows, and the least it shows (one small fuse alone would fill a page). */
const FRAME_MARGIN = 40;
const FRAME_MIN = { width: 600, height: 300 };
const MARKER_REACH = 26;

/**
 * The part of the drawing a highlight and its markers are about: the boxes of the components it
 * touches and the markers at `points`, with a margin; null when it touches nothing. With the
 * `maxWidth` the picture will be shown at, the markers' room grows as they will (see renderDrawingSvg).
 */
export function highlightFrame(doc: HarnessDocument, positions: Positions, highlight: Highlight, points: Point[] = [], maxWidth?: number): Viewport | null {
  const pos = fillPositions(doc, positions ?? {});
  const geom = documentGeometry(doc);
  const boxes: Box[] = [];
  for (const id of touched(doc, highlight)) {
    const p = pos[id];
    const g = geom.get(id);
    if (p && g) boxes.push({ x: p.x, y: p.y, w: g.width, h: g.height });
  }
  if (!boxes.length) return null;
  const frame = (room: number): Viewport => {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (const b of [...boxes, ...points.map((p) => ({ x: p.x - room, y: p.y - room, w: 2 * room, h: 2 * room }))]) {
      minX = Math.min(minX, b.x);
      minY = Math.min(minY, b.y);
      maxX = Math.max(maxX, b.x + b.w);
      maxY = Math.max(maxY, b.y + b.h);
    }
    const width = Math.max(FRAME_MIN.width, maxX - minX + 2 * FRAME_MARGIN);
    const height = Math.max(FRAME_MIN.height, maxY - minY + 2 * FRAME_MARGIN);
    return { x: (minX + maxX - width) / 2, y: (minY + maxY - height) / 2, width, height };
  };
  // A marker with its cross reaches about 26 units from its centre, times the scale it is drawn at.
  const first = frame(MARKER_REACH);
  return maxWidth && first.width > maxWidth ? frame((MARKER_REACH * first.width) / maxWidth) : first;
}

/**
 * Where a marker on `ref` goes: just off what it points at, so it hides neither it nor its label.
 * A pin: outside its component, above the pin; a component: its top right corner; a clamp: above
 * it on its first wire; a wire: under its middle (its label is above).
 */
function markerBeside(ref: string, doc: HarnessDocument, geom: ReadonlyMap<string, NodeGeom>, pos: Positions, kindOf: ReadonlyMap<string, string>): Point | null {
  const pin = pinPoint(ref, geom, pos);
  if (pin) return { x: pin.x + (pin.side === 'left' ? -16 : 16), y: pin.y - 16 };
  const comp = pos[ref];
  const g = geom.get(ref);
  if (comp && g) return { x: comp.x + g.width + 2, y: comp.y - 14 };
  const clamp = doc.clamps.find((c) => c.id === ref);
  const wire = doc.wires.find((w) => w.id === (clamp ? clamp.wires[0] : ref));
  const path = wire ? routeOfWire(wire, kindOf, geom, pos) : null;
  if (!path) return null;
  if (!clamp) return { x: path.mx, y: path.my + 20 };
  const at = pointAlong(path, clamp.at ?? 0.5);
  return { x: at.x, y: at.y - 24 };
}

/** Where each marker's centre is: its own x, y; else beside what it points at; else in a row at the drawing's top left. */
export function markerCentres(doc: HarnessDocument, positions: Positions, markers: Marker[]): Point[] {
  const pos = fillPositions(doc, positions ?? {});
  const geom = documentGeometry(doc);
  const kindOf = new Map(doc.components.map((c) => [c.id, c.kind]));
  const bounds = drawingBounds(doc, pos, geom);
  return markers.map((m, i) => {
    if (typeof m.x === 'number' && typeof m.y === 'number' && Number.isFinite(m.x) && Number.isFinite(m.y)) return { x: m.x, y: m.y };
    return (m.ref ? markerBeside(m.ref, doc, geom, pos, kindOf) : null) ?? { x: bounds.x + 20 + i * 30, y: bounds.y + 20 };
  });
}

/** A marker's numbered shape, centred on 0, 0: a fault is a disc with a cross beside it, a note a square. */
function markerGlyph(kind: MarkerKind, number: number): string {
  const digits = `<text y="5" text-anchor="middle" font-size="14" font-weight="700" fill="#ffffff">${number}</text>`;
  if (kind === 'fault') {
    return `<circle r="13" fill="${FAULT}" stroke="#ffffff" stroke-width="2.5"/>${digits}<path d="M10 -18l8 8m0 -8l-8 8" stroke="#ffffff" stroke-width="6" stroke-linecap="round"/><path d="M10 -18l8 8m0 -8l-8 8" stroke="${FAULT}" stroke-width="3" stroke-linecap="round"/>`;
  }
  return `<rect x="-12" y="-12" width="24" height="24" rx="3" fill="${INK}" stroke="#ffffff" stroke-width="2.5"/>${digits}`;
}

const markerWord = (kind: MarkerKind) => (kind === 'fault' ? 'FAULT' : 'NOTE');

/** Words into lines of at most `width` characters (a longer word gets a line of its own). */
function wrap(text: string, first: number, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  let room = first;
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > room) {
      lines.push(line);
      line = word;
      room = width;
    } else line = line ? `${line} ${word}` : word;
  }
  lines.push(line);
  return lines;
}

/** The legend's text size in px as shown, and the characters of Roboto Condensed that fit per px (about 0.45 em each). */
const LEGEND_PX = 14;
const CHARS_PER_PX = 1 / (LEGEND_PX * 0.48);

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
  const hlComps = new Set([...(highlight.components ?? []), ...[...hlPins].map((p) => splitRef(p)?.[0]).filter((x): x is string => !!x)]);
  const centres = markerCentres(doc, pos, markers);

  const whole = drawingBounds(doc, pos, geom);
  let view: Viewport = { x: whole.x, y: whole.y, width: whole.w, height: whole.h };
  if (options.viewport) view = options.viewport;
  else if (centres.length) {
    // Markers placed by hand may sit off the components: keep them in the picture.
    const minX = Math.min(view.x, ...centres.map((c) => c.x - 30));
    const minY = Math.min(view.y, ...centres.map((c) => c.y - 30));
    const maxX = Math.max(view.x + view.width, ...centres.map((c) => c.x + 30));
    const maxY = Math.max(view.y + view.height, ...centres.map((c) => c.y + 30));
    view = { x: minX, y: minY, width: maxX - minX, height: maxY - minY };
  }

  // Shown width in px, and drawing units per shown px (the legend is sized in shown px).
  const shown = options.maxWidth ? Math.min(view.width, options.maxWidth) : view.width;
  const k = view.width / shown;
  const legend = options.legend && markers.length ? legendSvg(markers, view, shown, k) : null;
  const total = view.height + (legend?.height ?? 0);
  const clip = !!(options.viewport || legend);

  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="${n(view.x)} ${n(view.y)} ${n(view.width)} ${n(total)}" width="${n(shown)}" height="${n(total / k)}" font-family="'Roboto Condensed', 'Arial Narrow', 'DejaVu Sans Condensed', sans-serif" fill="${INK}">`,
  );
  out.push(`<title>${esc(options.title ?? doc.name)}</title>`);
  out.push(`<rect x="${n(view.x)}" y="${n(view.y)}" width="${n(view.width)}" height="${n(total)}" fill="#ffffff"/>`);
  if (clip) {
    // The crop: nothing of the drawing spills past the viewport (or over the legend).
    out.push(`<defs><clipPath id="ww-view"><rect x="${n(view.x)}" y="${n(view.y)}" width="${n(view.width)}" height="${n(view.height)}"/></clipPath></defs>`);
    out.push('<g clip-path="url(#ww-view)">');
  }

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

  // Wires, the highlighted ones last so the walked path lies on top where wires cross.
  out.push('<g class="wires" fill="none" stroke-linecap="round">');
  const labels: string[] = [];
  const kindOf = new Map(doc.components.map((c) => [c.id, c.kind]));
  const clampsOf = new Map<string, Array<{ id: string; label?: string; at: number }>>();
  for (const cl of doc.clamps ?? []) for (const wid of cl.wires) clampsOf.set(wid, [...(clampsOf.get(wid) ?? []), { id: cl.id, label: cl.label, at: cl.at ?? 0.5 }]);
  const clampMarks: string[] = [];
  const wires = [...doc.wires.filter((w) => !hlWires.has(w.id)), ...doc.wires.filter((w) => hlWires.has(w.id))];
  for (const w of wires) {
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

  // Markers: numbered shapes at what they refer to, as large as shown as the legend is; their notes beside them or in the legend.
  if (markers.length) {
    out.push('<g class="markers">');
    const scale = k === 1 ? '' : ` scale(${n(k)})`;
    markers.forEach((m, i) => {
      const kind = m.kind ?? 'note';
      const at = centres[i];
      out.push(`<g data-marker="${i + 1}" data-kind="${kind}" transform="translate(${n(at.x)} ${n(at.y)})${scale}">${markerGlyph(kind, i + 1)}</g>`);
      if (!legend) {
        out.push(`<text x="${n(at.x + 21 * k)}" y="${n(at.y + 5 * k)}" font-size="${n(13 * k)}" font-weight="700" fill="${kind === 'fault' ? FAULT : INK}" stroke="#ffffff" stroke-width="${n(4 * k)}" paint-order="stroke">${esc(m.label)}</text>`);
      }
    });
    out.push('</g>');
  }
  if (clip) out.push('</g>');
  if (legend) out.push(legend.svg);
  out.push('</svg>');
  return out.join('');
}

/** The markers' notes under the drawing: the marker's shape, its number, FAULT or NOTE, what it is at, the note (wrapped). */
function legendSvg(markers: Marker[], view: Viewport, shown: number, k: number): { svg: string; height: number } {
  const line = 20 * k;
  const pad = 12 * k;
  const indent = 34 * k;
  const perLine = Math.max(20, Math.floor((shown - 34 - 12) * CHARS_PER_PX));
  const top = view.y + view.height;
  const rows: string[] = [];
  let y = top + pad;
  markers.forEach((m, i) => {
    const kind = m.kind ?? 'note';
    const head = `${i + 1}. ${markerWord(kind)}${m.ref ? ` at ${m.ref}` : ''}:`;
    const lines = wrap(m.label, perLine - head.length - 1, perLine);
    const base = y + line * 0.75;
    rows.push(`<g transform="translate(${n(view.x + pad + 12 * k * 0.7)} ${n(base - 5 * k)}) scale(${n(k * 0.7)})">${markerGlyph(kind, i + 1)}</g>`);
    rows.push(
      `<text x="${n(view.x + indent)}" y="${n(base)}" font-size="${n(LEGEND_PX * k)}"><tspan font-weight="700" fill="${kind === 'fault' ? FAULT : INK}">${esc(head)}</tspan> ${esc(lines[0])}</text>`,
    );
    for (const more of lines.slice(1)) {
      y += line;
      rows.push(`<text x="${n(view.x + indent)}" y="${n(y + line * 0.75)}" font-size="${n(LEGEND_PX * k)}">${esc(more)}</text>`);
    }
    y += line;
  });
  const height = y - top + pad;
  const rule = `<path d="M${n(view.x)} ${n(top)}H${n(view.x + view.width)}" stroke="${RULE}" stroke-width="${n(k)}"/>`;
  return { svg: `<g class="legend">${rule}${rows.join('')}</g>`, height };
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

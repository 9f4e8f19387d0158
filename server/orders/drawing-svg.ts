import type { Highlight, Marker, Viewport } from '../../shared/api/orders';
import { fixedPins, pinsKeyOf, type Positions } from '../harness/rows';

/**
 * The marked-up drawing as a standalone SVG for the report and the order page: components as
 * boxes with their pins, wires between pins, the walked path in the accent colour, fault
 * markers (a circle with a cross) and note markers (a square), numbered, with a legend of their
 * notes under the drawing. Pure: a document and positions in, a string out.
 *
 * Our own simple renderer for print. The interactive drawing lives in src/features/drawing.
 */
type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

const INK = '#1b1c1e';
const MUTED = '#4f5257';
const LINE = '#9a968d';
const ACCENT = '#4536a6';
const FAULT = '#8a1712';
const FONT = "'Roboto Condensed', 'Arial Narrow', 'DejaVu Sans Condensed', sans-serif";
const BOX_W = 150;
const HEAD = 30;
const ROW = 16;

export const escapeXml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] as string)
    // Characters XML 1.0 does not allow.
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f]/g, '');

function pinIds(component: Obj): string[] {
  const key = pinsKeyOf(component);
  if (key) {
    return (component[key] as unknown[]).map((p) => (isObj(p) ? String(p.id) : String(p)));
  }
  return fixedPins(component);
}

interface Box {
  id: string;
  label: string;
  kind: string;
  x: number;
  y: number;
  w: number;
  h: number;
  pins: string[];
}

export interface DrawingInput {
  document: unknown;
  positions: Positions;
  highlight: Highlight;
  markers: Marker[];
  viewport: Viewport | null;
  title?: string;
}

export function layoutBoxes(document: unknown, positions: Positions): Box[] {
  const doc = isObj(document) ? document : {};
  const comps = Array.isArray(doc.components) ? doc.components.filter(isObj) : [];
  return comps.map((c, i) => {
    const id = String(c.id);
    const pins = pinIds(c);
    const p = positions[id] ?? { x: (i % 4) * 260, y: Math.floor(i / 4) * 220 };
    return { id, label: typeof c.label === 'string' && c.label ? c.label : id, kind: String(c.kind ?? ''), x: p.x, y: p.y, w: BOX_W, h: HEAD + Math.max(1, pins.length) * ROW + 6, pins };
  });
}

function pinPoint(box: Box, pin: string, towardsX: number): { x: number; y: number; side: 1 | -1 } {
  const index = Math.max(0, box.pins.indexOf(pin));
  const y = box.y + HEAD + index * ROW + ROW / 2;
  const right = towardsX >= box.x + box.w / 2;
  return { x: right ? box.x + box.w : box.x, y, side: right ? 1 : -1 };
}

/** The ids a highlight touches: its components, its pins' components, its wires' ends. */
export function touchedComponents(document: unknown, highlight: Highlight): string[] {
  const doc = isObj(document) ? document : {};
  const order: string[] = [];
  const add = (id: string) => {
    if (id && !order.includes(id)) order.push(id);
  };
  for (const p of highlight.pins ?? []) add(p.split('.')[0]);
  for (const c of highlight.components ?? []) add(c);
  const hi = new Set(highlight.wires ?? []);
  for (const w of Array.isArray(doc.wires) ? doc.wires.filter(isObj) : []) {
    if (!hi.has(String(w.id))) continue;
    add(String(w.from ?? '').split('.')[0]);
    add(String(w.to ?? '').split('.')[0]);
  }
  return order;
}

/**
 * The boxes to draw. With a saved layout: every component where the drawing has it. Without one
 * (a document never laid out in the editor) and with a highlight: only what the walk touches,
 * in walk order, four to a row, so the path reads at a glance.
 */
export function drawingLayout(document: unknown, positions: Positions, highlight: Highlight): Box[] {
  const all = layoutBoxes(document, positions);
  const touched = touchedComponents(document, highlight);
  if (Object.keys(positions).length > 0 || touched.length === 0) return all;
  const byId = new Map(all.map((b) => [b.id, b]));
  let y = 0;
  let rowH = 0;
  return touched
    .map((id) => byId.get(id))
    .filter((b): b is Box => !!b)
    .map((b, i) => {
      if (i % 4 === 0 && i > 0) {
        y += rowH + 60;
        rowH = 0;
      }
      rowH = Math.max(rowH, b.h);
      return { ...b, x: (i % 4) * 260, y };
    });
}

/** The bounds of everything drawn, with a margin. */
export function drawingBounds(boxes: Box[], markers: Marker[]): Viewport {
  if (!boxes.length && !markers.length) return { x: 0, y: 0, width: 400, height: 200 };
  const xs = [...boxes.flatMap((b) => [b.x, b.x + b.w]), ...markers.map((m) => m.x)];
  const ys = [...boxes.flatMap((b) => [b.y, b.y + b.h]), ...markers.map((m) => m.y)];
  const minX = Math.min(...xs) - 40;
  const minY = Math.min(...ys) - 40;
  return { x: minX, y: minY, width: Math.max(...xs) + 40 - minX, height: Math.max(...ys) + 40 - minY };
}

export function renderMarkupSvg(input: DrawingInput): string {
  const doc = isObj(input.document) ? input.document : {};
  const boxes = drawingLayout(doc, input.positions, input.highlight);
  const byId = new Map(boxes.map((b) => [b.id, b]));
  const hiComponents = new Set(input.highlight.components ?? []);
  const hiWires = new Set(input.highlight.wires ?? []);
  const hiPins = new Set(input.highlight.pins ?? []);
  // No viewport saved: frame what the walk and the markers touch (the whole drawing when nothing is).
  const touched = new Set<string>(hiComponents);
  for (const w of Array.isArray(doc.wires) ? doc.wires.filter(isObj) : []) {
    if (!hiWires.has(String(w.id))) continue;
    touched.add(String(w.from ?? '').split('.')[0]);
    touched.add(String(w.to ?? '').split('.')[0]);
  }
  for (const p of hiPins) touched.add(p.split('.')[0]);
  const framed = boxes.filter((b) => touched.has(b.id));
  const view = input.viewport ?? drawingBounds(framed.length ? framed : boxes, input.markers);
  const legendRows = input.markers.length;
  const scale = Math.max(1, view.width / 900);
  const legendLine = 22 * scale;
  const legendH = legendRows ? legendRows * legendLine + 20 * scale : 0;
  const out: string[] = [];
  const totalH = view.height + legendH;
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="${view.x} ${view.y} ${view.width} ${totalH}" width="${Math.round(view.width / scale)}" height="${Math.round(totalH / scale)}" font-family="${FONT}">`,
  );
  out.push(`<rect x="${view.x}" y="${view.y}" width="${view.width}" height="${totalH}" fill="#ffffff"/>`);
  if (input.title) out.push(`<title>${escapeXml(input.title)}</title>`);

  // Wires first, under the boxes; highlighted ones last so they sit on top.
  const wires = Array.isArray(doc.wires) ? doc.wires.filter(isObj) : [];
  const sorted = [...wires].sort((a, b) => Number(hiWires.has(String(a.id))) - Number(hiWires.has(String(b.id))));
  for (const w of sorted) {
    const [fc, fp] = String(w.from ?? '').split('.');
    const [tc, tp] = String(w.to ?? '').split('.');
    const a = byId.get(fc);
    const b = byId.get(tc);
    if (!a || !b) continue;
    const pa = pinPoint(a, fp, b.x + b.w / 2);
    const pb = pinPoint(b, tp, a.x + a.w / 2);
    const hi = hiWires.has(String(w.id));
    const d = Math.max(40, Math.abs(pb.x - pa.x) / 2);
    out.push(
      `<path d="M${pa.x} ${pa.y} C${pa.x + pa.side * d} ${pa.y} ${pb.x + pb.side * d} ${pb.y} ${pb.x} ${pb.y}" fill="none" stroke="${hi ? ACCENT : LINE}" stroke-width="${hi ? 5 : 1.6}" stroke-linecap="round"${hi ? '' : ' stroke-opacity="0.9"'}/>`,
    );
    if (hi) {
      const mx = (pa.x + pb.x) / 2;
      const my = (pa.y + pb.y) / 2 - 6;
      const label = [w.id, w.color, w.circuit].filter((v) => typeof v === 'string' && v).join(' · ');
      out.push(`<text x="${mx}" y="${my}" text-anchor="middle" font-size="12" font-weight="700" fill="${ACCENT}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeXml(label)}</text>`);
    }
  }

  for (const b of boxes) {
    const hi = hiComponents.has(b.id);
    out.push(`<g>`);
    out.push(`<rect x="${b.x}" y="${b.y}" width="${b.w}" height="${b.h}" rx="4" fill="#ffffff" stroke="${hi ? ACCENT : INK}" stroke-width="${hi ? 3.5 : 1.2}"/>`);
    out.push(`<text x="${b.x + 8}" y="${b.y + 13}" font-size="12" font-weight="700" fill="${INK}">${escapeXml(b.id)}</text>`);
    out.push(`<text x="${b.x + 8}" y="${b.y + 25}" font-size="10" fill="${MUTED}">${escapeXml(truncate(b.label === b.id ? b.kind : b.label, 26))}</text>`);
    b.pins.forEach((pin, i) => {
      const y = b.y + HEAD + i * ROW + ROW / 2;
      const ref = `${b.id}.${pin}`;
      const ph = hiPins.has(ref);
      out.push(`<circle cx="${b.x}" cy="${y}" r="2.5" fill="${ph ? ACCENT : INK}"/><circle cx="${b.x + b.w}" cy="${y}" r="2.5" fill="${ph ? ACCENT : INK}"/>`);
      out.push(`<text x="${b.x + b.w / 2}" y="${y + 4}" text-anchor="middle" font-size="11" fill="${ph ? ACCENT : INK}"${ph ? ' font-weight="700"' : ''}>${escapeXml(pin)}</text>`);
    });
    out.push(`</g>`);
  }

  input.markers.forEach((m, i) => {
    const n = String(i + 1);
    if (m.kind === 'fault') {
      out.push(`<circle cx="${m.x}" cy="${m.y}" r="13" fill="${FAULT}" stroke="#ffffff" stroke-width="2.5"/>`);
      out.push(`<text x="${m.x}" y="${m.y + 5}" text-anchor="middle" font-size="14" font-weight="700" fill="#ffffff">${n}</text>`);
      out.push(`<path d="M${m.x + 10} ${m.y - 18} l8 8 m0 -8 l-8 8" stroke="${FAULT}" stroke-width="3"/>`);
    } else {
      out.push(`<rect x="${m.x - 12}" y="${m.y - 12}" width="24" height="24" rx="3" fill="${INK}" stroke="#ffffff" stroke-width="2.5"/>`);
      out.push(`<text x="${m.x}" y="${m.y + 5}" text-anchor="middle" font-size="14" font-weight="700" fill="#ffffff">${n}</text>`);
    }
  });

  if (legendRows) {
    const top = view.y + view.height;
    out.push(`<line x1="${view.x}" x2="${view.x + view.width}" y1="${top}" y2="${top}" stroke="${LINE}" stroke-width="${scale}"/>`);
    input.markers.forEach((m, i) => {
      const y = top + 10 * scale + (i + 0.75) * legendLine;
      const word = m.kind === 'fault' ? 'FAULT' : 'NOTE';
      out.push(
        `<text x="${view.x + 12 * scale}" y="${y}" font-size="${14 * scale}" fill="${m.kind === 'fault' ? FAULT : INK}"><tspan font-weight="700">${i + 1}. ${word}${m.target ? ` at ${escapeXml(m.target)}` : ''}:</tspan> <tspan fill="${INK}">${escapeXml(truncate(m.text, 120))}</tspan></text>`,
      );
    });
  }
  out.push('</svg>');
  return out.join('\n');
}

function truncate(s: string, n: number): string {
  return s.length > n ? `${s.slice(0, n - 1)}…` : s;
}

import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Highlight, Marker, MarkerInput } from '../../shared/api/orders';
import { harnesses, revisions } from '../db/schema/harness';
import type { orderDrawings } from '../db/schema/orders';
import { drawingLayout, renderMarkupSvg } from './drawing-svg';
import { HttpError } from '../errors';
import { loadDocument } from '../harness/store';
import type { Positions } from '../harness/rows';
import type { DbOrTx } from './settings';

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The revision of the shop with its document and positions, frozen for a marked-up drawing. */
export async function revisionSnapshot(db: DbOrTx, shopId: string, revisionId: string) {
  const [rev] = await db
    .select({ id: revisions.id, number: revisions.number, harnessName: harnesses.name, name: revisions.name })
    .from(revisions)
    .innerJoin(harnesses, eq(harnesses.id, revisions.harnessId))
    .where(and(eq(revisions.id, revisionId), eq(revisions.shopId, shopId)))
    .limit(1);
  if (!rev) throw new HttpError(400, 'invalid_request', 'The harness revision was not found in this shop.', [{ path: '$.revisionId', message: 'No such revision' }]);
  const loaded = await loadDocument(db, revisionId);
  if (!loaded) throw new HttpError(400, 'invalid_request', 'The harness revision has no document.', [{ path: '$.revisionId', message: 'No document' }]);
  return { revision: rev, document: loaded.document as Obj, positions: loaded.positions as Positions };
}

/** Highlighted ids and marker targets must name things of the document: 400 listing each that does not. */
export function checkAgainstDocument(document: Obj, highlight: Highlight | undefined, markers: MarkerInput[] | undefined): void {
  const components = new Set<string>();
  const pins = new Set<string>();
  for (const c of Array.isArray(document.components) ? document.components.filter(isObj) : []) {
    components.add(String(c.id));
    const list = Array.isArray(c.cavities) ? c.cavities : Array.isArray(c.pins) ? c.pins : null;
    if (list) for (const p of list) pins.add(`${String(c.id)}.${isObj(p) ? String(p.id) : String(p)}`);
  }
  const wires = new Set((Array.isArray(document.wires) ? document.wires.filter(isObj) : []).map((w) => String(w.id)));
  for (const w of Array.isArray(document.wires) ? document.wires.filter(isObj) : []) {
    pins.add(String(w.from));
    pins.add(String(w.to));
  }
  const problems: { path: string; message: string }[] = [];
  highlight?.components?.forEach((c, i) => components.has(c) || problems.push({ path: `$.highlight.components[${i}]`, message: `No component ${c} in this revision` }));
  highlight?.wires?.forEach((w, i) => wires.has(w) || problems.push({ path: `$.highlight.wires[${i}]`, message: `No wire ${w} in this revision` }));
  highlight?.pins?.forEach((p, i) => pins.has(p) || components.has(p.split('.')[0]) || problems.push({ path: `$.highlight.pins[${i}]`, message: `No pin ${p} in this revision` }));
  markers?.forEach((m, i) => {
    if (m.target && !components.has(m.target) && !wires.has(m.target) && !pins.has(m.target) && !components.has(m.target.split('.')[0])) {
      problems.push({ path: `$.markers[${i}].target`, message: `Nothing called ${m.target} in this revision` });
    }
  });
  if (problems.length) throw new HttpError(400, 'invalid_request', `The drawing names what is not in the revision: ${problems[0].message}.`, problems);
}

export function drawingSvg(row: typeof orderDrawings.$inferSelect): string {
  return renderMarkupSvg({
    document: row.snapshot.document,
    positions: row.snapshot.positions ?? {},
    highlight: row.highlight,
    markers: row.markers,
    viewport: row.viewport ?? null,
    title: row.title,
  });
}

/** PNG at up to 1800 px wide, for the PDF and the customer view. */
export async function drawingPng(row: typeof orderDrawings.$inferSelect): Promise<Buffer> {
  const svg = Buffer.from(drawingSvg(row));
  const meta = await sharp(svg).metadata();
  const density = Math.min(300, Math.max(72, Math.round((72 * 1800) / Math.max(1, meta.width ?? 900))));
  return sharp(svg, { density }).png().toBuffer();
}

/** Markers without coordinates go on their target (a component's corner, a pin's row, a wire's middle). */
export function placeMarkers(document: Obj, positions: Positions, markers: MarkerInput[], highlight: Highlight): Marker[] {
  const boxes = new Map(drawingLayout(document, positions, highlight).map((b) => [b.id, b]));
  const wires = new Map((Array.isArray(document.wires) ? document.wires.filter(isObj) : []).map((w) => [String(w.id), w]));
  const pinPoint = (ref: string) => {
    const [c, p] = ref.split('.');
    const b = boxes.get(c);
    if (!b) return null;
    if (p === undefined) return { x: b.x + b.w - 6, y: b.y + 4 };
    const i = Math.max(0, b.pins.indexOf(p));
    return { x: b.x + b.w + 14, y: b.y + 30 + i * 16 + 8 };
  };
  return markers.map((m, i) => {
    if (typeof m.x === 'number' && typeof m.y === 'number') return { kind: m.kind, x: m.x, y: m.y, text: m.text, target: m.target ?? null };
    let at: { x: number; y: number } | null = null;
    if (m.target) {
      const w = wires.get(m.target);
      if (w) {
        const a = pinPoint(String(w.from));
        const b = pinPoint(String(w.to));
        if (a && b) at = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
      } else at = pinPoint(m.target);
    }
    return { kind: m.kind, x: at?.x ?? 20 + i * 30, y: at?.y ?? 20, text: m.text, target: m.target ?? null };
  });
}

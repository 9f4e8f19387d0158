import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Highlight, Marker, MarkerInput } from '../../shared/api/orders';
import { highlightFrame, markerCentres, renderDrawingSvg, type Marker as DrawnMarker } from '../../shared/drawing/svg';
import type { HarnessDocument } from '../../shared/harness';
import { componentPinIds } from '../../shared/harness/pins';
import { harnesses, revisions } from '../db/schema/harness';
import type { orderDrawings } from '../db/schema/orders';
import { HttpError } from '../errors';
import { validOrThrow } from '../harness/revisions';
import { loadDocument } from '../harness/store';
import type { Positions } from '../harness/rows';
import type { DbOrTx } from './settings';

type DrawingRow = typeof orderDrawings.$inferSelect;

/**
 * A stored document as the harness document it is. Revisions are validated when saved and a
 * snapshot when frozen, so this only fails on a damaged row: 422 `invalid_document` then.
 */
export const harnessDocumentOf = (input: unknown): HarnessDocument => validOrThrow(input) as unknown as HarnessDocument;

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
  return { revision: rev, document: harnessDocumentOf(loaded.document), positions: loaded.positions };
}

/** Highlighted ids and marker targets must name things of the document: 400 listing each that does not. */
export function checkAgainstDocument(document: HarnessDocument, highlight: Highlight | undefined, markers: MarkerInput[] | undefined): void {
  const components = new Set(document.components.map((c) => c.id));
  const pins = new Set(document.components.flatMap((c) => componentPinIds(c).map((p) => `${c.id}.${p}`)));
  const wires = new Set(document.wires.map((w) => w.id));
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

/** The width the image says it is (the order page scales it; the PNG is drawn at twice this). */
const SHOWN_WIDTH = 900;

const drawn = (m: Pick<MarkerInput, 'kind' | 'x' | 'y' | 'text' | 'target'>): DrawnMarker => ({ kind: m.kind, x: m.x, y: m.y, label: m.text, ref: m.target ?? null });

/**
 * The marked-up drawing as the editor draws it (shared/drawing): cropped to the saved viewport, or
 * else to what the walk and the markers touch, with the markers' notes listed under it.
 */
export function drawingSvg(row: DrawingRow): string {
  const document = harnessDocumentOf(row.snapshot.document);
  const positions = row.snapshot.positions ?? {};
  const markers = row.markers.map(drawn);
  const viewport = row.viewport ?? highlightFrame(document, positions, row.highlight, markerCentres(document, positions, markers), SHOWN_WIDTH);
  return renderDrawingSvg(document, positions, row.highlight, markers, { title: row.title, viewport, legend: true, maxWidth: SHOWN_WIDTH });
}

/** PNG at up to 1800 px wide, for the PDF and the customer view. */
export async function drawingPng(row: DrawingRow): Promise<Buffer> {
  const svg = Buffer.from(drawingSvg(row));
  const meta = await sharp(svg).metadata();
  const density = Math.min(300, Math.max(72, Math.round((72 * 1800) / Math.max(1, meta.width ?? 900))));
  return sharp(svg, { density }).png().toBuffer();
}

/** Markers without coordinates go beside their target, where the drawing shows them (shared/drawing's markerCentres). */
export function placeMarkers(document: HarnessDocument, positions: Positions, markers: MarkerInput[]): Marker[] {
  const centres = markerCentres(document, positions, markers.map(drawn));
  return markers.map((m, i) => ({ kind: m.kind, x: centres[i].x, y: centres[i].y, text: m.text, target: m.target ?? null }));
}

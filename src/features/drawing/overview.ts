/**
 * The zoomed-out overview of a big drawing, painted as one picture: every
 * component's shapes, mated pairs, wires in their colours (stripes dashed)
 * and clamps, no text (none could be read that far out). The overview worker
 * paints it on an OffscreenCanvas and hands it over as a PNG, which the page
 * shows as an image: the browser decodes and rasters images off the main
 * thread, tile by tile and only where in view, so neither building nor
 * showing it costs the main thread more than handing over the document.
 *
 * Pure drawing code: a 2D context in, pixels out; no React, no DOM.
 */
import type { HarnessDocument } from '@shared/harness';
import { documentGeometry, drawingBounds, fillPositions, mateRoles, matePairs, type Box, type Positions } from '@shared/drawing/geometry';
import { componentDrawing, printPaints, type Shape } from '@shared/drawing/symbols';
import { clampShapes, pointAlong, routeOfWire, wirePaint } from '@shared/drawing/wires';

/** The longest side and the most pixels the bitmap may have (a 16 Mpx bitmap is 64 MB). */
export const OVERVIEW_MAX_SIDE = 8192;
export const OVERVIEW_MAX_PIXELS = 16_000_000;

export interface OverviewRaster {
  /** The drawing's box, in its own coordinates. */
  bounds: Box;
  /** Bitmap pixels per drawing unit. */
  scale: number;
  width: number;
  height: number;
}

/**
 * The bitmap for `bounds`: sharp at `sharpScale` (the zoom the overview hands over to the nodes,
 * times the screen's pixel ratio), less where that would pass the side or pixel limit.
 */
export function overviewRaster(bounds: Box, sharpScale: number): OverviewRaster {
  const scale = Math.min(sharpScale, OVERVIEW_MAX_SIDE / Math.max(bounds.w, bounds.h, 1), Math.sqrt(OVERVIEW_MAX_PIXELS / Math.max(1, bounds.w * bounds.h)));
  return { bounds, scale, width: Math.max(1, Math.ceil(bounds.w * scale)), height: Math.max(1, Math.ceil(bounds.h * scale)) };
}


type Context2D = OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D;

function paintShape(g: Context2D, s: Shape): void {
  g.beginPath();
  if (s.t === 'rect') {
    if (s.rx) g.roundRect(s.x, s.y, s.w, s.h, s.rx);
    else g.rect(s.x, s.y, s.w, s.h);
  } else if (s.t === 'circle') g.arc(s.cx, s.cy, s.r, 0, Math.PI * 2);
  const path = s.t === 'path' ? new Path2D(s.d) : undefined;
  if (s.fill && s.fill !== 'none') {
    g.fillStyle = printPaints[s.fill];
    if (path) g.fill(path);
    else g.fill();
  }
  if (s.stroke && s.stroke !== 'none') {
    g.strokeStyle = printPaints[s.stroke];
    g.lineWidth = s.sw ?? 1;
    if (path) g.stroke(path);
    else g.stroke();
  }
}

/** What every scale of the picture is painted from, worked out once: places, node geometry and the box. */
export interface OverviewScene {
  doc: HarnessDocument;
  pos: Positions;
  geom: ReturnType<typeof documentGeometry>;
  bounds: Box;
}

/** The scene at these positions (components without one get the grid place the SVG gives them). */
export function overviewScene(doc: HarnessDocument, positions: Positions): OverviewScene {
  const pos = fillPositions(doc, positions);
  const geom = documentGeometry(doc);
  return { doc, pos, geom, bounds: drawingBounds(doc, pos, geom) };
}

/** The drawing's box at these positions. */
export const overviewBounds = (doc: HarnessDocument, positions: Positions): Box => overviewScene(doc, positions).bounds;

/**
 * Paints the scene into `g`, which covers `raster` (its size and scale). Wires of one paint go in
 * one stroke: a few dozen strokes rather than thousands.
 */
export function paintOverview(g: Context2D, scene: OverviewScene, raster: OverviewRaster): void {
  const { doc, pos, geom } = scene;
  const roles = mateRoles(doc);
  const { bounds, scale } = raster;
  const base: [number, number, number, number, number, number] = [scale, 0, 0, scale, -bounds.x * scale, -bounds.y * scale];
  g.setTransform(...base);
  g.lineJoin = 'round';
  g.lineCap = 'round';

  // Mated pairs: the double bar between the mating faces.
  const mates = new Path2D();
  for (const [a, b] of matePairs(doc)) {
    const [pa, pb, ga] = [pos[a], pos[b], geom.get(a)];
    if (!pa || !pb || !ga) continue;
    for (const dy of [11, 17]) {
      mates.moveTo(pa.x + ga.width, pa.y + dy);
      mates.lineTo(pb.x, pb.y + dy);
    }
  }
  g.strokeStyle = printPaints.ink;
  g.lineWidth = 2;
  g.stroke(mates);

  // Wires: an ink edge under every one, then each colour, then the stripes.
  const kindOf = new Map(doc.components.map((c) => [c.id, c.kind]));
  const outline = new Path2D();
  const colours = new Map<string, Path2D>();
  const stripes = new Map<string, Path2D>();
  const routes = new Map<string, ReturnType<typeof routeOfWire>>();
  for (const w of doc.wires) {
    const route = routeOfWire(w, kindOf, geom, pos);
    routes.set(w.id, route);
    if (!route) continue;
    const curve = new Path2D(route.d);
    outline.addPath(curve);
    const paint = wirePaint(w.color);
    const into = (m: Map<string, Path2D>, colour: string) => {
      let p = m.get(colour);
      if (!p) m.set(colour, (p = new Path2D()));
      p.addPath(curve);
    };
    into(colours, paint.base);
    if (paint.stripe) into(stripes, paint.stripe);
  }
  g.strokeStyle = printPaints.ink;
  g.lineWidth = 5.5;
  g.stroke(outline);
  g.lineWidth = 3.5;
  for (const [colour, p] of colours) {
    g.strokeStyle = colour;
    g.stroke(p);
  }
  g.lineCap = 'butt';
  g.setLineDash([7, 7]);
  for (const [colour, p] of stripes) {
    g.strokeStyle = colour;
    g.stroke(p);
  }
  g.setLineDash([]);
  g.lineCap = 'round';

  // Clamps, turned with their wire.
  for (const cl of doc.clamps ?? []) {
    for (const wid of cl.wires) {
      const route = routes.get(wid);
      if (!route) continue;
      const at = pointAlong(route, cl.at ?? 0.5);
      g.setTransform(...base);
      g.translate(at.x, at.y);
      g.rotate((at.angle * Math.PI) / 180);
      for (const s of clampShapes) paintShape(g, s);
    }
  }

  // Components.
  for (const c of doc.components) {
    const p = pos[c.id];
    const geo = geom.get(c.id);
    if (!p || !geo) continue;
    g.setTransform(...base);
    g.translate(p.x, p.y);
    for (const s of componentDrawing(c, geo, roles.get(c.id) ?? null).shapes) paintShape(g, s);
  }
  g.setTransform(1, 0, 0, 1, 0, 0);
}

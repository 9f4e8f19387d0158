/**
 * The elkjs graph of a drawing and the positions it answers. Pure: elkjs
 * itself is handed in (the editor's layout worker, the demo seed in Node and
 * tests each run their own instance of the bundled build).
 *
 * Layered, left to right; every pin is a port in fixed order (cavity order,
 * top to bottom). A mated connector pair is one elkjs node (half a's pins on
 * its west face, half b's on its east face) so the two halves stay side by
 * side, mating faces together.
 */
import type { ElkExtendedEdge, ElkNode, ElkPort } from 'elkjs/lib/elk-api';
import type { HarnessDocument } from '../harness';
import { MATE_GAP, documentGeometry, matePairs, splitRef, type Positions } from './geometry';

export interface LayoutRequest {
  doc: Pick<HarnessDocument, 'components' | 'wires'>;
  /** Lay out only these components (the rest keep their places); all when absent. */
  only?: string[];
  /** Current positions, used to place a partial layout where the selection was. */
  positions?: Positions;
}

export interface BuiltGraph {
  graph: ElkNode;
  /** elkjs node id → the component ids it stands for, with their offsets inside it. */
  members: Map<string, Array<{ id: string; dx: number; dy: number }>>;
}

const rootOptions: Record<string, string> = {
  'elk.algorithm': 'layered',
  'elk.direction': 'RIGHT',
  'elk.edgeRouting': 'POLYLINE',
  'elk.spacing.nodeNode': '28',
  'elk.layered.spacing.nodeNodeBetweenLayers': '90',
  'elk.spacing.edgeNode': '14',
  'elk.layered.nodePlacement.strategy': 'BRANDES_KOEPF',
  'elk.layered.considerModelOrder.strategy': 'NODES_AND_EDGES',
  'elk.separateConnectedComponents': 'true',
  'elk.layered.thoroughness': '3',
  // The greedy switch pass costs seconds on a harness of ~800 components and gains little here.
  'elk.layered.crossingMinimization.greedySwitch.type': 'OFF',
};

/** Above this many components the layout trades some tidiness for time. */
export const FAST_LAYOUT_ABOVE = 300;

// Keeping the document's order sorts every layer against all of its constraints, which grows much
// faster than the harness (over a third of a big layout's time); one crossing-minimisation pass
// instead of three costs the rest. Together: about a third of the time on ~800 components.
const fastOptions: Record<string, string> = {
  'elk.layered.considerModelOrder.strategy': 'NONE',
  'elk.layered.thoroughness': '1',
};

export function buildGraph(req: LayoutRequest): BuiltGraph {
  const { doc } = req;
  const only = req.only ? new Set(req.only) : null;
  const comps = only ? doc.components.filter((c) => only.has(c.id)) : doc.components;
  const geom = documentGeometry(doc);
  const pairOf = new Map<string, string>();
  const members = new Map<string, Array<{ id: string; dx: number; dy: number }>>();
  const children: ElkNode[] = [];
  const included = new Set(comps.map((c) => c.id));
  const portsOf = (id: string, dx: number) => {
    const g = geom.get(id)!;
    const west = g.ports.filter((p) => p.side === 'left');
    const east = g.ports.filter((p) => p.side === 'right');
    const ports: ElkPort[] = [];
    // FIXED_ORDER counts clockwise: east ports top to bottom, west ports bottom to top.
    east.forEach((p, i) => ports.push({ id: `${id}.${p.pin}`, x: dx + p.x, y: p.y - 2, width: 4, height: 4, layoutOptions: { 'elk.port.side': 'EAST', 'elk.port.index': String(i) } }));
    west.forEach((p, i) => ports.push({ id: `${id}.${p.pin}`, x: dx + p.x - 4, y: p.y - 2, width: 4, height: 4, layoutOptions: { 'elk.port.side': 'WEST', 'elk.port.index': String(east.length + west.length - 1 - i) } }));
    return ports;
  };
  for (const [a, b] of matePairs(doc)) {
    if (!included.has(a) || !included.has(b)) continue;
    const ga = geom.get(a)!;
    const gb = geom.get(b)!;
    const key = `pair:${a}`;
    pairOf.set(a, key);
    pairOf.set(b, key);
    const dxB = ga.width + MATE_GAP;
    members.set(key, [{ id: a, dx: 0, dy: 0 }, { id: b, dx: dxB, dy: 0 }]);
    children.push({
      id: key,
      width: dxB + gb.width,
      height: Math.max(ga.height, gb.height),
      ports: [...portsOf(a, 0), ...portsOf(b, dxB)],
      layoutOptions: { 'elk.portConstraints': 'FIXED_ORDER' },
    });
  }
  const splice = new Set<string>();
  for (const c of comps) {
    if (pairOf.has(c.id)) continue;
    const g = geom.get(c.id)!;
    members.set(c.id, [{ id: c.id, dx: 0, dy: 0 }]);
    if (c.kind === 'splice') {
      splice.add(c.id);
      children.push({ id: c.id, width: g.width, height: g.height });
    } else {
      children.push({ id: c.id, width: g.width, height: g.height, ports: portsOf(c.id, 0), layoutOptions: { 'elk.portConstraints': 'FIXED_ORDER' } });
    }
  }
  const nodeOf = (comp: string) => pairOf.get(comp) ?? comp;
  const edges: ElkExtendedEdge[] = [];
  for (const w of doc.wires) {
    const a = splitRef(w.from);
    const b = splitRef(w.to);
    if (!a || !b || !included.has(a[0]) || !included.has(b[0])) continue;
    if (nodeOf(a[0]) === nodeOf(b[0])) continue;
    const end = ([comp]: [string, string], ref: string) => (splice.has(comp) ? comp : ref);
    edges.push({ id: w.id, sources: [end(a, w.from)], targets: [end(b, w.to)] });
  }
  const layoutOptions = comps.length > FAST_LAYOUT_ABOVE ? { ...rootOptions, ...fastOptions } : rootOptions;
  return { graph: { id: 'root', layoutOptions, children, edges }, members };
}

/** Component positions from a laid-out graph; a partial layout lands where its components were. */
export function positionsFromGraph(laid: ElkNode, built: BuiltGraph, req: LayoutRequest): Positions {
  const out: Positions = {};
  for (const child of laid.children ?? []) {
    const list = built.members.get(child.id);
    if (!list) continue;
    for (const m of list) out[m.id] = { x: Math.round((child.x ?? 0) + m.dx), y: Math.round((child.y ?? 0) + m.dy) };
  }
  if (req.only && req.positions) {
    let minX = Infinity, minY = Infinity, oldX = Infinity, oldY = Infinity;
    for (const id of Object.keys(out)) {
      minX = Math.min(minX, out[id].x);
      minY = Math.min(minY, out[id].y);
      const old = req.positions[id];
      if (old) {
        oldX = Math.min(oldX, old.x);
        oldY = Math.min(oldY, old.y);
      }
    }
    if (Number.isFinite(oldX)) {
      for (const id of Object.keys(out)) out[id] = { x: out[id].x - minX + oldX, y: out[id].y - minY + oldY };
    }
  }
  return out;
}

/** What lays a graph out: an elkjs instance. */
export interface GraphLayouter {
  layout(graph: ElkNode): Promise<ElkNode>;
}

/** The drawing (or just `only`) laid out by `elk`: component positions. */
export async function layOutDrawing(elk: GraphLayouter, req: LayoutRequest): Promise<Positions> {
  const built = buildGraph(req);
  return positionsFromGraph(await elk.layout(built.graph), built, req);
}

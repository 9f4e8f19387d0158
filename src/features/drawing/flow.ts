/**
 * The xyflow nodes and edges of a drawing, built from the document and the
 * positions. Unchanged components and wires keep their node and edge objects
 * between builds, so dragging one node re-renders that node only.
 *
 * Every node carries its size and its handles' boxes (known from the
 * geometry): xyflow can then place wires and cull what is out of view
 * without rendering and measuring all ~800 nodes of a big drawing first.
 */
import { useState } from 'react';
import { Position, type NodeHandle } from '@xyflow/react';
import type { Component, HarnessDocument, Wire } from '@shared/harness';
import { documentGeometry, mateRoles, matePairs, splitRef, type MateRole, type NodeGeom, type Positions } from '@shared/drawing/geometry';
import type { ComponentFlowNode } from './components/ComponentNode';
import { MATE_HANDLE } from './components/ComponentNode';
import type { WireClamp, WireFlowEdge } from './components/WireEdge';
import type { MateFlowEdge } from './components/MateEdge';

export interface FlowInput {
  doc: HarnessDocument;
  positions: Positions;
  selectedNodes?: ReadonlySet<string>;
  selectedEdges?: ReadonlySet<string>;
  /** Pin volts by pin ref (`X1.2`). */
  volts?: ReadonlyMap<string, number | null> | null;
  highlightPins?: ReadonlySet<string>;
  highlightWires?: ReadonlySet<string>;
  problemComponents?: ReadonlySet<string>;
  /** The clamp the side panel shows. */
  focusedClamp?: string | null;
  readOnly?: boolean;
}

interface NodeCacheEntry {
  c: Component;
  x: number;
  y: number;
  sel: boolean;
  key: string;
  mate: string;
  node: ComponentFlowNode;
}

interface EdgeCacheEntry {
  w: Wire;
  sel: boolean;
  walk: boolean;
  kinds: string;
  clampKey: string;
  edge: WireFlowEdge;
}

/** Handle sizes as drawing.css draws them (border-box). */
export const HANDLE = 11;
export const SPLICE_HANDLE = 16;

/**
 * The handle boxes of a node in its own coordinates, exactly where the DOM
 * puts them (pin handles centred on the pin, the mate handle on the mating face).
 */
export function nodeHandles(kind: Component['kind'], g: NodeGeom, mate: MateRole): NodeHandle[] {
  const out: NodeHandle[] = g.ports.map((p) => {
    if (kind === 'splice') return { id: p.pin, type: 'source', position: Position.Left, x: p.x - SPLICE_HANDLE / 2, y: p.y - SPLICE_HANDLE / 2, width: SPLICE_HANDLE, height: SPLICE_HANDLE };
    return { id: p.pin, type: 'source', position: p.side === 'left' ? Position.Left : Position.Right, x: p.x - HANDLE / 2, y: p.y - HANDLE / 2, width: HANDLE, height: HANDLE };
  });
  if (mate) out.push({ id: MATE_HANDLE, type: 'source', position: mate === 'a' ? Position.Right : Position.Left, x: (mate === 'a' ? g.width : 0) - 0.5, y: 13.5, width: 1, height: 1 });
  return out;
}

export interface FlowElements {
  nodes: ComponentFlowNode[];
  edges: Array<WireFlowEdge | MateFlowEdge>;
}

/** The nodes and edges of the drawing; objects are reused while their inputs stay the same. */
export function useFlowElements(input: FlowInput): FlowElements {
  const [builder] = useState(createFlowBuilder);
  return builder(input);
}

export function createFlowBuilder(): (input: FlowInput) => FlowElements {
  const nodeCache = { current: new Map<string, NodeCacheEntry>() };
  const edgeCache = { current: new Map<string, EdgeCacheEntry>() };
  const mateCache = { current: new Map<string, MateFlowEdge>() };
  const geomCache: { current: { comps: Component[] | null; geom: ReturnType<typeof documentGeometry>; roles: ReturnType<typeof mateRoles>; pairs: Array<[string, string]> } } = { current: { comps: null, geom: new Map(), roles: new Map(), pairs: [] } };
  return (input) => {
  const { doc, positions, selectedNodes, selectedEdges, volts, highlightPins, highlightWires, problemComponents, focusedClamp, readOnly } = input;

  if (geomCache.current.comps !== doc.components) {
    geomCache.current = { comps: doc.components, geom: documentGeometry(doc), roles: mateRoles(doc), pairs: matePairs(doc) };
  }
  const { geom, roles, pairs } = geomCache.current;

  const hlByComp = new Map<string, string[]>();
  if (highlightPins) {
    for (const ref of highlightPins) {
      const p = splitRef(ref);
      if (!p) continue;
      const list = hlByComp.get(p[0]) ?? [];
      list.push(p[1]);
      hlByComp.set(p[0], list);
    }
  }

  const nextNodes = new Map<string, NodeCacheEntry>();
  const nodes: ComponentFlowNode[] = [];
  for (const c of doc.components) {
    const pos = positions[c.id] ?? { x: 0, y: 0 };
    const g = geom.get(c.id)!;
    const sel = !!selectedNodes?.has(c.id);
    const hl = hlByComp.get(c.id);
    let vkey = '';
    let v: Record<string, number | null> | undefined;
    if (volts) {
      v = {};
      for (const port of g.ports) {
        const val = volts.get(`${c.id}.${port.pin}`);
        v[port.pin] = val === undefined ? null : val;
        vkey += `${val ?? 'n'},`;
      }
    }
    const problem = !!problemComponents?.has(c.id);
    const key = `${vkey}|${hl?.join(',') ?? ''}|${problem}|${readOnly}`;
    const mate = roles.get(c.id) ?? '';
    const old = nodeCache.current.get(c.id);
    let entry: NodeCacheEntry;
    if (old && old.c === c && old.x === pos.x && old.y === pos.y && old.sel === sel && old.key === key && old.mate === mate) entry = old;
    else {
      entry = {
        c, x: pos.x, y: pos.y, sel, key, mate,
        node: {
          id: c.id,
          type: 'component',
          position: pos,
          width: g.width,
          height: g.height,
          measured: { width: g.width, height: g.height },
          handles: nodeHandles(c.kind, g, roles.get(c.id) ?? null),
          selected: sel,
          draggable: !readOnly,
          connectable: !readOnly,
          data: { component: c, geom: g, mate: roles.get(c.id) ?? null, volts: v, hlPins: hl, problem },
        },
      };
    }
    nextNodes.set(c.id, entry);
    nodes.push(entry.node);
  }
  nodeCache.current = nextNodes;

  const kind = new Map(doc.components.map((c) => [c.id, c.kind]));
  const clampsOf = new Map<string, WireClamp[]>();
  for (const cl of doc.clamps ?? []) {
    for (const wid of cl.wires) {
      const list = clampsOf.get(wid) ?? [];
      list.push({ id: cl.id, label: cl.label, at: cl.at ?? 0.5, focused: cl.id === focusedClamp });
      clampsOf.set(wid, list);
    }
  }
  const nextEdges = new Map<string, EdgeCacheEntry>();
  const edges: Array<WireFlowEdge | MateFlowEdge> = [];
  for (const w of doc.wires) {
    const a = splitRef(w.from);
    const b = splitRef(w.to);
    if (!a || !b || !kind.has(a[0]) || !kind.has(b[0])) continue;
    const sel = !!selectedEdges?.has(w.id);
    const walk = !!highlightWires?.has(w.id);
    const kinds = `${kind.get(a[0])}|${kind.get(b[0])}|${readOnly}`;
    const clamps = clampsOf.get(w.id);
    const clampKey = clamps ? clamps.map((c) => `${c.id}:${c.at}:${c.label ?? ''}:${c.focused ? 1 : 0}`).join('|') : '';
    const old = edgeCache.current.get(w.id);
    let entry: EdgeCacheEntry;
    if (old && old.w === w && old.sel === sel && old.walk === walk && old.kinds === kinds && old.clampKey === clampKey) entry = old;
    else {
      entry = {
        w, sel, walk, kinds, clampKey,
        edge: {
          id: w.id,
          type: 'wire',
          source: a[0],
          sourceHandle: a[1],
          target: b[0],
          targetHandle: b[1],
          selected: sel,
          reconnectable: !readOnly,
          zIndex: walk ? 2 : 0,
          data: { wire: w, sourceSplice: kind.get(a[0]) === 'splice', targetSplice: kind.get(b[0]) === 'splice', onWalk: walk, clamps },
        },
      };
    }
    nextEdges.set(w.id, entry);
    edges.push(entry.edge);
  }
  edgeCache.current = nextEdges;
  const nextMates = new Map<string, MateFlowEdge>();
  for (const [a, b] of pairs) {
    const id = `mate:${a}:${b}`;
    const edge = mateCache.current.get(id) ?? { id, type: 'mate', source: a, sourceHandle: MATE_HANDLE, target: b, targetHandle: MATE_HANDLE, selectable: false, focusable: false, reconnectable: false, deletable: false, data: {} };
    nextMates.set(id, edge);
    edges.push(edge);
  }
  mateCache.current = nextMates;
  return { nodes, edges };
  };
}

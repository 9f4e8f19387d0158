/**
 * The walk: conductive paths between two pins, shortest first.
 *
 * The graph has one vertex per pin plus the chassis reference, and one edge
 * per wire, mated cavity, fuse, resistor, load, closed switch pair, relay
 * contact and ground bond. Simple paths are enumerated with Yen's k-shortest
 * algorithm; before that, everything that no simple path can use is cut
 * away (dead-end branches) and chains of two-edge vertices are folded into
 * single edges, so each shortest-path search runs on a small graph.
 * Path order: series resistance, then fewer steps.
 */
import type { PreparedCircuit } from './circuit';

export type WalkEdgeType = 'wire' | 'mate' | 'fuse' | 'resistor' | 'load' | 'switch' | 'relay-contact' | 'bond';

export interface WalkEdge {
  type: WalkEdgeType;
  a: number;
  b: number;
  ohms: number;
  /** Wire index, mate index, component index… per type. */
  ref: number;
  /** Mate pair index, or relay contact ('87' | '87a'). */
  sub: number | string;
  /** Switch positions in which the pair is closed. */
  positions?: string[];
}

export interface WalkGraph {
  n: number;
  edges: WalkEdge[];
  /** Edges per vertex (CSR). */
  ptr: Int32Array;
  inc: Int32Array;
}

export interface WalkVariant {
  /** Switch position per switch, or null for any position. */
  positions: string[] | null;
  unplugged: Set<number>;
  /** Relay energised per relay, or null for both contacts. */
  relayOn: Uint8Array | null;
}

export function buildWalkGraph(prep: PreparedCircuit, v: WalkVariant): WalkGraph {
  const edges: WalkEdge[] = [];
  const n = prep.pinRefs.length; // vertex 0 is the chassis reference
  for (let i = 0; i < prep.wireA.length; i++) edges.push({ type: 'wire', a: prep.wireA[i], b: prep.wireB[i], ohms: prep.wireR[i], ref: i, sub: 0 });
  prep.mates.forEach((m, mi) => {
    if (v.unplugged.has(m.a) || v.unplugged.has(m.b)) return;
    m.pairs.forEach(([a, b], k) => edges.push({ type: 'mate', a, b, ohms: m.contactOhms, ref: mi, sub: k }));
  });
  for (const f of prep.fuses) edges.push({ type: 'fuse', a: f.n1, b: f.n2, ohms: f.ohms, ref: f.ci, sub: 0 });
  for (const r of prep.resistors) edges.push({ type: 'resistor', a: r.n1, b: r.n2, ohms: r.ohms, ref: r.ci, sub: 0 });
  for (const l of prep.loads) if (l.ohms < Infinity) edges.push({ type: 'load', a: l.n1, b: l.n2, ohms: l.ohms, ref: l.ci, sub: 0 });
  prep.switches.forEach((s, k) => {
    const byPair = new Map<string, WalkEdge>();
    for (const [name, pairs] of s.positions) {
      if (v.positions && v.positions[k] !== name) continue;
      for (const [a, b] of pairs) {
        const key = a < b ? `${a}:${b}` : `${b}:${a}`;
        const e = byPair.get(key);
        if (e) e.positions!.push(name);
        else {
          const ne: WalkEdge = { type: 'switch', a, b, ohms: s.contactOhms, ref: s.ci, sub: 0, positions: [name] };
          byPair.set(key, ne);
          edges.push(ne);
        }
      }
    }
  });
  prep.relays.forEach((r, k) => {
    const on = v.relayOn ? v.relayOn[k] === 1 : null;
    if (on === null || on) edges.push({ type: 'relay-contact', a: r.n30, b: r.n87, ohms: r.contactOhms, ref: r.ci, sub: '87' });
    if (r.n87a >= 0 && (on === null || !on)) edges.push({ type: 'relay-contact', a: r.n30, b: r.n87a, ohms: r.contactOhms, ref: r.ci, sub: '87a' });
  });
  for (const g of prep.grounds) edges.push({ type: 'bond', a: g.node, b: 0, ohms: g.ohms, ref: g.ci, sub: 0 });
  const deg = new Int32Array(n + 1);
  for (const e of edges) {
    deg[e.a + 1]++;
    if (e.b !== e.a) deg[e.b + 1]++;
  }
  for (let i = 0; i < n; i++) deg[i + 1] += deg[i];
  const inc = new Int32Array(deg[n]);
  const fill = deg.slice(0, n);
  edges.forEach((e, i) => {
    inc[fill[e.a]++] = i;
    if (e.b !== e.a) inc[fill[e.b]++] = i;
  });
  return { n, edges, ptr: deg, inc };
}

/** A path as the vertices and the edges between them (edges.length = vertices.length − 1). */
export interface RawPath {
  vertices: number[];
  edges: number[];
  ohms: number;
}

interface Folded {
  /** Folded edge: endpoints (folded vertex ids), cost, original edges and interior vertices in order from u. */
  u: Int32Array;
  v: Int32Array;
  w: Float64Array;
  hops: Int32Array;
  chain: { edges: number[]; verts: number[] }[];
  ptr: Int32Array;
  inc: Int32Array;
  /** Original vertex of each folded vertex. */
  orig: number[];
}

/** Cut dead ends (vertices of degree 1, repeatedly, except s and t) and fold two-edge chains. */
function fold(g: WalkGraph, s: number, t: number): Folded | null {
  const n = g.n;
  const alive = new Uint8Array(g.edges.length);
  const deg = new Int32Array(n);
  g.edges.forEach((e, i) => {
    if (e.a === e.b) return; // a self loop never lies on a simple path
    alive[i] = 1;
    deg[e.a]++;
    deg[e.b]++;
  });
  const stack: number[] = [];
  for (let x = 0; x < n; x++) if (deg[x] === 1 && x !== s && x !== t) stack.push(x);
  while (stack.length) {
    const x = stack.pop()!;
    if (deg[x] !== 1) continue;
    for (let q = g.ptr[x]; q < g.ptr[x + 1]; q++) {
      const ei = g.inc[q];
      if (!alive[ei]) continue;
      alive[ei] = 0;
      const e = g.edges[ei];
      const y = e.a === x ? e.b : e.a;
      deg[x]--;
      deg[y]--;
      if (deg[y] === 1 && y !== s && y !== t) stack.push(y);
    }
  }
  if (deg[s] === 0 || deg[t] === 0) return null;
  // Kept vertices: degree ≠ 2, or s, or t.
  const fid = new Int32Array(n).fill(-1);
  const orig: number[] = [];
  for (let x = 0; x < n; x++) if (deg[x] > 0 && (deg[x] !== 2 || x === s || x === t)) {
    fid[x] = orig.length;
    orig.push(x);
  }
  const U: number[] = [];
  const V: number[] = [];
  const W: number[] = [];
  const H: number[] = [];
  const chain: { edges: number[]; verts: number[] }[] = [];
  const used = new Uint8Array(g.edges.length);
  for (const x of orig) {
    for (let q = g.ptr[x]; q < g.ptr[x + 1]; q++) {
      const e0 = g.inc[q];
      if (!alive[e0] || used[e0]) continue;
      const edges: number[] = [];
      const verts: number[] = [];
      let cur = x;
      let ei = e0;
      let w = 0;
      for (;;) {
        used[ei] = 1;
        edges.push(ei);
        const e = g.edges[ei];
        w += e.ohms;
        const y = e.a === cur ? e.b : e.a;
        if (fid[y] >= 0) {
          cur = y;
          break;
        }
        verts.push(y);
        // continue along the other alive edge of y
        let nx = -1;
        for (let r = g.ptr[y]; r < g.ptr[y + 1]; r++) {
          const ej = g.inc[r];
          if (alive[ej] && !used[ej]) {
            nx = ej;
            break;
          }
        }
        cur = y;
        if (nx < 0) break; // cannot happen in a folded chain
        ei = nx;
      }
      if (fid[cur] < 0 || cur === x) continue; // a loop back to x is of no use to a simple path
      U.push(fid[x]);
      V.push(fid[cur]);
      W.push(w);
      H.push(edges.length);
      chain.push({ edges, verts });
    }
  }
  const m = U.length;
  const nf = orig.length;
  const ptr = new Int32Array(nf + 1);
  for (let i = 0; i < m; i++) {
    ptr[U[i] + 1]++;
    ptr[V[i] + 1]++;
  }
  for (let i = 0; i < nf; i++) ptr[i + 1] += ptr[i];
  const inc = new Int32Array(ptr[nf]);
  const fp = ptr.slice(0, nf);
  for (let i = 0; i < m; i++) {
    inc[fp[U[i]]++] = i;
    inc[fp[V[i]]++] = i;
  }
  return { u: Int32Array.from(U), v: Int32Array.from(V), w: Float64Array.from(W), hops: Int32Array.from(H), chain, ptr, inc, orig };
}

const EPS = 1e-12;
function less(w1: number, h1: number, w2: number, h2: number): boolean {
  if (Math.abs(w1 - w2) > EPS * (1 + Math.abs(w1) + Math.abs(w2))) return w1 < w2;
  return h1 < h2;
}

interface FPath {
  verts: number[];
  edges: number[];
  w: number;
  h: number;
  /** Index where this path left the path it was spurred from (Lawler: later spurs start there). */
  dev: number;
}

/** Reusable buffers for the searches of one query. */
interface Buffers {
  dist: Float64Array;
  hops: Float64Array;
  prevE: Int32Array;
  done: Uint8Array;
  hv: Int32Array;
  hw: Float64Array;
  hh: Float64Array;
}

/** Dijkstra on the folded graph from s to t avoiding blocked vertices and edges; keys (ohms, steps). */
function dijkstra(f: Folded, s: number, t: number, blockedV: Uint8Array, blockedE: Uint8Array, B: Buffers): FPath | null {
  const { dist, hops, prevE, done } = B;
  let { hv, hw, hh } = B;
  dist.fill(Infinity);
  prevE.fill(-1);
  done.fill(0);
  dist[s] = 0;
  hops[s] = 0;
  let size = 0;
  const push = (x: number, w: number, h: number) => {
    if (size === hv.length) {
      const nv = new Int32Array(size * 2); nv.set(hv); hv = B.hv = nv;
      const nw = new Float64Array(size * 2); nw.set(hw); hw = B.hw = nw;
      const nh = new Float64Array(size * 2); nh.set(hh); hh = B.hh = nh;
    }
    let i = size++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (hw[p] < w || (hw[p] === w && hh[p] <= h)) break;
      hv[i] = hv[p]; hw[i] = hw[p]; hh[i] = hh[p];
      i = p;
    }
    hv[i] = x; hw[i] = w; hh[i] = h;
  };
  push(s, 0, 0);
  while (size > 0) {
    const x = hv[0];
    // pop
    size--;
    if (size > 0) {
      const lx = hv[size], lw = hw[size], lh = hh[size];
      let i = 0;
      for (;;) {
        let c = 2 * i + 1;
        if (c >= size) break;
        if (c + 1 < size && (hw[c + 1] < hw[c] || (hw[c + 1] === hw[c] && hh[c + 1] < hh[c]))) c++;
        if (hw[c] > lw || (hw[c] === lw && hh[c] >= lh)) break;
        hv[i] = hv[c]; hw[i] = hw[c]; hh[i] = hh[c];
        i = c;
      }
      hv[i] = lx; hw[i] = lw; hh[i] = lh;
    }
    if (done[x]) continue;
    done[x] = 1;
    if (x === t) break;
    const dx = dist[x];
    const hx = hops[x];
    for (let q = f.ptr[x]; q < f.ptr[x + 1]; q++) {
      const ei = f.inc[q];
      if (blockedE[ei]) continue;
      const y = f.u[ei] === x ? f.v[ei] : f.u[ei];
      if (blockedV[y] || done[y]) continue;
      const nw = dx + f.w[ei];
      const nh = hx + f.hops[ei];
      const dy = dist[y];
      if (nw < dy || (nw === dy && nh < hops[y])) {
        dist[y] = nw;
        hops[y] = nh;
        prevE[y] = ei;
        push(y, nw, nh);
      }
    }
  }
  if (!done[t]) return null;
  const verts: number[] = [t];
  const edges: number[] = [];
  let x = t;
  while (x !== s) {
    const ei = prevE[x];
    edges.push(ei);
    x = f.u[ei] === x ? f.v[ei] : f.u[ei];
    verts.push(x);
  }
  verts.reverse();
  edges.reverse();
  return { verts, edges, w: dist[t], h: hops[t], dev: 0 };
}

/** Up to k simple paths from s to t, shortest first (Yen's algorithm on the folded graph). */
export function kShortestPaths(g: WalkGraph, s: number, t: number, k: number): RawPath[] {
  if (s === t) return [{ vertices: [s], edges: [], ohms: 0 }];
  const f = fold(g, s, t);
  if (!f) return [];
  const nf = f.orig.length;
  const fs = f.orig.indexOf(s);
  const ft = f.orig.indexOf(t);
  const B: Buffers = {
    dist: new Float64Array(nf), hops: new Float64Array(nf), prevE: new Int32Array(nf), done: new Uint8Array(nf),
    hv: new Int32Array(64), hw: new Float64Array(64), hh: new Float64Array(64),
  };
  const blockedV = new Uint8Array(nf);
  const blockedE = new Uint8Array(f.u.length);
  const first = dijkstra(f, fs, ft, blockedV, blockedE, B);
  if (!first) return [];
  const A: FPath[] = [first];
  const cands: FPath[] = [];
  const seen = new Set<string>([first.edges.join(',')]);
  while (A.length < k) {
    const last = A[A.length - 1];
    for (let i = last.dev; i < last.verts.length - 1; i++) {
      const spur = last.verts[i];
      const rootEdges = last.edges.slice(0, i);
      const touched: number[] = [];
      for (const p of A) {
        if (p.edges.length > i && sameStart(p.edges, rootEdges)) {
          blockedE[p.edges[i]] = 1;
          touched.push(p.edges[i]);
        }
      }
      let rw = 0;
      let rh = 0;
      for (let j = 0; j < i; j++) {
        blockedV[last.verts[j]] = 1;
        rw += f.w[last.edges[j]];
        rh += f.hops[last.edges[j]];
      }
      const sp = dijkstra(f, spur, ft, blockedV, blockedE, B);
      for (let j = 0; j < i; j++) blockedV[last.verts[j]] = 0;
      for (const e of touched) blockedE[e] = 0;
      if (!sp) continue;
      const cand: FPath = { verts: [...last.verts.slice(0, i), ...sp.verts], edges: [...rootEdges, ...sp.edges], w: rw + sp.w, h: rh + sp.h, dev: i };
      const key = cand.edges.join(',');
      if (seen.has(key)) continue;
      seen.add(key);
      cands.push(cand);
    }
    if (!cands.length) break;
    let bi = 0;
    for (let j = 1; j < cands.length; j++) if (less(cands[j].w, cands[j].h, cands[bi].w, cands[bi].h)) bi = j;
    A.push(cands[bi]);
    cands.splice(bi, 1);
  }
  // Unfold into original vertices and edges.
  return A.map((p) => {
    const vertices: number[] = [f.orig[p.verts[0]]];
    const edges: number[] = [];
    for (let j = 0; j < p.edges.length; j++) {
      const fe = p.edges[j];
      const c = f.chain[fe];
      const forward = f.u[fe] === p.verts[j];
      const es = forward ? c.edges : [...c.edges].reverse();
      const vs = forward ? c.verts : [...c.verts].reverse();
      for (let q = 0; q < es.length; q++) {
        edges.push(es[q]);
        vertices.push(q < vs.length ? vs[q] : f.orig[p.verts[j + 1]]);
      }
    }
    let ohms = 0;
    for (const e of edges) ohms += g.edges[e].ohms;
    return { vertices, edges, ohms };
  });
}

function sameStart(a: number[], root: number[]): boolean {
  for (let i = 0; i < root.length; i++) if (a[i] !== root[i]) return false;
  return true;
}

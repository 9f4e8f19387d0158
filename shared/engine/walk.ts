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
  return walkGraphOf(n, edges);
}

/** A walk graph of n vertices over these edges. */
export function walkGraphOf(n: number, edges: WalkEdge[]): WalkGraph {
  const { ptr, inc } = incidence(n, edges.length, (i) => edges[i].a, (i) => edges[i].b);
  return { n, edges, ptr, inc };
}

/** Edges per vertex (CSR) of m edges between a(i) and b(i); a self loop is listed once. */
function incidence(n: number, m: number, a: (i: number) => number, b: (i: number) => number): { ptr: Int32Array; inc: Int32Array } {
  const ptr = new Int32Array(n + 1);
  for (let i = 0; i < m; i++) {
    ptr[a(i) + 1]++;
    if (b(i) !== a(i)) ptr[b(i) + 1]++;
  }
  for (let x = 0; x < n; x++) ptr[x + 1] += ptr[x];
  const inc = new Int32Array(ptr[n]);
  const fill = ptr.slice(0, n);
  for (let i = 0; i < m; i++) {
    inc[fill[a(i)]++] = i;
    if (b(i) !== a(i)) inc[fill[b(i)]++] = i;
  }
  return { ptr, inc };
}

/** The folded graph over the lists of folded edges. */
function foldedOf(U: number[], V: number[], W: number[], H: number[], chain: Folded['chain'], orig: number[]): Folded {
  const { ptr, inc } = incidence(orig.length, U.length, (i) => U[i], (i) => V[i]);
  return { u: Int32Array.from(U), v: Int32Array.from(V), w: Float64Array.from(W), hops: Int32Array.from(H), chain, ptr, inc, orig };
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

/** What fold leaves besides the folded graph, for attaching two ends to it later (see coreOf). */
interface FoldTrace {
  /** Degree of each vertex once the dead ends are cut (0: cut). */
  deg: Int32Array;
  /** For a cut vertex, the edge it hung by when it was cut (toward what remained); -1 for none. */
  parent: Int32Array;
  /** For a kept-degree-2 vertex inside a folded edge: that edge and the vertex's place among its interior vertices. */
  chainAt: Int32Array;
  posAt: Int32Array;
  /** Folded id of each vertex, -1 if not a folded vertex. */
  fid: Int32Array;
}

/** Cut dead ends (vertices of degree 1, repeatedly, except s and t) and fold two-edge chains. */
function fold(g: WalkGraph, s: number, t: number, trace?: FoldTrace): Folded | null {
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
      if (trace) trace.parent[x] = ei;
      const e = g.edges[ei];
      const y = e.a === x ? e.b : e.a;
      deg[x]--;
      deg[y]--;
      if (deg[y] === 1 && y !== s && y !== t) stack.push(y);
    }
  }
  if (trace) trace.deg.set(deg);
  if (!trace && (deg[s] === 0 || deg[t] === 0)) return null;
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
      if (trace) verts.forEach((y, j) => {
        trace.chainAt[y] = chain.length;
        trace.posAt[y] = j;
      });
      U.push(fid[x]);
      V.push(fid[cur]);
      W.push(w);
      H.push(edges.length);
      chain.push({ edges, verts });
    }
  }
  if (trace) trace.fid.set(fid);
  return foldedOf(U, V, W, H, chain, orig);
}

/** The graph folded once with no ends kept, and how to attach two ends to it. */
interface Core {
  f: Folded;
  trace: FoldTrace;
}
const cores = new WeakMap<WalkGraph, Core>();

function coreOf(g: WalkGraph): Core {
  let c = cores.get(g);
  if (!c) {
    const n = g.n;
    const trace: FoldTrace = {
      deg: new Int32Array(n), parent: new Int32Array(n).fill(-1), chainAt: new Int32Array(n).fill(-1), posAt: new Int32Array(n), fid: new Int32Array(n),
    };
    c = { f: fold(g, -1, -1, trace)!, trace };
    cores.set(g, c);
  }
  return c;
}

type Attached = { kind: 'folded'; f: Folded; fs: number; ft: number } | { kind: 'single'; path: RawPath } | { kind: 'none' } | { kind: 'fallback' };

/**
 * The folded graph for ends s and t, from the core: an end on a dead-end branch brings
 * back the branch up to where it meets the core, and an end (or meeting point) inside a
 * folded chain splits that chain. Answers the one path when the two ends share a branch
 * (or meet the core at one vertex), and fallback in the rare shapes left to fold itself.
 */
function attach(g: WalkGraph, s: number, t: number): Attached {
  const { f, trace } = coreOf(g);
  const { deg, parent, chainAt, posAt, fid } = trace;
  const up = (x: number) => {
    const verts = [x];
    const edges: number[] = [];
    while (deg[x] === 0 && parent[x] >= 0) {
      const e = g.edges[parent[x]];
      edges.push(parent[x]);
      x = e.a === x ? e.b : e.a;
      verts.push(x);
    }
    return { verts, edges, top: x, inCore: deg[x] > 0 };
  };
  const ps = up(s);
  const pt = up(t);
  // A shared vertex on the two branches: the one simple path runs through the first of them.
  const onS = new Map<number, number>();
  ps.verts.forEach((v, i) => onS.set(v, i));
  for (let j = 0; j < pt.verts.length; j++) {
    const i = onS.get(pt.verts[j]);
    if (i === undefined) continue;
    const vertices = [...ps.verts.slice(0, i + 1), ...pt.verts.slice(0, j).reverse()];
    const edges = [...ps.edges.slice(0, i), ...pt.edges.slice(0, j).reverse()];
    let ohms = 0;
    for (const e of edges) ohms += g.edges[e].ohms;
    return { kind: 'single', path: { vertices, edges, ohms } };
  }
  if (!ps.inCore || !pt.inCore) return { kind: 'none' };
  // Meeting points inside chains split them; a ring with no kept vertex is left to fold.
  const splits = new Map<number, number[]>();
  for (const x of [ps.top, pt.top]) {
    if (fid[x] >= 0) continue;
    const ch = chainAt[x];
    if (ch < 0) return { kind: 'fallback' };
    const list = splits.get(ch) ?? [];
    if (!list.includes(posAt[x])) list.push(posAt[x]);
    splits.set(ch, list);
  }
  const orig = [...f.orig];
  const idOf = new Map<number, number>();
  const id = (x: number) => {
    if (fid[x] >= 0) return fid[x];
    let i = idOf.get(x);
    if (i === undefined) {
      i = orig.length;
      orig.push(x);
      idOf.set(x, i);
    }
    return i;
  };
  const U: number[] = [];
  const V: number[] = [];
  const W: number[] = [];
  const H: number[] = [];
  const chain: { edges: number[]; verts: number[] }[] = [];
  const add = (u: number, v: number, edges: number[], verts: number[]) => {
    let w = 0;
    for (const e of edges) w += g.edges[e].ohms;
    U.push(u);
    V.push(v);
    W.push(w);
    H.push(edges.length);
    chain.push({ edges, verts });
  };
  for (let i = 0; i < f.u.length; i++) {
    const cut = splits.get(i);
    if (!cut) {
      U.push(f.u[i]);
      V.push(f.v[i]);
      W.push(f.w[i]);
      H.push(f.hops[i]);
      chain.push(f.chain[i]);
      continue;
    }
    // Interior vertex j splits edges[0..j] | edges[j+1..].
    const { edges, verts } = f.chain[i];
    cut.sort((a, b) => a - b);
    let from = f.u[i];
    let e0 = 0;
    let v0 = 0;
    for (const j of cut) {
      const mid = id(verts[j]);
      add(from, mid, edges.slice(e0, j + 1), verts.slice(v0, j));
      from = mid;
      e0 = j + 1;
      v0 = j + 1;
    }
    add(from, f.v[i], edges.slice(e0), verts.slice(v0));
  }
  // The ends' branches, each one folded edge from the end to where it meets the core.
  for (const p of [ps, pt]) {
    if (p.edges.length) add(id(p.verts[0]), id(p.top), p.edges, p.verts.slice(1, -1));
  }
  return { kind: 'folded', f: foldedOf(U, V, W, H, chain, orig), fs: id(s), ft: id(t) };
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
  /** Vertices a search has touched, so the next resets only those. */
  touched: Int32Array;
  nTouched: number;
  hv: Int32Array;
  hw: Float64Array;
  hh: Float64Array;
}

function newBuffers(nf: number): Buffers {
  const B: Buffers = {
    dist: new Float64Array(nf).fill(Infinity), hops: new Float64Array(nf), prevE: new Int32Array(nf).fill(-1), done: new Uint8Array(nf),
    touched: new Int32Array(nf), nTouched: 0, hv: new Int32Array(64), hw: new Float64Array(64), hh: new Float64Array(64),
  };
  return B;
}

/**
 * Shortest (ohms, then steps) path from s to t avoiding blocked vertices and edges.
 * With a potential (each vertex's shortest distance to t with nothing blocked, a lower
 * bound whatever is blocked) the search is A*: it heads for t instead of spreading over
 * every circuit that is nearer to s than t is. With limitW it gives up once every path
 * left would be longer than that.
 */
function dijkstra(f: Folded, s: number, t: number, blockedV: Uint8Array, blockedE: Uint8Array, B: Buffers, pot: Potential | null, limitW = Infinity): FPath | null {
  const { dist, hops, prevE, done, touched } = B;
  for (let i = 0; i < B.nTouched; i++) {
    const x = touched[i];
    dist[x] = Infinity;
    prevE[x] = -1;
    done[x] = 0;
  }
  B.nTouched = 0;
  let { hv, hw, hh } = B;
  const pw = pot ? pot.w : null;
  const ph = pot ? pot.h : null;
  const reach = (x: number, w: number, h: number) => {
    if (dist[x] === Infinity) touched[B.nTouched++] = x;
    dist[x] = w;
    hops[x] = h;
  };
  reach(s, 0, 0);
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
  push(s, pw ? pw[s] : 0, ph ? ph[s] : 0);
  while (size > 0) {
    const x = hv[0];
    if (hw[0] > limitW) break;
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
      const nw = dx + f.w[ei];
      // Incidences come sorted by w + pw (sortByPotential): past the limit, so are the rest.
      if (pw && nw + pw[y] > limitW) break;
      if (blockedV[y] || done[y]) continue;
      if (pw && pw[y] === Infinity) continue; // no way on to t from there
      const nh = hx + f.hops[ei];
      const dy = dist[y];
      if (nw < dy || (nw === dy && nh < hops[y])) {
        reach(y, nw, nh);
        prevE[y] = ei;
        push(y, pw ? nw + pw[y] : nw, ph ? nh + ph[y] : nh);
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

/** Each vertex's (ohms, steps) to t on the whole folded graph. */
interface Potential {
  w: Float64Array;
  h: Float64Array;
}

/** Each vertex's incidences, cheapest way on toward t first, so a search with a limit can stop scanning a hub early. */
function sortByPotential(f: Folded, pot: Potential): void {
  const key = (x: number, ei: number) => f.w[ei] + pot.w[f.u[ei] === x ? f.v[ei] : f.u[ei]];
  for (let x = 0; x + 1 < f.ptr.length; x++) {
    const a = f.ptr[x];
    const b = f.ptr[x + 1];
    if (b - a < 2) continue;
    const list = Array.from(f.inc.subarray(a, b)).sort((e1, e2) => key(x, e1) - key(x, e2));
    f.inc.set(list, a);
  }
}

function potentialTo(f: Folded, t: number, B: Buffers): Potential {
  const nf = f.orig.length;
  const none = new Uint8Array(Math.max(nf, f.u.length));
  // A plain search from t to a vertex that does not exist visits everything reachable.
  dijkstra(f, t, -1, none, none, B, null);
  const w = new Float64Array(nf).fill(Infinity);
  const h = new Float64Array(nf);
  for (let i = 0; i < B.nTouched; i++) {
    const x = B.touched[i];
    w[x] = B.dist[x];
    h[x] = B.hops[x];
  }
  return { w, h };
}

/** Up to k simple paths from s to t, shortest first (Yen's algorithm on the folded graph). */
export function kShortestPaths(g: WalkGraph, s: number, t: number, k: number): RawPath[] {
  if (s === t) return [{ vertices: [s], edges: [], ohms: 0 }];
  const at = attach(g, s, t);
  if (at.kind === 'none') return [];
  if (at.kind === 'single') return [at.path];
  let f: Folded;
  let fs: number;
  let ft: number;
  if (at.kind === 'folded') ({ f, fs, ft } = at);
  else {
    const own = fold(g, s, t);
    if (!own) return [];
    f = own;
    fs = f.orig.indexOf(s);
    ft = f.orig.indexOf(t);
  }
  const nf = f.orig.length;
  const B = newBuffers(nf);
  const pot = potentialTo(f, ft, B);
  if (pot.w[fs] === Infinity) return [];
  sortByPotential(f, pot);
  const blockedV = new Uint8Array(nf);
  const blockedE = new Uint8Array(f.u.length);
  const first = dijkstra(f, fs, ft, blockedV, blockedE, B, pot);
  if (!first) return [];
  const A: FPath[] = [first];
  const cands: FPath[] = [];
  const seen = new Set<string>([first.edges.join(',')]);
  while (A.length < k) {
    const last = A[A.length - 1];
    // With as many candidates as paths still wanted, a spur longer than the worst of the best
    // of them would never be taken: its search may stop there (a margin keeps near-ties).
    const wanted = k - A.length;
    let bound = Infinity;
    if (cands.length >= wanted) {
      const ws = cands.map((c) => c.w).sort((a, b) => a - b);
      bound = ws[wanted - 1] * (1 + 1e-9) + 1e-9;
    }
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
      const sp = dijkstra(f, spur, ft, blockedV, blockedE, B, pot, bound - rw);
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

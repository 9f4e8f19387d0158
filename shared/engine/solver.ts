/**
 * DC solver for harness networks.
 *
 * A network is a set of raw nodes joined by conductances, current
 * injections and joins. A join ties two nodes exactly: v_b = v_a + offset
 * (offset 0 for a zero-ohm connection, the source volts for an ideal
 * battery or bias source). Joins are merged by a union-find that keeps each
 * node's offset to its root (supernodes), so ideal sources are exact and no
 * huge conductance spoils the matrix. The remaining nodal matrix is the
 * conductance Laplacian with the reference node removed: symmetric positive
 * definite on the part connected to the reference, and factorised as
 * L·D·Lᵀ in typed arrays with a minimum-degree ordering. Nodes with no
 * conductive path to the reference get NaN (floating).
 *
 * The ordering, the fill pattern and the scatter maps (the symbolic
 * factorisation) depend only on the pattern of the network, so they are
 * cached per pattern in a SolverCache: changing values (source volts, a
 * conductance going to 0 or back) reuses them.
 */

/** Growable typed arrays for building a network. */
export class NetworkBuilder {
  nodeCount: number;
  ea: Int32Array;
  eb: Int32Array;
  eg: Float64Array;
  edges = 0;
  ia: Int32Array = new Int32Array(64);
  iv: Float64Array = new Float64Array(64);
  injections = 0;
  ja: Int32Array = new Int32Array(64);
  jb: Int32Array = new Int32Array(64);
  jo: Float64Array = new Float64Array(64);
  joins = 0;

  /** expectedEdges: room to start with (the arrays grow as needed). */
  constructor(nodeCount: number, expectedEdges = 256) {
    this.nodeCount = nodeCount;
    const room = Math.max(16, expectedEdges);
    this.ea = new Int32Array(room);
    this.eb = new Int32Array(room);
    this.eg = new Float64Array(room);
  }

  /** Conductance g (siemens, ≥ 0) between a and b; returns its index. g = 0 keeps it in the pattern, carrying nothing. */
  conductance(a: number, b: number, g: number): number {
    if (this.edges === this.ea.length) {
      const n = this.ea.length * 2;
      this.ea = growI(this.ea, n);
      this.eb = growI(this.eb, n);
      this.eg = growF(this.eg, n);
    }
    this.ea[this.edges] = a;
    this.eb[this.edges] = b;
    this.eg[this.edges] = g;
    return this.edges++;
  }

  /** Current (amps) flowing into node a from outside. */
  inject(a: number, amps: number): void {
    if (this.injections === this.ia.length) {
      const n = this.ia.length * 2;
      this.ia = growI(this.ia, n);
      this.iv = growF(this.iv, n);
    }
    this.ia[this.injections] = a;
    this.iv[this.injections] = amps;
    this.injections++;
  }

  /** Exact tie: v_b = v_a + offset. */
  join(a: number, b: number, offset = 0): void {
    if (this.joins === this.ja.length) {
      const n = this.ja.length * 2;
      this.ja = growI(this.ja, n);
      this.jb = growI(this.jb, n);
      this.jo = growF(this.jo, n);
    }
    this.ja[this.joins] = a;
    this.jb[this.joins] = b;
    this.jo[this.joins] = offset;
    this.joins++;
  }

  /**
   * A source of `volts` (positive terminal `pos`) in series with `ohms`:
   * exact join when ohms is 0, else its Norton equivalent.
   */
  source(neg: number, pos: number, volts: number, ohms: number): void {
    if (ohms > 1e-6) {
      const g = 1 / ohms;
      this.conductance(neg, pos, g);
      this.inject(pos, volts * g);
      this.inject(neg, -volts * g);
    } else {
      this.join(neg, pos, volts);
    }
  }
}

function growI(a: Int32Array, n: number): Int32Array {
  const b = new Int32Array(n);
  b.set(a);
  return b;
}
function growF(a: Float64Array, n: number): Float64Array {
  const b = new Float64Array(n);
  b.set(a);
  return b;
}

/** Conductance used where two ideal joins contradict each other (an ideal source shorted): 1 µΩ. */
export const CONFLICT_SIEMENS = 1e6;

interface Symbolic {
  n: number;
  /** Per edge: (pivot u, pivot v) for the signature check; -1 for the reference. */
  edgeKey: Int32Array;
  /** Per edge: index into Lx of the off-diagonal entry, or -1 when one end is the reference or both ends coincide. */
  edgePos: Int32Array;
  colPtr: Int32Array;
  rowIdx: Int32Array;
  /** Per column, updates in pairs order; a value ≥ 0 is an Lx index, a value < 0 is diagonal −1−row. */
  updPtr: Int32Array;
  upd: Int32Array;
  /** pivot → unknown, unknown → pivot. */
  perm: Int32Array;
  iperm: Int32Array;
}

/** Cache of symbolic factorisations keyed by network pattern. */
export class SolverCache {
  private map = new Map<number, Symbolic[]>();
  hits = 0;
  misses = 0;
  get(hash: number, n: number, key: Int32Array): Symbolic | undefined {
    const list = this.map.get(hash);
    if (!list) return undefined;
    for (const s of list) {
      if (s.n !== n || s.edgeKey.length !== key.length) continue;
      let same = true;
      for (let i = 0; i < key.length; i++) if (s.edgeKey[i] !== key[i]) { same = false; break; }
      if (same) return s;
    }
    return undefined;
  }
  put(hash: number, s: Symbolic): void {
    const list = this.map.get(hash);
    if (list) {
      if (list.length > 8) list.shift();
      list.push(s);
    } else {
      if (this.map.size > 64) this.map.clear();
      this.map.set(hash, [s]);
    }
  }
}

export interface Solution {
  /** Volts per raw node relative to the reference; NaN where floating. */
  volts: Float64Array;
  /** Joins that contradicted earlier ones and were taken as 1 µΩ instead. */
  conflicts: number;
  /** Connected part of each node (through joins and conductances > 0). */
  component: Int32Array;
  /** The factorisation, for lowRankVolts. */
  factor?: Factor;
}

/**
 * The part of a solve that depends only on the network's structure: the
 * supernodes (joins), the unknowns, the pattern and its symbolic
 * factorisation. `numeric` then solves for any conductance values and
 * injections on the same structure.
 */
export interface Pattern {
  N: number;
  M: number;
  EA: Int32Array;
  EB: Int32Array;
  /** Conductances of the stand-ins for contradicting joins (appended after the network's edges). */
  extraG: Float64Array;
  /** Injections from the stand-ins, per node. */
  extraInj: Float64Array | null;
  root: Int32Array;
  rootOff: Float64Array;
  isRef: Uint8Array;
  known: Float64Array;
  unk: Int32Array;
  n: number;
  key: Int32Array;
  sym: Symbolic;
  conflicts: number;
}

/**
 * Structure of a solve with `reference` at 0 V. With localReferences, every
 * connected part without the reference gets its own (its first supernode,
 * through the conductances > 0 of `net`), so volts there are relative.
 */
export function analyse(net: NetworkBuilder, reference: number, cache?: SolverCache, order?: Int32Array, localReferences = false): Pattern {
  const N = net.nodeCount;
  // 1. Supernodes: weighted union-find, v(node) = v(parent) + off(node).
  const parent = new Int32Array(N);
  const off = new Float64Array(N);
  for (let i = 0; i < N; i++) parent[i] = i;
  let foundOff = 0;
  const find = (x: number): number => {
    let r = x;
    let o = 0;
    while (parent[r] !== r) {
      o += off[r];
      r = parent[r];
    }
    let y = x;
    let oy = o;
    while (parent[y] !== y) {
      const next = parent[y];
      const offY = off[y];
      parent[y] = r;
      off[y] = oy;
      oy -= offY;
      y = next;
    }
    foundOff = o;
    return r;
  };
  // Contradicting joins (an ideal source shorted) become 1 µΩ with a Norton source.
  const exA: number[] = [];
  const exB: number[] = [];
  const exO: number[] = [];
  for (let j = 0; j < net.joins; j++) {
    const a = net.ja[j];
    const b = net.jb[j];
    const d = net.jo[j];
    const ra = find(a);
    const oa = foundOff;
    const rb = find(b);
    const ob = foundOff;
    if (ra === rb) {
      if (Math.abs(ob - oa - d) > 1e-12 * (1 + Math.abs(d))) {
        exA.push(a);
        exB.push(b);
        exO.push(d);
      }
      continue;
    }
    parent[rb] = ra;
    off[rb] = oa + d - ob;
  }
  const root = new Int32Array(N);
  const rootOff = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    root[i] = find(i);
    rootOff[i] = foundOff;
  }
  const nEx = exA.length;
  const M = net.edges + nEx;
  const EA = new Int32Array(M);
  const EB = new Int32Array(M);
  EA.set(net.ea.subarray(0, net.edges));
  EB.set(net.eb.subarray(0, net.edges));
  const extraG = new Float64Array(nEx).fill(CONFLICT_SIEMENS);
  let extraInj: Float64Array | null = null;
  if (nEx) {
    extraInj = new Float64Array(N);
    for (let k = 0; k < nEx; k++) {
      EA[net.edges + k] = exA[k];
      EB[net.edges + k] = exB[k];
      extraInj[exB[k]] += exO[k] * CONFLICT_SIEMENS;
      extraInj[exA[k]] -= exO[k] * CONFLICT_SIEMENS;
    }
  }
  // 2. References.
  const refRoot = root[reference];
  const isRef = new Uint8Array(N);
  const known = new Float64Array(N);
  isRef[refRoot] = 1;
  known[refRoot] = -rootOff[reference];
  if (localReferences) {
    const g = new Float64Array(M).fill(CONFLICT_SIEMENS);
    g.set(net.eg.subarray(0, net.edges));
    const cp = components(N, M, EA, EB, root, g);
    const taken = new Uint8Array(N);
    taken[cp[refRoot]] = 1;
    for (let i = 0; i < N; i++) {
      if (root[i] !== i) continue;
      const c = cp[i];
      if (!taken[c]) {
        taken[c] = 1;
        isRef[i] = 1;
      }
    }
  }
  // 3. Unknowns: every other supernode that some edge touches, in node order. One that no
  // edge touches (a wire's spare middle node, say) is floating whatever the values: no unknown.
  const touched = new Uint8Array(N);
  for (let e = 0; e < M; e++) {
    touched[root[EA[e]]] = 1;
    touched[root[EB[e]]] = 1;
  }
  const unk = new Int32Array(N).fill(-1);
  let n = 0;
  for (let i = 0; i < N; i++) if (root[i] === i && !isRef[i] && touched[i]) unk[i] = n++;
  // 4. Pattern key: per edge, the unknowns of its ends (-1 = a reference).
  const key = new Int32Array(2 * M);
  let h = 2166136261 ^ n;
  for (let e = 0; e < M; e++) {
    const u = unk[root[EA[e]]];
    const v = unk[root[EB[e]]];
    key[2 * e] = u;
    key[2 * e + 1] = v;
    h = Math.imul(h ^ (u + 1), 16777619);
    h = Math.imul(h ^ (v + 1), 16777619);
  }
  let sym = cache?.get(h, n, key);
  if (!sym) {
    // Ordering: each unknown (a supernode) takes the latest position of its
    // members in the given raw-node order, or a fresh minimum-degree order.
    const perm = new Int32Array(n);
    const iperm = new Int32Array(n);
    if (order && order.length === N) {
      // Ranks are distinct (members are disjoint), so a bucket pass sorts them.
      const rank = new Int32Array(n).fill(-1);
      for (let i = 0; i < N; i++) {
        const u = unk[root[i]];
        if (u >= 0 && order[i] > rank[u]) rank[u] = order[i];
      }
      const slot = new Int32Array(N + 1).fill(-1);
      for (let u = 0; u < n; u++) slot[rank[u]] = u;
      let p = 0;
      for (let r = 0; r <= N; r++) {
        const u = slot[r];
        if (u >= 0) {
          perm[p] = u;
          iperm[u] = p++;
        }
      }
    } else {
      const eu = new Int32Array(M);
      const ev = new Int32Array(M);
      for (let e = 0; e < M; e++) {
        eu[e] = key[2 * e];
        ev[e] = key[2 * e + 1];
      }
      const pos = minimumDegreeOrder(n, eu, ev, M);
      for (let u = 0; u < n; u++) {
        iperm[u] = pos[u];
        perm[pos[u]] = u;
      }
    }
    sym = symbolic(n, key, M, perm, iperm);
    if (cache) {
      cache.misses++;
      cache.put(h, sym);
    }
  } else if (cache) cache.hits++;
  return { N, M, EA, EB, extraG, extraInj, root, rootOff, isRef, known, unk, n, key, sym, conflicts: nEx };
}

/** Connected part (a representative root) of every root through conductances > 0. */
function components(N: number, M: number, EA: Int32Array, EB: Int32Array, root: Int32Array, g: Float64Array | null): Int32Array {
  const cp = new Int32Array(N);
  for (let i = 0; i < N; i++) cp[i] = i;
  const cfind = (x: number): number => {
    while (cp[x] !== x) {
      cp[x] = cp[cp[x]];
      x = cp[x];
    }
    return x;
  };
  for (let e = 0; e < M; e++) {
    if (g && !(g[e] > 0)) continue;
    const a = cfind(root[EA[e]]);
    const b = cfind(root[EB[e]]);
    if (a !== b) cp[a] = b;
  }
  for (let i = 0; i < N; i++) cp[i] = cfind(i);
  return cp;
}

/**
 * Solve a pattern for conductances `eg` (one per network edge, ≥ 0) and
 * injections `inj` (amps into each raw node).
 */
export function numeric(pt: Pattern, eg: Float64Array, inj: Float64Array): Solution {
  const { N, M, EA, EB, root, rootOff, isRef, known, unk, n, key, sym } = pt;
  const nE = M - pt.extraG.length;
  // Every edge's conductance in one array (the network's, then the stand-ins for contradicting joins).
  const gAll = new Float64Array(M);
  gAll.set(eg.subarray(0, nE));
  gAll.set(pt.extraG, nE);
  const cp = components(N, M, EA, EB, root, gAll);
  // Live: in a connected part that holds a reference.
  const refPart = new Uint8Array(N);
  for (let i = 0; i < N; i++) if (isRef[i] && root[i] === i) refPart[cp[i]] = 1;
  const live = new Uint8Array(n);
  for (let i = 0; i < N; i++) {
    const u = unk[i];
    if (u >= 0 && refPart[cp[i]]) live[u] = 1;
  }
  const { colPtr, rowIdx, updPtr, upd, edgePos, perm, iperm } = sym;
  const D = new Float64Array(n);
  const Lx = new Float64Array(rowIdx.length);
  const rhs = new Float64Array(n);
  for (let i = 0; i < N; i++) {
    const q = inj[i] + (pt.extraInj ? pt.extraInj[i] : 0);
    if (q === 0) continue;
    const u = unk[root[i]];
    if (u >= 0 && live[u]) rhs[iperm[u]] += q;
  }
  for (let e = 0; e < M; e++) {
    const g = gAll[e];
    if (!(g > 0)) continue;
    const u = key[2 * e];
    const v = key[2 * e + 1];
    if (u === v && u >= 0) continue; // both ends in one supernode
    if (u >= 0 && !live[u]) continue;
    if (v >= 0 && !live[v]) continue;
    const ra = root[EA[e]];
    const rb = root[EB[e]];
    if (ra === rb) continue;
    // Current a→b = g·(v_ra + oa − v_rb − ob).
    const dOff = rootOff[EA[e]] - rootOff[EB[e]];
    if (u >= 0) {
      const pu = iperm[u];
      D[pu] += g;
      rhs[pu] -= g * dOff;
      if (v < 0) rhs[pu] += g * known[rb];
    }
    if (v >= 0) {
      const pv = iperm[v];
      D[pv] += g;
      rhs[pv] += g * dOff;
      if (u < 0) rhs[pv] += g * known[ra];
    }
    if (u >= 0 && v >= 0) Lx[edgePos[e]] -= g;
  }
  for (let p = 0; p < n; p++) if (!live[perm[p]]) D[p] = 1;

  // L·D·Lᵀ, right-looking with the precomputed scatter.
  for (let k = 0; k < n; k++) {
    let d = D[k];
    const c0 = colPtr[k];
    const c1 = colPtr[k + 1];
    if (!(d > 0)) {
      // Numerically floating (cannot happen for a live node in exact arithmetic).
      d = D[k] = 1;
      for (let e = c0; e < c1; e++) Lx[e] = 0;
    }
    for (let e = c0; e < c1; e++) Lx[e] /= d;
    let q = updPtr[k];
    for (let e1 = c0; e1 < c1; e1++) {
      const a1 = Lx[e1] * d;
      if (a1 === 0) {
        q += c1 - e1;
        continue;
      }
      for (let e2 = e1; e2 < c1; e2++) {
        const t = upd[q++];
        if (t < 0) D[-1 - t] -= a1 * Lx[e2];
        else Lx[t] -= a1 * Lx[e2];
      }
    }
  }
  const x = rhs;
  for (let k = 0; k < n; k++) {
    const xk = x[k];
    if (xk === 0) continue;
    for (let e = colPtr[k]; e < colPtr[k + 1]; e++) x[rowIdx[e]] -= Lx[e] * xk;
  }
  for (let k = 0; k < n; k++) x[k] /= D[k];
  for (let k = n - 1; k >= 0; k--) {
    let s = x[k];
    for (let e = colPtr[k]; e < colPtr[k + 1]; e++) s -= Lx[e] * x[rowIdx[e]];
    x[k] = s;
  }
  const volts = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const r = root[i];
    if (isRef[r]) volts[i] = refPart[cp[r]] ? known[r] + rootOff[i] : NaN;
    else {
      const u = unk[r];
      volts[i] = u >= 0 && live[u] ? x[iperm[u]] + rootOff[i] : NaN;
    }
  }
  const component = new Int32Array(N);
  for (let i = 0; i < N; i++) component[i] = cp[root[i]];
  return { volts, conflicts: pt.conflicts, component, factor: { D, Lx, live, x: Float64Array.from(x) } };
}

/** A numeric factorisation kept for low-rank changes. */
export interface Factor {
  D: Float64Array;
  Lx: Float64Array;
  live: Uint8Array;
  /** The solution in pivot order. */
  x: Float64Array;
}

function solveFactor(sym: Symbolic, f: Factor, r: Float64Array): void {
  const { colPtr, rowIdx } = sym;
  const n = sym.n;
  const { D, Lx } = f;
  for (let k = 0; k < n; k++) {
    const xk = r[k];
    if (xk === 0) continue;
    for (let e = colPtr[k]; e < colPtr[k + 1]; e++) r[rowIdx[e]] -= Lx[e] * xk;
  }
  for (let k = 0; k < n; k++) r[k] /= D[k];
  for (let k = n - 1; k >= 0; k--) {
    let s = r[k];
    for (let e = colPtr[k]; e < colPtr[k + 1]; e++) s -= Lx[e] * r[rowIdx[e]];
    r[k] = s;
  }
}

/** A conductance change dg between raw nodes a and b. */
export interface Change {
  a: number;
  b: number;
  dg: number;
}

/**
 * Volts after a few conductance changes, from an existing factorisation
 * (Sherman–Morrison–Woodbury): exact up to rounding, without refactoring.
 * Answers null when the changes would join or split connected parts (the
 * caller then solves afresh).
 */
export function lowRankVolts(pt: Pattern, f: Factor, changes: Change[]): Float64Array | null {
  const { N, root, rootOff, isRef, known, unk, sym } = pt;
  const { iperm } = sym;
  const n = sym.n;
  const us: number[] = [];
  const vs: number[] = [];
  const gs: number[] = [];
  const rhs = new Float64Array(n);
  let anyRhs = false;
  const liveOf = (r: number) => (isRef[r] ? 1 : unk[r] >= 0 ? f.live[unk[r]] : 0);
  for (const c of changes) {
    if (c.dg === 0 || !Number.isFinite(c.dg)) continue;
    const ra = root[c.a];
    const rb = root[c.b];
    if (ra === rb) continue;
    const la = liveOf(ra);
    const lb = liveOf(rb);
    if (la !== lb) return null; // would join a floating part
    if (!la) continue; // both floating: no effect on live volts
    const pa = isRef[ra] ? -1 : iperm[unk[ra]];
    const pb = isRef[rb] ? -1 : iperm[unk[rb]];
    if (pa < 0 && pb < 0) continue;
    const dOff = rootOff[c.a] - rootOff[c.b];
    if (pa >= 0) { rhs[pa] += c.dg * (-dOff + (pb < 0 ? known[rb] : 0)); anyRhs = true; }
    if (pb >= 0) { rhs[pb] += c.dg * (dOff + (pa < 0 ? known[ra] : 0)); anyRhs = true; }
    us.push(pa);
    vs.push(pb);
    gs.push(c.dg);
  }
  const k = us.length;
  // x1 = x0 + G⁻¹·Δrhs, then the Woodbury correction for ΔG = U·C·Uᵀ.
  const x = Float64Array.from(f.x);
  if (anyRhs) {
    solveFactor(sym, f, rhs);
    for (let i = 0; i < n; i++) x[i] += rhs[i];
  }
  if (k > 0) {
    const Z: Float64Array[] = [];
    for (let j = 0; j < k; j++) {
      const r = new Float64Array(n);
      if (us[j] >= 0) r[us[j]] = 1;
      if (vs[j] >= 0) r[vs[j]] = -1;
      solveFactor(sym, f, r);
      Z.push(r);
    }
    const ut = (j: number, v: Float64Array) => (us[j] >= 0 ? v[us[j]] : 0) - (vs[j] >= 0 ? v[vs[j]] : 0);
    // S = C⁻¹ + Uᵀ·Z (k × k), solve S·y = Uᵀ·x.
    const S = new Float64Array(k * k);
    const y = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) S[i * k + j] = ut(i, Z[j]) + (i === j ? 1 / gs[i] : 0);
      y[i] = ut(i, x);
    }
    // Gaussian elimination with partial pivoting.
    for (let c = 0; c < k; c++) {
      let p = c;
      for (let r = c + 1; r < k; r++) if (Math.abs(S[r * k + c]) > Math.abs(S[p * k + c])) p = r;
      if (!(Math.abs(S[p * k + c]) > 1e-300)) return null;
      if (p !== c) {
        for (let j = 0; j < k; j++) { const t = S[c * k + j]; S[c * k + j] = S[p * k + j]; S[p * k + j] = t; }
        const t = y[c]; y[c] = y[p]; y[p] = t;
      }
      for (let r = c + 1; r < k; r++) {
        const m = S[r * k + c] / S[c * k + c];
        if (m === 0) continue;
        for (let j = c; j < k; j++) S[r * k + j] -= m * S[c * k + j];
        y[r] -= m * y[c];
      }
    }
    for (let c = k - 1; c >= 0; c--) {
      let s = y[c];
      for (let j = c + 1; j < k; j++) s -= S[c * k + j] * y[j];
      y[c] = s / S[c * k + c];
    }
    for (let j = 0; j < k; j++) {
      const zj = Z[j];
      const yj = y[j];
      if (yj !== 0) for (let i = 0; i < n; i++) x[i] -= zj[i] * yj;
    }
  }
  const volts = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const r = root[i];
    if (isRef[r]) volts[i] = known[r] + rootOff[i];
    else {
      const u = unk[r];
      volts[i] = u >= 0 && f.live[u] ? x[iperm[u]] + rootOff[i] : NaN;
    }
  }
  return volts;
}

/** Injections of a network, summed per node. */
export function injectionsOf(net: NetworkBuilder): Float64Array {
  const inj = new Float64Array(net.nodeCount);
  for (let k = 0; k < net.injections; k++) inj[net.ia[k]] += net.iv[k];
  return inj;
}

/** Solve the network with `reference` at 0 V (see analyse for localReferences). */
export function solveNetwork(net: NetworkBuilder, reference: number, cache?: SolverCache, order?: Int32Array, localReferences = false): Solution {
  const pt = analyse(net, reference, cache, order, localReferences);
  return numeric(pt, net.eg, injectionsOf(net));
}

/**
 * Minimum-degree ordering of a graph of n nodes given as edge pairs
 * (eu[e], ev[e]); negative ends and self loops are ignored. Answers the
 * position of every node in the elimination order.
 *
 * Harness graphs are nearly trees: most eliminations are of degree 1 or 2,
 * so the work is kept per elimination, not per neighbour's list: adjacency
 * lives in one flat pool (a list moves to the pool's end only when it
 * outgrows its room), an eliminated node stays in its neighbours' lists
 * until a list is mostly stale (a hub such as a fused supply bus would
 * otherwise be rescanned at every one of its branches), and nodes wait in
 * buckets by degree, which makes each pick O(1).
 */
export function minimumDegreeOrder(n: number, eu: Int32Array, ev: Int32Array, m: number): Int32Array {
  const deg0 = new Int32Array(n + 1);
  for (let e = 0; e < m; e++) {
    const u = eu[e];
    const v = ev[e];
    if (u < 0 || v < 0 || u === v) continue;
    deg0[u + 1]++;
    deg0[v + 1]++;
  }
  for (let i = 0; i < n; i++) deg0[i + 1] += deg0[i];
  const flat = new Int32Array(deg0[n]);
  const fill = deg0.slice(0, n);
  for (let e = 0; e < m; e++) {
    const u = eu[e];
    const v = ev[e];
    if (u < 0 || v < 0 || u === v) continue;
    flat[fill[u]++] = v;
    flat[fill[v]++] = u;
  }
  // Deduplicated lists, each with a little room to grow.
  let pool = new Int32Array(deg0[n] + 2 * n + 16);
  let top = 0;
  const start = new Int32Array(n);
  const len = new Int32Array(n);
  const cap = new Int32Array(n);
  const deg = new Int32Array(n);
  const mark = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    start[i] = top;
    for (let j = deg0[i]; j < deg0[i + 1]; j++) {
      const x = flat[j];
      if (mark[x] !== i) {
        mark[x] = i;
        pool[top++] = x;
      }
    }
    len[i] = deg[i] = top - start[i];
    cap[i] = len[i] + 2;
    top = start[i] + cap[i];
  }
  const eliminated = new Uint8Array(n);
  const push = (u: number, x: number) => {
    if (len[u] === cap[u]) {
      // Mostly stale: compact in place; else move to the pool's end with twice the room.
      if (len[u] - deg[u] > len[u] >> 1) {
        let w = start[u];
        for (let j = start[u], e = start[u] + len[u]; j < e; j++) if (!eliminated[pool[j]]) pool[w++] = pool[j];
        len[u] = w - start[u];
      } else {
        const c = cap[u] * 2 + 4;
        if (top + c > pool.length) {
          const bigger = new Int32Array(Math.max(pool.length * 2, top + c));
          bigger.set(pool.subarray(0, top));
          pool = bigger;
        }
        pool.copyWithin(top, start[u], start[u] + len[u]);
        start[u] = top;
        cap[u] = c;
        top += c;
      }
    }
    pool[start[u] + len[u]++] = x;
    deg[u]++;
  };
  /** Is y in x's list? Scans the shorter of the two lists. */
  const linked = (x: number, y: number): boolean => {
    if (len[y] < len[x]) {
      const t = x;
      x = y;
      y = t;
    }
    for (let j = start[x], e = start[x] + len[x]; j < e; j++) if (pool[j] === y) return true;
    return false;
  };

  // Degree buckets: doubly linked lists; a node sits in the bucket of its degree when it was filed.
  const head = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n);
  const prev = new Int32Array(n);
  const filed = new Int32Array(n);
  let minDeg = 0;
  const file = (v: number) => {
    const d = deg[v] < n ? deg[v] : n;
    filed[v] = d;
    prev[v] = -1;
    next[v] = head[d];
    if (head[d] >= 0) prev[head[d]] = v;
    head[d] = v;
    if (d < minDeg) minDeg = d;
  };
  const unfile = (v: number) => {
    const d = filed[v];
    if (prev[v] >= 0) next[prev[v]] = next[v];
    else head[d] = next[v];
    if (next[v] >= 0) prev[next[v]] = prev[v];
  };
  for (let i = n - 1; i >= 0; i--) file(i);
  minDeg = 0;

  const pos = new Int32Array(n);
  let nb = new Int32Array(16);
  for (let p = 0; p < n; p++) {
    while (head[minDeg] < 0) minDeg++;
    const v = head[minDeg];
    unfile(v);
    pos[v] = p;
    eliminated[v] = 1;
    // The live neighbours lose v and become a clique.
    if (nb.length < deg[v]) nb = new Int32Array(deg[v] * 2);
    let d = 0;
    for (let j = start[v], e = start[v] + len[v]; j < e; j++) {
      const u = pool[j];
      if (!eliminated[u]) nb[d++] = u;
    }
    len[v] = deg[v] = 0;
    for (let i = 0; i < d; i++) {
      unfile(nb[i]);
      deg[nb[i]]--;
    }
    for (let i = 0; i < d; i++) {
      for (let k = i + 1; k < d; k++) {
        if (!linked(nb[i], nb[k])) {
          push(nb[i], nb[k]);
          push(nb[k], nb[i]);
        }
      }
    }
    for (let i = 0; i < d; i++) file(nb[i]);
  }
  return pos;
}

/**
 * Symbolic factorisation for the pattern `key` (per edge, the unknowns of
 * its ends) under the ordering perm/iperm: elimination tree, then each
 * row's structure by walking its row subtree, then the scatter maps.
 */
function symbolic(n: number, key: Int32Array, M: number, perm: Int32Array, iperm: Int32Array): Symbolic {
  // Lower-triangle adjacency in pivot space: for row i, columns j < i.
  const cnt = new Int32Array(n + 1);
  for (let e = 0; e < M; e++) {
    const u = key[2 * e];
    const v = key[2 * e + 1];
    if (u < 0 || v < 0 || u === v) continue;
    const pu = iperm[u];
    const pv = iperm[v];
    cnt[(pu > pv ? pu : pv) + 1]++;
  }
  for (let i = 0; i < n; i++) cnt[i + 1] += cnt[i];
  const low = new Int32Array(cnt[n]);
  const fp = cnt.slice(0, n);
  for (let e = 0; e < M; e++) {
    const u = key[2 * e];
    const v = key[2 * e + 1];
    if (u < 0 || v < 0 || u === v) continue;
    const pu = iperm[u];
    const pv = iperm[v];
    if (pu > pv) low[fp[pu]++] = pv;
    else low[fp[pv]++] = pu;
  }
  // Elimination tree (Liu, with path compression on ancestors).
  const etree = new Int32Array(n).fill(-1);
  const anc = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    for (let q = cnt[i]; q < cnt[i + 1]; q++) {
      let j = low[q];
      while (j !== -1 && j < i) {
        const nx = anc[j];
        anc[j] = i;
        if (nx === -1) {
          etree[j] = i;
          break;
        }
        j = nx;
      }
    }
  }
  // Row structures: L(i, k) ≠ 0 for every k on the paths from each j up to i.
  const flag = new Int32Array(n).fill(-1);
  const colCount = new Int32Array(n);
  const walk = (record: boolean, ptr: Int32Array, rows: Int32Array) => {
    flag.fill(-1);
    for (let i = 0; i < n; i++) {
      flag[i] = i;
      for (let q = cnt[i]; q < cnt[i + 1]; q++) {
        let k = low[q];
        while (k !== -1 && flag[k] !== i) {
          if (record) rows[ptr[k]++] = i;
          else colCount[k]++;
          flag[k] = i;
          k = etree[k];
        }
      }
    }
  };
  const dummy = new Int32Array(0);
  walk(false, dummy, dummy);
  const colPtr = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) colPtr[k + 1] = colPtr[k] + colCount[k];
  const rowIdx = new Int32Array(colPtr[n]);
  walk(true, colPtr.slice(0, n), rowIdx); // rows arrive in increasing order
  /** Index in Lx of entry (row r, column k), r > k; -1 if absent. */
  const at = (k: number, r: number): number => {
    let lo = colPtr[k];
    let hi = colPtr[k + 1] - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const x = rowIdx[mid];
      if (x === r) return mid;
      if (x < r) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  };
  let total = 0;
  const updPtr = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) {
    const c = colPtr[k + 1] - colPtr[k];
    updPtr[k] = total;
    total += (c * (c + 1)) / 2;
  }
  updPtr[n] = total;
  const upd = new Int32Array(total);
  let q = 0;
  for (let k = 0; k < n; k++) {
    for (let e1 = colPtr[k]; e1 < colPtr[k + 1]; e1++) {
      const r1 = rowIdx[e1];
      for (let e2 = e1; e2 < colPtr[k + 1]; e2++) {
        const r2 = rowIdx[e2];
        upd[q++] = r1 === r2 ? -1 - r1 : at(r1, r2); // r1 < r2: entry in column r1, row r2
      }
    }
  }
  const edgePos = new Int32Array(M).fill(-1);
  for (let e = 0; e < M; e++) {
    const u = key[2 * e];
    const v = key[2 * e + 1];
    if (u < 0 || v < 0 || u === v) continue;
    const pu = iperm[u];
    const pv = iperm[v];
    edgePos[e] = pu < pv ? at(pu, pv) : at(pv, pu);
  }
  return { n, edgeKey: key, edgePos, colPtr, rowIdx, updPtr, upd, perm, iperm };
}

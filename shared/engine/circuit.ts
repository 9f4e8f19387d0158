/**
 * The circuit a harness document makes in a machine state
 * (design/harness-format.md, "Components, their pins and their electrical model").
 *
 * Raw nodes: 0 is the chassis reference, then every pin of every component in
 * document order, then one internal ground per module, then one spare node
 * per wire (where a short to the frame splits it).
 *
 * Two build modes: `exact` merges zero-ohm joins and leaves out open
 * elements (used for readings and ohms); `fixed` keeps every element that
 * any state or single fault can switch in the pattern, with zero-ohm ones as
 * 1 µΩ, so the fault finder reuses one factorisation pattern for every
 * candidate (its tolerances are far wider than the µV this costs).
 */
import type { Component, HarnessDocument, HarnessState } from '../harness/schema';
import { componentPinIds } from '../harness/schema';
import { NetworkBuilder, SolverCache, minimumDegreeOrder, solveNetwork } from './solver';
import { wireOhms } from './wire';

export const DEFAULT_FUSE_OHMS = 0.005;
export const DEFAULT_BIAS_OHMS = 2500;
export const BUS_BIAS_VOLTS = 2.5;
export const DEFAULT_ON_OHMS = 0.05;
export const DEFAULT_REF_VOLTS = 5;
export const DEFAULT_REF_OHMS = 1;
export const DEFAULT_INPUT_OHMS = 100000;
/** A short to the frame: 0.05 Ω (the contract). */
export const SHORT_OHMS = 0.05;
/** Stand-in for zero ohms in the fixed-pattern mode. */
export const FIXED_ZERO_OHMS = 1e-6;
export const MAX_ROUNDS = 20;
/** Resistances at or below 1 µΩ are zero-ohm joins (off by at most 1 µV per amp; keeps the matrix well scaled). */
export const ZERO_OHMS = 1e-6;

export interface PMate { a: number; b: number; contactOhms: number; pairs: [number, number][] }
export interface PRelay { ci: number; n85: number; n86: number; n30: number; n87: number; n87a: number; coilOhms: number; pullIn: number; contactOhms: number }
export interface PSwitch { ci: number; positions: Map<string, [number, number][]>; first: string; contactOhms: number }
export interface PModule {
  ci: number;
  ig: number;
  hasGround: boolean;
  threshold: number;
  supplies: { node: number; ohms: number }[];
  grounds: number[];
  bus: { node: number; ohms: number }[];
  refs: { node: number; volts: number; ohms: number }[];
  inputs: { node: number; ohms: number }[];
  outputs: { node: number; from: number; ohms: number; ref: string }[];
}

/** Everything about a document that does not depend on the state; built once per document. */
export interface PreparedCircuit {
  doc: HarnessDocument;
  nominal: number;
  nodeCount: number;
  pinRefs: string[];
  pinComp: Int32Array;
  nodeOf: Map<string, number>;
  compIndex: Map<string, number>;
  wireA: Int32Array;
  wireB: Int32Array;
  wireR: Float64Array;
  wireSplit: Int32Array;
  readonly wireIndex: Map<string, number>;
  batteries: { ci: number; pos: number; neg: number; volts: number; ohms: number }[];
  grounds: { ci: number; node: number; ohms: number }[];
  fuses: { ci: number; n1: number; n2: number; ohms: number; amps: number }[];
  fuseOf: Map<number, number>;
  resistors: { ci: number; n1: number; n2: number; ohms: number }[];
  loads: { ci: number; n1: number; n2: number; ohms: number }[];
  mates: PMate[];
  /** Mated cavity ref (either half) → [mate index, pair index]. */
  readonly mateCavity: Map<string, [number, number]>;
  switches: PSwitch[];
  switchOf: Map<number, number>;
  relays: PRelay[];
  modules: PModule[];
  cache: SolverCache;
  /** About how many conductances a network of this circuit holds. */
  edgeHint: number;
  /** Raw-node elimination order for the solver, found once (lazily) on the graph of every element any state can switch in. */
  order: Int32Array | null;
}

export function prepareCircuit(doc: HarnessDocument): PreparedCircuit {
  const nominal = doc.nominalVolts;
  const pinRefs: string[] = ['(chassis)'];
  const pinCompArr: number[] = [-1];
  const nodeOf = new Map<string, number>();
  const compIndex = new Map<string, number>();
  // A component's pins take consecutive nodes in the order of componentPinIds, so a pin's
  // node is its component's first node plus its place (no text key to build and look up).
  // A component with a repeated pin id (only in a document that skipped validation) is looked up by text.
  const firstNode = new Int32Array(doc.components.length);
  const byText = new Uint8Array(doc.components.length);
  doc.components.forEach((c, ci) => {
    if (!compIndex.has(c.id)) compIndex.set(c.id, ci);
    firstNode[ci] = pinRefs.length;
    for (const p of componentPinIds(c)) {
      const ref = `${c.id}.${p}`;
      if (nodeOf.has(ref)) {
        byText[ci] = 1;
        continue;
      }
      nodeOf.set(ref, pinRefs.length);
      pinRefs.push(ref);
      pinCompArr.push(ci);
    }
  });
  let next = pinRefs.length;
  const node = (c: Component, p: string) => nodeOf.get(`${c.id}.${p}`) ?? 0;
  /** Node of the pin in place k of component ci (places as in componentPinIds). */
  const nodeAt = (ci: number, k: number, p: string) => (byText[ci] ? node(doc.components[ci], p) : firstNode[ci] + k);

  const batteries: PreparedCircuit['batteries'] = [];
  const grounds: PreparedCircuit['grounds'] = [];
  const fuses: PreparedCircuit['fuses'] = [];
  const fuseOf = new Map<number, number>();
  const resistors: PreparedCircuit['resistors'] = [];
  const loads: PreparedCircuit['loads'] = [];
  const mates: PMate[] = [];
  const switches: PSwitch[] = [];
  const switchOf = new Map<number, number>();
  const relays: PRelay[] = [];
  const modules: PModule[] = [];

  doc.components.forEach((c, ci) => {
    switch (c.kind) {
      case 'battery':
        batteries.push({ ci, pos: nodeAt(ci, 0, '+'), neg: nodeAt(ci, 1, '-'), volts: c.volts, ohms: c.internalOhms ?? 0 });
        break;
      case 'ground':
        grounds.push({ ci, node: nodeAt(ci, 0, 'G'), ohms: c.bondOhms ?? 0 });
        break;
      case 'fuse':
        fuseOf.set(ci, fuses.length);
        fuses.push({ ci, n1: nodeAt(ci, 0, '1'), n2: nodeAt(ci, 1, '2'), ohms: c.ohms ?? DEFAULT_FUSE_OHMS, amps: c.amps });
        break;
      case 'resistor':
        resistors.push({ ci, n1: nodeAt(ci, 0, '1'), n2: nodeAt(ci, 1, '2'), ohms: c.ohms });
        break;
      case 'load': {
        const ohms = c.ohms !== undefined ? c.ohms : c.watts ? (nominal * nominal) / c.watts : Infinity;
        loads.push({ ci, n1: nodeAt(ci, 0, '1'), n2: nodeAt(ci, 1, '2'), ohms });
        break;
      }
      case 'connector': {
        if (c.matesWith === undefined) break;
        const oi = compIndex.get(c.matesWith);
        const other = oi === undefined ? undefined : doc.components[oi];
        if (!other || other.kind !== 'connector') break;
        const ca = componentPinIds(c);
        const cb = componentPinIds(other);
        const pairs: [number, number][] = [];
        for (let k = 0; k < Math.min(ca.length, cb.length); k++) pairs.push([nodeAt(ci, k, ca[k]), nodeAt(oi!, k, cb[k])]);
        mates.push({ a: ci, b: oi!, contactOhms: c.contactOhms ?? 0, pairs });
        break;
      }
      case 'switch': {
        const positions = new Map<string, [number, number][]>();
        for (const [name, pairs] of Object.entries(c.positions)) positions.set(name, pairs.map(([a, b]) => [node(c, a), node(c, b)]));
        switchOf.set(ci, switches.length);
        switches.push({ ci, positions, first: Object.keys(c.positions)[0] ?? '', contactOhms: c.contactOhms ?? 0 });
        break;
      }
      case 'relay':
        relays.push({
          ci,
          n85: nodeAt(ci, 0, '85'),
          n86: nodeAt(ci, 1, '86'),
          n30: nodeAt(ci, 2, '30'),
          n87: nodeAt(ci, 3, '87'),
          n87a: c.normallyClosed ? nodeAt(ci, 4, '87a') : -1,
          coilOhms: c.coilOhms,
          pullIn: c.pullInVolts ?? 0.6 * nominal,
          contactOhms: c.contactOhms ?? 0,
        });
        break;
      case 'module': {
        const ig = next++;
        const m: PModule = { ci, ig, hasGround: false, threshold: c.poweredAboveVolts ?? 0.5 * nominal, supplies: [], grounds: [], bus: [], refs: [], inputs: [], outputs: [] };
        c.pins.forEach((p, k) => {
          const n = nodeAt(ci, k, p.id);
          switch (p.role) {
            case 'supply': m.supplies.push({ node: n, ohms: p.ohms }); break;
            case 'ground': m.grounds.push(n); m.hasGround = true; break;
            case 'can_h': case 'can_l': m.bus.push({ node: n, ohms: p.biasOhms ?? DEFAULT_BIAS_OHMS }); break;
            case 'ref5': m.refs.push({ node: n, volts: p.volts ?? DEFAULT_REF_VOLTS, ohms: p.ohms ?? DEFAULT_REF_OHMS }); break;
            case 'input': m.inputs.push({ node: n, ohms: p.ohms ?? DEFAULT_INPUT_OHMS }); break;
            case 'output': m.outputs.push({ node: n, from: node(c, p.from), ohms: p.onOhms ?? DEFAULT_ON_OHMS, ref: `${c.id}.${p.id}` }); break;
          }
        });
        modules.push(m);
        break;
      }
      default:
        break;
    }
  });

  const nw = doc.wires.length;
  const wireA = new Int32Array(nw);
  const wireB = new Int32Array(nw);
  const wireR = new Float64Array(nw);
  const wireSplit = new Int32Array(nw);
  doc.wires.forEach((w, i) => {
    wireA[i] = nodeOf.get(w.from) ?? 0;
    wireB[i] = nodeOf.get(w.to) ?? 0;
    wireR[i] = wireOhms(w, doc.temperatureC);
    wireSplit[i] = next++;
  });

  // Wanted only for faults: built on first use.
  let wireIndex: Map<string, number> | null = null;
  let mateCavity: Map<string, [number, number]> | null = null;
  return {
    doc, nominal, nodeCount: next, pinRefs, pinComp: Int32Array.from(pinCompArr), nodeOf, compIndex,
    wireA, wireB, wireR, wireSplit, batteries, grounds, fuses, fuseOf, resistors, loads,
    mates, switches, switchOf, relays, modules, cache: new SolverCache(), order: null,
    edgeHint: 2 * nw + 2 * doc.components.length + mates.reduce((n, m) => n + m.pairs.length, 0) + 16,
    get wireIndex() {
      if (!wireIndex) {
        wireIndex = new Map();
        doc.wires.forEach((w, i) => {
          if (!wireIndex!.has(w.id)) wireIndex!.set(w.id, i);
        });
      }
      return wireIndex;
    },
    get mateCavity() {
      if (!mateCavity) {
        mateCavity = new Map();
        mates.forEach((m, mi) => m.pairs.forEach(([a, b], k) => {
          mateCavity!.set(pinRefs[a], [mi, k]);
          mateCavity!.set(pinRefs[b], [mi, k]);
        }));
      }
      return mateCavity;
    },
  };
}

/** A single fault resolved to indices. */
export type ResolvedFault =
  | { kind: 'open'; wire: number }
  | { kind: 'short'; wires: { wire: number; at: number }[] }
  | { kind: 'blown'; fuse: number }
  | { kind: 'high-wire'; wire: number; ohms: number }
  | { kind: 'high-mate'; mate: number; pair: number; ohms: number }
  | { kind: 'missing'; resistor: number };

/** What the state sets, plus relay and module states for one round. */
export interface Config {
  /** Position name per switch (index as in prep.switches). */
  positions: string[];
  unplugged: Set<number>;
  /** Volts per battery, or null with the power off (batteries removed). */
  sources: Float64Array | null;
  outputs: Set<string>;
  relayOn: Uint8Array;
  modOn: Uint8Array;
  fault: ResolvedFault | null;
  /** Fuses taken as blown besides the fault (a fuse the fault blows on insert). */
  openFuses?: Set<number>;
  fixed: boolean;
}

export function baseConfig(prep: PreparedCircuit, state: HarnessState | null, powerOff: boolean): Config {
  const positions = prep.switches.map((s) => {
    const comp = prep.doc.components[s.ci];
    const want = state?.switches[comp.id];
    return want !== undefined && s.positions.has(want) ? want : s.first;
  });
  const unplugged = new Set<number>();
  for (const id of state?.unplugged ?? []) {
    const ci = prep.compIndex.get(id);
    if (ci !== undefined) unplugged.add(ci);
  }
  let sources: Float64Array | null = null;
  if (!powerOff) {
    sources = Float64Array.from(prep.batteries.map((b) => {
      const id = prep.doc.components[b.ci].id;
      const v = state?.sources?.[id];
      return typeof v === 'number' ? v : b.volts;
    }));
  }
  return {
    positions,
    unplugged,
    sources,
    outputs: new Set(powerOff ? [] : state?.outputs ?? []),
    relayOn: new Uint8Array(prep.relays.length),
    modOn: new Uint8Array(prep.modules.length),
    fault: null,
    fixed: false,
  };
}

export interface BuiltNetwork {
  net: NetworkBuilder;
  /** Edge index of each fuse's conductance, or -1 where it is a zero-ohm join or open. */
  fuseEdge: Int32Array;
  /** Edge index of each resistor's conductance (-1 as for fuses). */
  resistorEdge: Int32Array;
  /** Edge index of each mate's first cavity pair (fixed mode: pairs follow in order), else -1. */
  mateEdge: Int32Array;
}

export function buildNetwork(prep: PreparedCircuit, cfg: Config): BuiltNetwork {
  // Room for every element a state can switch in, so the arrays need not grow on the way.
  const net = new NetworkBuilder(prep.nodeCount, prep.edgeHint);
  const fixed = cfg.fixed;
  const R = (a: number, b: number, ohms: number, on: boolean): number => {
    if (fixed) return net.conductance(a, b, on && ohms < Infinity ? 1 / Math.max(ohms, FIXED_ZERO_OHMS) : 0);
    if (!(ohms < Infinity)) return -1;
    // At or below a microhm a resistance is taken as a join (its conductance would spoil the matrix, or overflow).
    // An open element stays in the pattern carrying nothing, so a state or fault that opens it reuses the factorisation pattern.
    if (ohms > ZERO_OHMS) return net.conductance(a, b, on ? 1 / ohms : 0);
    if (!on) return -1;
    net.join(a, b, 0);
    return -1;
  };
  const f = cfg.fault;
  const shortAt = new Map<number, number>();
  if (f?.kind === 'short') for (const s of f.wires) shortAt.set(s.wire, s.at);

  // Wires.
  const nw = prep.wireA.length;
  for (let i = 0; i < nw; i++) {
    let r = prep.wireR[i];
    const on = !(f?.kind === 'open' && f.wire === i);
    if (f?.kind === 'high-wire' && f.wire === i) r = f.ohms;
    const at = shortAt.get(i);
    if (fixed || at !== undefined) {
      const t = at ?? 0.5;
      const m = prep.wireSplit[i];
      R(prep.wireA[i], m, r * t, on);
      R(m, prep.wireB[i], r * (1 - t), on);
      if (fixed) net.conductance(m, 0, at !== undefined ? 1 / SHORT_OHMS : 0);
      else net.conductance(m, 0, 1 / SHORT_OHMS);
    } else {
      R(prep.wireA[i], prep.wireB[i], r, on);
    }
  }
  // Grounds, batteries.
  for (const g of prep.grounds) R(g.node, 0, g.ohms, true);
  if (cfg.sources) {
    prep.batteries.forEach((b, k) => net.source(b.neg, b.pos, cfg.sources![k], b.ohms));
  }
  // Fuses, resistors, loads.
  const fuseEdge = new Int32Array(prep.fuses.length).fill(-1);
  prep.fuses.forEach((fu, k) => {
    fuseEdge[k] = R(fu.n1, fu.n2, fu.ohms, !(f?.kind === 'blown' && f.fuse === k) && !cfg.openFuses?.has(k));
  });
  const resistorEdge = new Int32Array(prep.resistors.length).fill(-1);
  prep.resistors.forEach((r, k) => {
    resistorEdge[k] = R(r.n1, r.n2, r.ohms, !(f?.kind === 'missing' && f.resistor === k));
  });
  for (const l of prep.loads) R(l.n1, l.n2, l.ohms, true);
  // Mates.
  const mateEdge = new Int32Array(prep.mates.length).fill(-1);
  prep.mates.forEach((m, mi) => {
    const on = !cfg.unplugged.has(m.a) && !cfg.unplugged.has(m.b);
    m.pairs.forEach(([a, b], k) => {
      const ohms = f?.kind === 'high-mate' && f.mate === mi && f.pair === k ? f.ohms : m.contactOhms;
      const e = R(a, b, ohms, on);
      if (k === 0) mateEdge[mi] = e;
    });
  });
  // Switches.
  prep.switches.forEach((s, k) => {
    const pos = cfg.positions[k];
    if (fixed) {
      for (const [name, pairs] of s.positions) for (const [a, b] of pairs) R(a, b, s.contactOhms, name === pos);
    } else {
      for (const [a, b] of s.positions.get(pos) ?? []) R(a, b, s.contactOhms, true);
    }
  });
  // Relays.
  prep.relays.forEach((r, k) => {
    R(r.n85, r.n86, r.coilOhms, true);
    const on = cfg.relayOn[k] === 1;
    R(r.n30, r.n87, r.contactOhms, on);
    if (r.n87a >= 0) R(r.n30, r.n87a, r.contactOhms, !on);
  });
  // Modules.
  prep.modules.forEach((m, k) => {
    const powered = cfg.modOn[k] === 1;
    for (const s of m.supplies) R(s.node, m.ig, s.ohms, true);
    for (const g of m.grounds) net.join(m.ig, g, 0);
    if (!m.hasGround) net.join(0, m.ig, 0);
    const src = (node: number, volts: number, ohms: number) => {
      if (ohms > ZERO_OHMS) {
        net.conductance(m.ig, node, powered ? 1 / ohms : 0);
        if (powered) {
          net.inject(node, volts / ohms);
          net.inject(m.ig, -volts / ohms);
        }
      } else if (powered) net.join(m.ig, node, volts);
    };
    for (const b of m.bus) src(b.node, BUS_BIAS_VOLTS, b.ohms);
    for (const r of m.refs) src(r.node, r.volts, r.ohms);
    for (const i of m.inputs) R(i.node, m.ig, i.ohms, true);
    for (const o of m.outputs) R(o.node, o.from, o.ohms, powered && cfg.outputs.has(o.ref));
  });
  return { net, fuseEdge, resistorEdge, mateEdge };
}

/** The raw-node order, computed once per prepared circuit. */
export function orderFor(prep: PreparedCircuit): Int32Array {
  if (prep.order) return prep.order;
  // The exact circuit with relays pulled in and modules powered: every element but the spare
  // wire nodes, which then come first in the order (each has two neighbours: no fill to speak of).
  const cfg = baseConfig(prep, null, false);
  cfg.modOn.fill(1);
  cfg.relayOn.fill(1);
  const { net } = buildNetwork(prep, cfg);
  const m = net.edges + net.joins;
  const eu = new Int32Array(m);
  const ev = new Int32Array(m);
  eu.set(net.ea.subarray(0, net.edges));
  ev.set(net.eb.subarray(0, net.edges));
  eu.set(net.ja.subarray(0, net.joins), net.edges);
  ev.set(net.jb.subarray(0, net.joins), net.edges);
  // The chassis reference is the biggest hub and the usual reference: left out of the ordering, always last.
  for (let e = 0; e < m; e++) {
    if (eu[e] === 0) eu[e] = -1;
    if (ev[e] === 0) ev[e] = -1;
  }
  const order = minimumDegreeOrder(prep.nodeCount, eu, ev, m);
  const c = order[0];
  for (let i = 0; i < order.length; i++) if (order[i] > c) order[i]--;
  order[0] = prep.nodeCount - 1;
  prep.order = order;
  return order;
}

export interface SettledSolution {
  volts: Float64Array;
  status: 'settled' | 'unsettled';
  relayOn: Uint8Array;
  modOn: Uint8Array;
  rounds: number;
  built: BuiltNetwork;
}

export function nextStates(prep: PreparedCircuit, v: Float64Array, relayOn: Uint8Array, modOn: Uint8Array): boolean {
  let changed = false;
  prep.relays.forEach((r, k) => {
    const dv = Math.abs(v[r.n85] - v[r.n86]);
    const on = dv >= r.pullIn ? 1 : 0; // NaN compares false: released
    if (on !== relayOn[k]) {
      relayOn[k] = on;
      changed = true;
    }
  });
  prep.modules.forEach((m, k) => {
    let on = 0;
    for (const s of m.supplies) if (v[s.node] - v[m.ig] >= m.threshold) on = 1;
    if (on !== modOn[k]) {
      modOn[k] = on;
      changed = true;
    }
  });
  return changed;
}

/**
 * Solve with relays and modules found by iteration from cfg's starting
 * relayOn/modOn (released and unpowered for the contract's readings).
 * With the power off there is nothing to settle: one solve.
 */
export function settle(prep: PreparedCircuit, cfg: Config): SettledSolution {
  let rounds = 0;
  for (;;) {
    const built = buildNetwork(prep, cfg);
    const { volts } = solveNetwork(built.net, 0, prep.cache, orderFor(prep));
    rounds++;
    if (!cfg.sources) return { volts, status: 'settled', relayOn: cfg.relayOn, modOn: cfg.modOn, rounds, built };
    const relayOn = Uint8Array.from(cfg.relayOn);
    const modOn = Uint8Array.from(cfg.modOn);
    const changed = nextStates(prep, volts, relayOn, modOn);
    if (!changed) return { volts, status: 'settled', relayOn: cfg.relayOn, modOn: cfg.modOn, rounds, built };
    if (rounds >= MAX_ROUNDS) return { volts, status: 'unsettled', relayOn: cfg.relayOn, modOn: cfg.modOn, rounds, built };
    cfg = { ...cfg, relayOn, modOn };
  }
}

/**
 * Resistance between nodes a and b with the power off in cfg (no sources):
 * 1 A in at a and out at b, every connected part referenced on its own so
 * the pattern does not depend on a and b. null when no path joins them.
 */
export function twoPointOhms(prep: PreparedCircuit, cfg: Config, a: number, b: number): number | null {
  if (a === b) return 0;
  const built = buildNetwork(prep, { ...cfg, sources: null });
  built.net.inject(a, 1);
  built.net.inject(b, -1);
  const sol = solveNetwork(built.net, 0, prep.cache, orderFor(prep), true);
  if (sol.component[a] !== sol.component[b]) return null;
  const r = sol.volts[a] - sol.volts[b];
  return Number.isFinite(r) ? Math.max(0, r) : null;
}

/** Current through each fuse (amps, from pin 1 to pin 2), NaN where it cannot be told (open, zero-ohm join, floating). */
export function fuseCurrents(prep: PreparedCircuit, built: BuiltNetwork, volts: Float64Array): Float64Array {
  const out = new Float64Array(prep.fuses.length).fill(NaN);
  prep.fuses.forEach((fu, k) => {
    const e = built.fuseEdge[k];
    if (e < 0) return;
    const g = built.net.eg[e];
    const i = g * (volts[fu.n1] - volts[fu.n2]);
    out[k] = g === 0 ? 0 : i;
  });
  return out;
}

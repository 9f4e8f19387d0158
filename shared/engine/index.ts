/**
 * The engine's public functions. `prepareHarness(doc)` does the per-document
 * work once (pins, circuit tables, elimination order, solver pattern cache,
 * readings per state) so a server can keep one per revision; the plain
 * functions below prepare on each call.
 *
 * Every function takes a validated document and never throws on bad
 * arguments: an unknown state or pin answers null (or an empty result).
 */
import type { HarnessDocument } from '../harness/schema';
import { bladeFuseColour } from '../standards/iso8820';
import { baseConfig, prepareCircuit, settle, twoPointOhms, type PreparedCircuit } from './circuit';
import { buildWalkGraph, kShortestPaths, type WalkGraph } from './walk';
import type { Fault, FaultReadings, Observation, SuspectsResult } from './faults';
import { faultReadingsFor, listFaultsFor, suspectsFor } from './faults';

export type { Fault, FaultReadings, Observation, SuspectsResult, Suspect, PredictedReading } from './faults';
export { wireOhms, copperOhms, awgDiameterMm, crossSectionMm2, COPPER_RESISTIVITY, COPPER_ALPHA } from './wire';

export interface PinReading {
  ref: string;
  volts: number | null;
}

export interface Readings {
  state: string;
  status: 'settled' | 'unsettled';
  pins: PinReading[];
}

/** One pin on a walk. */
export interface WalkPinStep {
  type: 'pin';
  ref: string;
  component: string;
  kind: string;
  cavityFunction?: string;
  /** Expected volts in every state of the document. */
  volts: Record<string, number | null>;
  /** Series resistance from the start of the walk to this pin. */
  ohmsFromStart: number;
}

export type WalkElementStep =
  | { type: 'wire'; id: string; from: string; to: string; color?: string; size: { mm2: number } | { awg: number }; lengthM: number; circuit?: string; ohms: number }
  | { type: 'mate'; connector: string; mate: string; cavity: string; mateCavity: string; ohms: number }
  /** A splice step follows the splice's pin step: the wires meet there. */
  | { type: 'splice'; id: string }
  | { type: 'fuse'; id: string; amps: number; colour: { name: string; hex: string } | null; ohms: number }
  | { type: 'switch'; id: string; positions: string[]; ohms: number }
  | { type: 'relay-contact'; id: string; contact: '87' | '87a'; ohms: number }
  | { type: 'resistor'; id: string; ohms: number }
  | { type: 'load'; id: string; ohms: number }
  /** Ground bond to the chassis reference and back out through another ground: `ohms` is both bonds. */
  | { type: 'chassis'; from: string; to: string; ohms: number };

export type WalkStep = WalkPinStep | WalkElementStep;

export interface WalkPath {
  ohms: number;
  steps: WalkStep[];
}

export interface WalkResult {
  paths: WalkPath[];
}

export const MAX_WALK_PATHS = 20;

export interface MachineState {
  state: string;
  status: 'settled' | 'unsettled';
  relays: Record<string, boolean>;
  modules: Record<string, boolean>;
}

export interface PreparedHarness {
  doc: HarnessDocument;
  circuit: PreparedCircuit;
  /** Pin refs in document order. */
  pins: string[];
  hasPin(ref: string): boolean;
  hasState(id: string): boolean;
  readings(stateId: string): Readings | null;
  /** Relays energised and modules powered once a state has settled. */
  machineState(stateId: string): MachineState | null;
  ohms(a: string, b: string, stateId?: string): number | null;
  walk(from: string, to: string, stateId?: string): WalkResult;
  listFaults(): Fault[];
  faultReadings(fault: Fault, stateId: string): FaultReadings | null;
  suspects(observations: Observation[]): SuspectsResult;
}

export interface StateSolution {
  volts: Float64Array;
  status: 'settled' | 'unsettled';
  relayOn: Uint8Array;
  modOn: Uint8Array;
}

export function prepareHarness(doc: HarnessDocument): PreparedHarness {
  const circuit = prepareCircuit(doc);
  const pins = circuit.pinRefs.slice(1);
  const solved = new Map<string, StateSolution>();
  const solveState = (id: string): StateSolution | null => {
    const hit = solved.get(id);
    if (hit) return hit;
    const state = doc.states.find((s) => s.id === id);
    if (!state) return null;
    const sol = settle(circuit, baseConfig(circuit, state, false));
    const out = { volts: sol.volts, status: sol.status, relayOn: sol.relayOn, modOn: sol.modOn };
    solved.set(id, out);
    return out;
  };
  const graphs = new Map<string, WalkGraph>();
  const graphFor = (stateId: string | undefined): WalkGraph | null => {
    const key = stateId ?? '\u0000any';
    const hit = graphs.get(key);
    if (hit) return hit;
    let g: WalkGraph;
    if (stateId === undefined) {
      g = buildWalkGraph(circuit, { positions: null, unplugged: new Set(), relayOn: null });
    } else {
      const state = doc.states.find((s) => s.id === stateId);
      const sol = solveState(stateId);
      if (!state || !sol) return null;
      const cfg = baseConfig(circuit, state, false);
      g = buildWalkGraph(circuit, { positions: cfg.positions, unplugged: cfg.unplugged, relayOn: sol.relayOn });
    }
    graphs.set(key, g);
    return g;
  };

  const self: PreparedHarness = guardMethods({
    doc,
    circuit,
    pins,
    hasPin: (ref) => circuit.nodeOf.has(ref),
    hasState: (id) => doc.states.some((s) => s.id === id),
    readings(stateId) {
      const sol = solveState(stateId);
      if (!sol) return null;
      return { state: stateId, status: sol.status, pins: pins.map((ref, i) => ({ ref, volts: num(sol.volts[i + 1]) })) };
    },
    machineState(stateId) {
      const sol = solveState(stateId);
      if (!sol) return null;
      const relays: Record<string, boolean> = {};
      circuit.relays.forEach((r, k) => (relays[doc.components[r.ci].id] = sol.relayOn[k] === 1));
      const modules: Record<string, boolean> = {};
      circuit.modules.forEach((m, k) => (modules[doc.components[m.ci].id] = sol.modOn[k] === 1));
      return { state: stateId, status: sol.status, relays, modules };
    },
    ohms(a, b, stateId) {
      const na = circuit.nodeOf.get(a);
      const nb = circuit.nodeOf.get(b);
      if (na === undefined || nb === undefined) return null;
      if (na === nb) return 0;
      let state = null;
      if (stateId !== undefined) {
        state = doc.states.find((s) => s.id === stateId) ?? null;
        if (!state) return null;
      }
      return twoPointOhms(circuit, baseConfig(circuit, state, true), na, nb);
    },
    walk(from, to, stateId) {
      const s = circuit.nodeOf.get(from);
      const t = circuit.nodeOf.get(to);
      const g = graphFor(stateId);
      if (s === undefined || t === undefined || !g) return { paths: [] };
      const raw = kShortestPaths(g, s, t, MAX_WALK_PATHS);
      const stateVolts = doc.states.map((st) => [st.id, solveState(st.id)!.volts] as const);
      return { paths: raw.map((p) => ({ ohms: p.ohms, steps: stepsOf(circuit, g, p.vertices, p.edges, stateVolts) })) };
    },
    listFaults: () => listFaultsFor(circuit),
    faultReadings: (fault, stateId) => faultReadingsFor(circuit, fault, stateId),
    suspects: (observations) => suspectsFor(circuit, observations, (id) => solveState(id)),
  });
  return self;
}

/** Every method answers its empty result instead of throwing. */
function guardMethods(h: PreparedHarness): PreparedHarness {
  return {
    ...h,
    hasPin: (ref) => safe(false, () => h.hasPin(ref)),
    hasState: (id) => safe(false, () => h.hasState(id)),
    readings: (id) => safe(null, () => h.readings(id)),
    machineState: (id) => safe(null, () => h.machineState(id)),
    ohms: (a, b, st) => safe(null, () => h.ohms(a, b, st)),
    walk: (a, b, st) => safe({ paths: [] }, () => h.walk(a, b, st)),
    listFaults: () => safe([], () => h.listFaults()),
    faultReadings: (f, st) => safe(null, () => h.faultReadings(f, st)),
    suspects: (o) => safe({ suspects: [], nextUnplug: null }, () => h.suspects(o)),
  };
}

function num(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

function stepsOf(prep: PreparedCircuit, g: WalkGraph, vertices: number[], edges: number[], stateVolts: (readonly [string, Float64Array])[]): WalkStep[] {
  const doc = prep.doc;
  const steps: WalkStep[] = [];
  let acc = 0;
  const pinStep = (v: number): WalkPinStep => {
    const ref = prep.pinRefs[v];
    const ci = prep.pinComp[v];
    const comp = doc.components[ci];
    const pid = ref.slice(comp.id.length + 1);
    const volts: Record<string, number | null> = {};
    for (const [id, vs] of stateVolts) volts[id] = num(vs[v]);
    const step: WalkPinStep = { type: 'pin', ref, component: comp.id, kind: comp.kind, volts, ohmsFromStart: acc };
    if (comp.kind === 'connector') {
      const cav = comp.cavities.find((c) => typeof c !== 'string' && c.id === pid);
      if (cav && typeof cav !== 'string' && cav.function !== undefined) step.cavityFunction = cav.function;
    } else if (comp.kind === 'module') {
      const p = comp.pins.find((q) => q.id === pid);
      if (p?.function !== undefined) step.cavityFunction = p.function;
    }
    return step;
  };
  for (let i = 0; i < vertices.length; i++) {
    const v = vertices[i];
    if (v === 0) continue; // the chassis reference is folded into a chassis step
    steps.push(pinStep(v));
    if (i > 0 && i < vertices.length - 1 && doc.components[prep.pinComp[v]].kind === 'splice') {
      steps.push({ type: 'splice', id: doc.components[prep.pinComp[v]].id });
    }
    if (i === vertices.length - 1) break;
    const e = g.edges[edges[i]];
    if (e.type === 'bond') {
      // pin G → chassis → pin G': one chassis step with both bonds.
      const e2 = g.edges[edges[i + 1]];
      const nextPin = vertices[i + 2];
      acc += e.ohms + (e2 ? e2.ohms : 0);
      steps.push({ type: 'chassis', from: prep.pinRefs[v], to: nextPin !== undefined ? prep.pinRefs[nextPin] : '', ohms: e.ohms + (e2 ? e2.ohms : 0) });
      continue;
    }
    acc += e.ohms;
    steps.push(elementStep(prep, e, v));
  }
  return steps;
}

function elementStep(prep: PreparedCircuit, e: WalkGraph['edges'][number], fromVertex: number): WalkElementStep {
  const doc = prep.doc;
  switch (e.type) {
    case 'wire': {
      const w = doc.wires[e.ref];
      const step: WalkElementStep = { type: 'wire', id: w.id, from: w.from, to: w.to, size: w.size, lengthM: w.lengthM, ohms: e.ohms };
      if (w.color !== undefined) step.color = w.color;
      if (w.circuit !== undefined) step.circuit = w.circuit;
      return step;
    }
    case 'mate': {
      const m = prep.mates[e.ref];
      const [na, nb] = m.pairs[e.sub as number];
      const here = fromVertex === na ? na : nb;
      const there = here === na ? nb : na;
      return {
        type: 'mate',
        connector: doc.components[prep.pinComp[here]].id,
        mate: doc.components[prep.pinComp[there]].id,
        cavity: prep.pinRefs[here],
        mateCavity: prep.pinRefs[there],
        ohms: e.ohms,
      };
    }
    case 'fuse': {
      const c = doc.components[e.ref];
      const amps = c.kind === 'fuse' ? c.amps : 0;
      return { type: 'fuse', id: c.id, amps, colour: bladeFuseColour(amps), ohms: e.ohms };
    }
    case 'switch':
      return { type: 'switch', id: doc.components[e.ref].id, positions: e.positions ?? [], ohms: e.ohms };
    case 'relay-contact':
      return { type: 'relay-contact', id: doc.components[e.ref].id, contact: e.sub as '87' | '87a', ohms: e.ohms };
    case 'resistor':
      return { type: 'resistor', id: doc.components[e.ref].id, ohms: e.ohms };
    case 'load':
      return { type: 'load', id: doc.components[e.ref].id, ohms: e.ohms };
    case 'bond':
    default:
      return { type: 'chassis', from: prep.pinRefs[fromVertex], to: '', ohms: e.ohms };
  }
}

/** Runs f, answering `fallback` instead of throwing (the plain functions never throw, even on a document that skipped validation). */
function safe<T>(fallback: T, f: () => T): T {
  try {
    return f();
  } catch {
    return fallback;
  }
}

/** Every pin's volts in a state, document order; null for an unknown state. */
export function readings(doc: HarnessDocument, stateId: string): Readings | null {
  return safe(null, () => prepareHarness(doc).readings(stateId));
}

/** Resistance between two pins with the power off (no state: first switch positions, nothing unplugged); null = open. */
export function ohms(doc: HarnessDocument, a: string, b: string, stateId?: string): number | null {
  return safe(null, () => prepareHarness(doc).ohms(a, b, stateId));
}

/** Conductive paths between two pins, shortest first, at most 20. */
export function walk(doc: HarnessDocument, from: string, to: string, stateId?: string): WalkResult {
  return safe({ paths: [] }, () => prepareHarness(doc).walk(from, to, stateId));
}

/** Every candidate single fault. */
export function listFaults(doc: HarnessDocument): Fault[] {
  return safe([], () => prepareHarness(doc).listFaults());
}

/** Readings with one fault applied (fuses it blows on insert taken as blown), with the fuse currents. */
export function faultReadings(doc: HarnessDocument, fault: Fault, stateId: string): FaultReadings | null {
  return safe(null, () => prepareHarness(doc).faultReadings(fault, stateId));
}

/** Candidate single faults ranked by how well they explain the observations, and the next connector to unplug. */
export function suspects(doc: HarnessDocument, observations: Observation[]): SuspectsResult {
  return safe({ suspects: [], nextUnplug: null }, () => prepareHarness(doc).suspects(observations));
}

export { prepareCircuit } from './circuit';

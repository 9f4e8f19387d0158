/**
 * Single faults, what-if readings, and the fault finder (suspects).
 *
 * Fault kinds (design/harness-format.md, "faults"):
 * - open: a wire carries nothing;
 * - short: a wire grounded at `at` (default 0.5) of its length through
 *   0.05 Ω, or a clamp: each of its wires grounded at the clamp's `at`;
 * - blown: a fuse is open;
 * - high: a wire, or a mated cavity (`X12.3`, either half), measures `ohms`
 *   (default 10) instead of its normal resistance;
 * - missing: a resistor (a bus terminator) is not there.
 */
import type { HarnessState } from '../harness/schema';
import {
  FIXED_ZERO_OHMS, MAX_ROUNDS, SHORT_OHMS, baseConfig, buildNetwork, fuseCurrents, nextStates, orderFor, settle, twoPointOhms,
  type BuiltNetwork, type Config, type PreparedCircuit, type ResolvedFault,
} from './circuit';
import { analyse, injectionsOf, lowRankVolts, numeric, type Change, type Factor, type Pattern } from './solver';

export type FaultKind = 'open' | 'short' | 'blown' | 'high' | 'missing';

export interface Fault {
  kind: FaultKind;
  ref: string;
  at?: number;
  ohms?: number;
}

/** Default resistance of a `high` fault when none is given, Ω. */
export const DEFAULT_HIGH_OHMS = 10;
/** A short drawing more than this many times a fuse's rating blows it on insert. */
export const BLOW_FACTOR = 5;

export interface FaultReadings {
  state: string;
  status: 'settled' | 'unsettled';
  fault: Fault;
  /** Fuses the fault blows on insert (current above 5 × rating); the pins are read with them blown. */
  blowsOnInsert: string[];
  /** Current through each fuse with the fault in and every fuse intact, amps (null where it cannot be told). */
  fuseCurrents: { id: string; amps: number; current: number | null }[];
  pins: { ref: string; volts: number | null }[];
}

export type Observation =
  | { pin: string; state: string; volts: number | null }
  | { a: string; b: string; state: string; ohms: number | null }
  | { fuse: string; blowsOnInsert: boolean };

/** What the meter would show for one observation under a fault. */
export type PredictedReading =
  | { pin: string; state: string; volts: number | null; match: number }
  | { a: string; b: string; state: string; ohms: number | null; match: number }
  | { fuse: string; blowsOnInsert: boolean; match: number };

export interface Suspect {
  fault: Fault;
  score: number;
  predicted: PredictedReading[];
}

export interface SuspectsResult {
  suspects: Suspect[];
  nextUnplug: { connector: string; mate: string; splits: [number, number] } | null;
}

export function resolveFault(prep: PreparedCircuit, fault: Fault): ResolvedFault | null {
  if (!fault || typeof fault !== 'object' || typeof fault.ref !== 'string') return null;
  const doc = prep.doc;
  const wire = prep.wireIndex.get(fault.ref);
  const ci = prep.compIndex.get(fault.ref);
  const comp = ci === undefined ? undefined : doc.components[ci];
  switch (fault.kind) {
    case 'open':
      return wire === undefined ? null : { kind: 'open', wire };
    case 'short': {
      const at = typeof fault.at === 'number' && fault.at >= 0 && fault.at <= 1 ? fault.at : undefined;
      if (wire !== undefined) return { kind: 'short', wires: [{ wire, at: at ?? 0.5 }] };
      const clamp = doc.clamps.find((c) => c.id === fault.ref);
      if (!clamp) return null;
      const wires: { wire: number; at: number }[] = [];
      for (const w of clamp.wires) {
        const wi = prep.wireIndex.get(w);
        if (wi !== undefined) wires.push({ wire: wi, at: at ?? clamp.at ?? 0.5 });
      }
      return wires.length ? { kind: 'short', wires } : null;
    }
    case 'blown':
      return comp?.kind === 'fuse' ? { kind: 'blown', fuse: prep.fuseOf.get(ci!)! } : null;
    case 'high': {
      const ohms = typeof fault.ohms === 'number' && fault.ohms >= 0 && Number.isFinite(fault.ohms) ? fault.ohms : DEFAULT_HIGH_OHMS;
      if (wire !== undefined) return { kind: 'high-wire', wire, ohms };
      const mc = prep.mateCavity.get(fault.ref);
      if (mc) return { kind: 'high-mate', mate: mc[0], pair: mc[1], ohms };
      return null;
    }
    case 'missing': {
      if (comp?.kind !== 'resistor') return null;
      const k = prep.resistors.findIndex((r) => r.ci === ci);
      return k >= 0 ? { kind: 'missing', resistor: k } : null;
    }
    default:
      return null;
  }
}

/** Every candidate single fault of a document. */
export function listFaultsFor(prep: PreparedCircuit): Fault[] {
  const doc = prep.doc;
  const out: Fault[] = [];
  for (const c of doc.clamps) if (c.wires.some((w) => prep.wireIndex.has(w))) out.push({ kind: 'short', ref: c.id, at: c.at ?? 0.5 });
  for (const w of doc.wires) out.push({ kind: 'short', ref: w.id, at: 0.5 });
  for (const f of prep.fuses) out.push({ kind: 'blown', ref: doc.components[f.ci].id });
  for (const w of doc.wires) out.push({ kind: 'open', ref: w.id });
  for (const w of doc.wires) out.push({ kind: 'high', ref: w.id, ohms: DEFAULT_HIGH_OHMS });
  for (const m of prep.mates) for (const [a] of m.pairs) out.push({ kind: 'high', ref: prep.pinRefs[a], ohms: DEFAULT_HIGH_OHMS });
  for (const r of prep.resistors) out.push({ kind: 'missing', ref: doc.components[r.ci].id });
  return out;
}

function stateById(prep: PreparedCircuit, id: string): HarnessState | undefined {
  return prep.doc.states.find((s) => s.id === id);
}

/** Solve a state with a fault; fuses it overloads are then taken as blown and the state solved again. */
function solveFaulted(prep: PreparedCircuit, cfg: Config): { volts: Float64Array; status: 'settled' | 'unsettled'; currents: Float64Array; blown: number[] } {
  const first = settle(prep, cfg);
  const currents = fuseCurrents(prep, first.built, first.volts);
  const blown: number[] = [];
  prep.fuses.forEach((f, k) => {
    if (Math.abs(currents[k]) > BLOW_FACTOR * f.amps) blown.push(k);
  });
  if (!blown.length) return { volts: first.volts, status: first.status, currents, blown };
  const second = settle(prep, { ...cfg, relayOn: first.relayOn, modOn: first.modOn, openFuses: new Set(blown) });
  return { volts: second.volts, status: first.status === 'unsettled' ? 'unsettled' : second.status, currents, blown };
}

/**
 * The fault finder's fast path: per state and relay/module configuration,
 * one fixed-form network (every faultable element in the pattern) analysed
 * once; each fault only patches conductance values.
 */
interface Template {
  built: BuiltNetwork;
  pattern: Pattern;
  inj: Float64Array;
  factor: Factor | null;
  /** Volts without the fault. */
  volts: Float64Array | null;
}

class FixedSolver {
  private templates = new Map<string, Template>();
  constructor(private prep: PreparedCircuit) {}

  private template(stateKey: string, cfg: Config): Template {
    const k = `${stateKey}|${cfg.relayOn.join('')}|${cfg.modOn.join('')}`;
    let t = this.templates.get(k);
    if (!t) {
      const built = buildNetwork(this.prep, { ...cfg, fault: null, openFuses: undefined, fixed: true });
      t = { built, pattern: analyse(built.net, 0, this.prep.cache, orderFor(this.prep)), inj: injectionsOf(built.net), factor: null, volts: null };
      if (this.templates.size > 256) this.templates.clear();
      this.templates.set(k, t);
    }
    return t;
  }

  private patch(t: Template, rf: ResolvedFault | null, openFuses: number[] | null): Float64Array {
    const prep = this.prep;
    const eg = t.built.net.eg.slice(0, t.built.net.edges);
    const g = (ohms: number) => 1 / Math.max(ohms, FIXED_ZERO_OHMS);
    if (rf) {
      switch (rf.kind) {
        case 'open': eg[3 * rf.wire] = 0; eg[3 * rf.wire + 1] = 0; break;
        case 'short':
          for (const { wire, at } of rf.wires) {
            const r = prep.wireR[wire];
            eg[3 * wire] = g(r * at);
            eg[3 * wire + 1] = g(r * (1 - at));
            eg[3 * wire + 2] = 1 / SHORT_OHMS;
          }
          break;
        case 'high-wire': eg[3 * rf.wire] = g(rf.ohms * 0.5); eg[3 * rf.wire + 1] = g(rf.ohms * 0.5); break;
        case 'blown': if (t.built.fuseEdge[rf.fuse] >= 0) eg[t.built.fuseEdge[rf.fuse]] = 0; break;
        case 'missing': if (t.built.resistorEdge[rf.resistor] >= 0) eg[t.built.resistorEdge[rf.resistor]] = 0; break;
        case 'high-mate': {
          const e = t.built.mateEdge[rf.mate];
          if (e >= 0 && eg[e + rf.pair] > 0) eg[e + rf.pair] = g(rf.ohms);
          break;
        }
      }
    }
    if (openFuses) for (const k of openFuses) if (t.built.fuseEdge[k] >= 0) eg[t.built.fuseEdge[k]] = 0;
    return eg;
  }

  /** Volts with the fault: by a low-rank change of the template's factorisation where the fault only changes values, else afresh. */
  private quick(t: Template, rf: ResolvedFault | null, eg: Float64Array): Float64Array {
    if (!t.factor) {
      const base = numeric(t.pattern, t.built.net.eg.slice(0, t.built.net.edges), t.inj);
      t.factor = base.factor ?? null;
      t.volts = base.volts;
    }
    if (!rf) return t.volts!;
    if (t.factor && (rf.kind === 'short' || rf.kind === 'high-wire' || rf.kind === 'high-mate')) {
      const base = t.built.net.eg;
      const changes: Change[] = [];
      const add = (e: number) => {
        if (e >= 0 && eg[e] !== base[e]) changes.push({ a: t.built.net.ea[e], b: t.built.net.eb[e], dg: eg[e] - base[e] });
      };
      if (rf.kind === 'short') for (const w of rf.wires) { add(3 * w.wire); add(3 * w.wire + 1); add(3 * w.wire + 2); }
      else if (rf.kind === 'high-wire') { add(3 * rf.wire); add(3 * rf.wire + 1); }
      else if (t.built.mateEdge[rf.mate] >= 0) add(t.built.mateEdge[rf.mate] + rf.pair);
      const v = lowRankVolts(t.pattern, t.factor, changes);
      if (v) return v;
    }
    return numeric(t.pattern, eg, t.inj).volts;
  }

  /**
   * Solve a state with a fault from cfg's relays and modules (the fault-free
   * settled ones): the currents at that first instant decide which fuses
   * blow on insert; with `thenSettle` the fuses blown are opened and the state
   * settled again (what a meter shows afterwards).
   */
  solve(stateKey: string, cfg: Config, rf: ResolvedFault | null, thenSettle: boolean): { volts: Float64Array | null; blown: number[] } {
    const prep = this.prep;
    let t = this.template(stateKey, cfg);
    let eg = this.patch(t, rf, null);
    let sol = this.quick(t, rf, eg);
    const blown: number[] = [];
    prep.fuses.forEach((f, k) => {
      const e = t.built.fuseEdge[k];
      if (e >= 0 && Math.abs(eg[e] * (sol[f.n1] - sol[f.n2])) > BLOW_FACTOR * f.amps) blown.push(k);
    });
    if (!thenSettle) return { volts: null, blown };
    let relayOn = Uint8Array.from(cfg.relayOn);
    let modOn = Uint8Array.from(cfg.modOn);
    let changed = blown.length > 0;
    for (let round = 1; round < MAX_ROUNDS; round++) {
      if (!changed) {
        const r2 = Uint8Array.from(relayOn);
        const m2 = Uint8Array.from(modOn);
        if (!nextStates(prep, sol, r2, m2)) break;
        relayOn = r2;
        modOn = m2;
      }
      changed = false;
      t = this.template(stateKey, { ...cfg, relayOn, modOn });
      eg = this.patch(t, rf, blown);
      sol = numeric(t.pattern, eg, t.inj).volts;
    }
    return { volts: sol, blown };
  }
}

export function faultReadingsFor(prep: PreparedCircuit, fault: Fault, stateId: string): FaultReadings | null {
  const state = stateById(prep, stateId);
  const rf = resolveFault(prep, fault);
  if (!state || !rf) return null;
  const cfg = baseConfig(prep, state, false);
  cfg.fault = rf;
  let res = solveFaulted(prep, cfg);
  // A fuse that is a zero-ohm join has no current in the exact circuit: read it from the fixed form.
  if (prep.fuses.some((f) => !(f.ohms > 0))) {
    const fx = solveFaulted(prep, { ...cfg, fixed: true });
    if (fx.blown.some((k) => !res.blown.includes(k))) res = fx;
  }
  return {
    state: stateId,
    status: res.status,
    fault,
    blowsOnInsert: res.blown.map((k) => prep.doc.components[prep.fuses[k].ci].id),
    fuseCurrents: prep.fuses.map((f, k) => ({ id: prep.doc.components[f.ci].id, amps: f.amps, current: Number.isFinite(res.currents[k]) ? res.currents[k] : null })),
    pins: prep.pinRefs.slice(1).map((ref, i) => ({ ref, volts: Number.isFinite(res.volts[i + 1]) ? res.volts[i + 1] : null })),
  };
}

/*
 * Scoring. Each observation gets a match in [0, 1]:
 *   volts: 1 within max(0.2 V, 3 % of the reading), else tol / error;
 *          an expected "no reading" (floating) matches only "no reading";
 *   ohms:  1 within max(10 % of the reading, 0.1 Ω), else tol / error;
 *          open matches only open;
 *   fuse:  1 when blows-on-insert agrees, else 0.
 * A suspect's score is the mean match over the observations (1 = explains
 * everything). Ties go to clamp shorts, then wire shorts, blown fuses,
 * opens, high resistance and missing terminators (hard shorts are most often
 * where the harness is clamped or rubs: common practice), then document order.
 */
export function matchVolts(pred: number | null, obs: number | null): number {
  if (pred === null || obs === null) return pred === obs ? 1 : 0;
  const tol = Math.max(0.2, 0.03 * Math.abs(obs));
  const err = Math.abs(pred - obs);
  return err <= tol ? 1 : tol / err;
}

export function matchOhms(pred: number | null, obs: number | null): number {
  if (pred === null || obs === null) return pred === obs ? 1 : 0;
  const tol = Math.max(0.1 * Math.abs(obs), 0.1);
  const err = Math.abs(pred - obs);
  return err <= tol ? 1 : tol / err;
}

const kindRank = (f: Fault, clamps: Set<string>): number => {
  switch (f.kind) {
    case 'short': return clamps.has(f.ref) ? 0 : 1;
    case 'blown': return 2;
    case 'open': return 3;
    case 'high': return 4;
    default: return 5;
  }
};

export interface StateSolutionLike {
  volts: Float64Array;
  relayOn: Uint8Array;
  modOn: Uint8Array;
}

export const MAX_SUSPECTS = 50;

export function suspectsFor(prep: PreparedCircuit, observations: Observation[], solveState: (id: string) => StateSolutionLike | null): SuspectsResult {
  const doc = prep.doc;
  type VObs = { i: number; node: number; state: string; volts: number | null };
  type RObs = { i: number; a: number; b: number; state: string | null; ohms: number | null };
  type FObs = { i: number; fuse: number; blows: boolean };
  const vObs: VObs[] = [];
  const rObs: RObs[] = [];
  const fObs: FObs[] = [];
  const obsList = Array.isArray(observations) ? observations : [];
  obsList.forEach((o, i) => {
    if (!o || typeof o !== 'object') return;
    if ('pin' in o && typeof o.pin === 'string') {
      const node = prep.nodeOf.get(o.pin);
      if (node !== undefined && stateById(prep, o.state)) vObs.push({ i, node, state: o.state, volts: typeof o.volts === 'number' ? o.volts : null });
    } else if ('a' in o && typeof o.a === 'string' && typeof o.b === 'string') {
      const a = prep.nodeOf.get(o.a);
      const b = prep.nodeOf.get(o.b);
      const st = typeof o.state === 'string' && stateById(prep, o.state) ? o.state : null;
      if (a !== undefined && b !== undefined) rObs.push({ i, a, b, state: st, ohms: typeof o.ohms === 'number' ? o.ohms : null });
    } else if ('fuse' in o && typeof o.fuse === 'string') {
      const ci = prep.compIndex.get(o.fuse);
      const k = ci === undefined ? undefined : prep.fuseOf.get(ci);
      if (k !== undefined) fObs.push({ i, fuse: k, blows: o.blowsOnInsert === true });
    }
  });
  const used = vObs.length + rObs.length + fObs.length;
  if (!used) return { suspects: [], nextUnplug: null };

  const vStates = [...new Set(vObs.map((o) => o.state))];
  const allStates = doc.states.map((s) => s.id);
  // Base configurations per state in the fixed form, starting from the fault-free settled relays and modules.
  const baseCfg = new Map<string, Config>();
  for (const id of allStates) {
    const sol = solveState(id);
    const cfg = baseConfig(prep, stateById(prep, id)!, false);
    cfg.fixed = true;
    if (sol) {
      cfg.relayOn = Uint8Array.from(sol.relayOn);
      cfg.modOn = Uint8Array.from(sol.modOn);
    }
    baseCfg.set(id, cfg);
  }
  const offCfg = (state: string | null): Config => {
    const cfg = baseConfig(prep, state ? stateById(prep, state)! : null, true);
    cfg.fixed = true;
    return cfg;
  };

  const clampIds = new Set(doc.clamps.map((c) => c.id));
  const faults = listFaultsFor(prep);
  const scored: { fault: Fault; score: number; predicted: PredictedReading[]; rank: number; order: number }[] = [];
  // Fault-free fuse behaviour: what non-short faults predict for blows-on-insert.
  const fixed = new FixedSolver(prep);
  const baseBlows = new Uint8Array(prep.fuses.length);
  if (fObs.length) {
    for (const id of allStates) {
      const r = fixed.solve(id, baseCfg.get(id)!, null, false);
      for (const k of r.blown) baseBlows[k] = 1;
    }
  }

  faults.forEach((fault, order) => {
    const rf = resolveFault(prep, fault);
    if (!rf) return;
    const predicted: PredictedReading[] = new Array(obsList.length);
    const isShort = rf.kind === 'short';
    const blows = new Uint8Array(prep.fuses.length);
    const voltsByState = new Map<string, Float64Array>();
    const statesToSolve = new Set<string>(vStates);
    if (fObs.length && isShort) for (const id of allStates) statesToSolve.add(id);
    for (const id of statesToSolve) {
      const r = fixed.solve(id, baseCfg.get(id)!, rf, vStates.includes(id));
      for (const k of r.blown) blows[k] = 1;
      if (r.volts) voltsByState.set(id, r.volts);
    }
    if (!isShort) blows.set(baseBlows);
    let total = 0;
    for (const o of vObs) {
      const v = voltsByState.get(o.state)![o.node];
      const pv = Number.isFinite(v) ? v : null;
      const m = matchVolts(pv, o.volts);
      predicted[o.i] = { pin: prep.pinRefs[o.node], state: o.state, volts: pv, match: m };
      total += m;
    }
    for (const o of rObs) {
      const cfg = offCfg(o.state);
      cfg.fault = rf;
      const pr = twoPointOhms(prep, cfg, o.a, o.b);
      const m = matchOhms(pr, o.ohms);
      predicted[o.i] = { a: prep.pinRefs[o.a], b: prep.pinRefs[o.b], state: o.state ?? '', ohms: pr, match: m };
      total += m;
    }
    for (const o of fObs) {
      const pb = blows[o.fuse] === 1;
      const m = pb === o.blows ? 1 : 0;
      predicted[o.i] = { fuse: doc.components[prep.fuses[o.fuse].ci].id, blowsOnInsert: pb, match: m };
      total += m;
    }
    scored.push({ fault, score: total / used, predicted: predicted.filter((p) => p !== undefined), rank: kindRank(fault, clampIds), order });
  });
  scored.sort((x, y) => (Math.abs(y.score - x.score) > 1e-9 ? y.score - x.score : x.rank - y.rank || x.order - y.order));
  const suspects = scored.slice(0, MAX_SUSPECTS).map(({ fault, score, predicted }) => ({ fault, score, predicted }));
  return { suspects, nextUnplug: nextUnplugFor(prep, scored) };
}

/**
 * The mated pair whose unplugging best halves the leading suspects (those
 * with the best score). With a pair unplugged, a suspect on the feed side
 * (joined to a battery's + through wires, mates, fuses, switches and relay
 * contacts) would still show its symptom; one beyond it would not.
 * splits = [still showing, cleared]; the pair with the split closest to half wins.
 */
function nextUnplugFor(prep: PreparedCircuit, scored: { fault: Fault; score: number }[]): SuspectsResult['nextUnplug'] {
  if (!scored.length || !prep.mates.length) return null;
  const best = scored[0].score;
  const leading = scored.filter((s) => s.score >= best - 1e-9).slice(0, 200).map((s) => s.fault);
  if (leading.length < 2) return null;
  // Nodes each suspect sits on.
  const at: number[][] = leading.map((f) => faultNodes(prep, f));
  // Low-ohm adjacency (not loads, resistors, coils, modules, bonds).
  const n = prep.nodeCount;
  const adjA: number[] = [];
  const adjB: number[] = [];
  const adjMate: number[] = [];
  for (let i = 0; i < prep.wireA.length; i++) {
    adjA.push(prep.wireA[i]); adjB.push(prep.wireB[i]); adjMate.push(-1);
  }
  for (const f of prep.fuses) { adjA.push(f.n1); adjB.push(f.n2); adjMate.push(-1); }
  for (const s of prep.switches) for (const pairs of s.positions.values()) for (const [a, b] of pairs) { adjA.push(a); adjB.push(b); adjMate.push(-1); }
  for (const r of prep.relays) {
    adjA.push(r.n30); adjB.push(r.n87); adjMate.push(-1);
    if (r.n87a >= 0) { adjA.push(r.n30); adjB.push(r.n87a); adjMate.push(-1); }
  }
  prep.mates.forEach((m, mi) => m.pairs.forEach(([a, b]) => { adjA.push(a); adjB.push(b); adjMate.push(mi); }));
  const ptr = new Int32Array(n + 1);
  for (let e = 0; e < adjA.length; e++) { ptr[adjA[e] + 1]++; ptr[adjB[e] + 1]++; }
  for (let i = 0; i < n; i++) ptr[i + 1] += ptr[i];
  const inc = new Int32Array(ptr[n]);
  const fp = ptr.slice(0, n);
  for (let e = 0; e < adjA.length; e++) { inc[fp[adjA[e]]++] = e; inc[fp[adjB[e]]++] = e; }
  const seeds = prep.batteries.map((b) => b.pos);
  // Only pairs that some suspect's feed path goes through are worth trying.
  const seen = new Uint8Array(n);
  let bestPick: SuspectsResult['nextUnplug'] = null;
  let bestGap = Infinity;
  prep.mates.forEach((m, mi) => {
    seen.fill(0);
    const stack = [...seeds];
    for (const s of seeds) seen[s] = 1;
    while (stack.length) {
      const x = stack.pop()!;
      for (let q = ptr[x]; q < ptr[x + 1]; q++) {
        const e = inc[q];
        if (adjMate[e] === mi) continue;
        const y = adjA[e] === x ? adjB[e] : adjA[e];
        if (!seen[y]) { seen[y] = 1; stack.push(y); }
      }
    }
    let still = 0;
    leading.forEach((f, i) => {
      const mc = f.kind === 'high' ? prep.mateCavity.get(f.ref) : undefined;
      if (mc && mc[0] === mi) return; // the unplugged contact itself: cleared
      if (at[i].some((x) => seen[x])) still++;
    });
    const cleared = leading.length - still;
    if (still === 0 || cleared === 0) return;
    const gap = Math.abs(still - cleared);
    if (gap < bestGap) {
      bestGap = gap;
      bestPick = { connector: prep.doc.components[m.a].id, mate: prep.doc.components[m.b].id, splits: [still, cleared] };
    }
  });
  return bestPick;
}

function faultNodes(prep: PreparedCircuit, f: Fault): number[] {
  const rf = resolveFault(prep, f);
  if (!rf) return [];
  switch (rf.kind) {
    case 'open': case 'high-wire': return [prep.wireA[rf.wire], prep.wireB[rf.wire]];
    case 'short': return rf.wires.flatMap((w) => [prep.wireA[w.wire], prep.wireB[w.wire]]);
    case 'blown': return [prep.fuses[rf.fuse].n1];
    case 'high-mate': return [prep.mates[rf.mate].pairs[rf.pair][0]];
    case 'missing': return [prep.resistors[rf.resistor].n1, prep.resistors[rf.resistor].n2];
  }
}

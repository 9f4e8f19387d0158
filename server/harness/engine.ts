/**
 * The engine behind the API (shared/engine). Published revisions never change, so each one's
 * prepared harness (circuit tables, solver pattern, solved states) is kept in a bounded
 * in-memory LRU, one per app instance (safe across instances: published content is immutable),
 * with each state's readings kept as ready JSON. Drafts are cached by revision id + version,
 * so a save makes a new entry and the old one ages out.
 *
 * Every name a request gives (state, pin, fuse, fault reference) is checked first: an unknown
 * one answers 400 naming it, never an empty or null answer that looks like a reading.
 */
import { prepareHarness, type Fault, type Observation, type PreparedHarness, type Suspect } from '../../shared/engine';
import type { HarnessDocument } from '../../shared/harness/schema';
import type { Db } from '../db/client';
import { HttpError } from '../errors';
import { Lru } from './lru';
import { readDocument } from './revisions';

export interface RevisionKey {
  id: string;
  status: 'draft' | 'published';
  version: number;
}

export interface FaultInput {
  kind: Fault['kind'];
  ref: string;
  at?: number;
  ohms?: number;
}

export interface EngineView {
  /** The engine's prepared form, for callers that compute more from it (reading marks). */
  prepared: PreparedHarness;
  /** `{ state, status, pins: [{ ref, volts }] }` as JSON bytes (kept per state), with an ETag for them. */
  readingsJson(state: string): { body: Buffer; etag: string };
  ohms(a: string, b: string, state: string): { a: string; b: string; state: string; ohms: number | null };
  walk(from: string, to: string, state?: string): unknown;
  suspects(observations: Observation[]): unknown;
  fault(fault: FaultInput, state?: string): unknown;
}

const published = new Lru<string, Promise<EngineView>>(64);
const drafts = new Lru<string, Promise<EngineView>>(16);

/** The engine over a revision the caller may see (the caller checked with visibleRevision). */
export function engineFor(db: Db, rev: RevisionKey): Promise<EngineView> {
  const cache = rev.status === 'published' ? published : drafts;
  const key = rev.status === 'published' ? rev.id : `${rev.id}@${rev.version}`;
  let view = cache.get(key);
  if (!view) {
    view = readDocument(db, rev.id).then(({ document }) => makeView(prepareHarness(document as unknown as HarnessDocument), `${rev.id}-${rev.version}`));
    // A failed load is not kept.
    view.catch(() => cache.delete(key));
    cache.set(key, view);
  }
  return view;
}

const list = (names: string[]) => names.map((n) => `"${n}"`).join(', ');

function wireWords(doc: HarnessDocument, id: string): string {
  const w = doc.wires.find((x) => x.id === id);
  if (!w) return `wire ${id}`;
  const bits = [w.color, w.circuit ? `circuit ${w.circuit}` : null, `${w.from} → ${w.to}`].filter(Boolean);
  return `wire ${id} (${bits.join(', ')})`;
}

/** The fault in plain words, for a tech. */
export function describeFault(doc: HarnessDocument, fault: Fault): string {
  const comp = (id: string) => doc.components.find((c) => c.id === id);
  const named = (id: string) => {
    const c = comp(id);
    return c?.label ? `${id} (${c.label})` : id;
  };
  switch (fault.kind) {
    case 'open':
      return `Open circuit in ${wireWords(doc, fault.ref)}${fault.at !== undefined ? ` at ${Math.round(fault.at * 100)} % of its length` : ''}`;
    case 'short': {
      const clamp = doc.clamps.find((c) => c.id === fault.ref);
      if (clamp) return `Short to ground where clamp ${clamp.id}${clamp.label ? ` (${clamp.label})` : ''} holds ${clamp.wires.join(', ')}`;
      return `Short to ground in ${wireWords(doc, fault.ref)}${fault.at !== undefined ? ` at ${Math.round(fault.at * 100)} % of its length` : ''}`;
    }
    case 'blown':
      return `Fuse ${named(fault.ref)} blown`;
    case 'high':
      return `High resistance${fault.ohms !== undefined ? ` (${fault.ohms} Ω)` : ''} in ${doc.wires.some((w) => w.id === fault.ref) ? wireWords(doc, fault.ref) : `the mated cavity ${fault.ref}`}`;
    case 'missing':
      return `Resistor ${named(fault.ref)} missing (a bus terminator not fitted or open)`;
    default:
      return `${String(fault.kind)} at ${fault.ref}`;
  }
}

export function makeView(prep: PreparedHarness, tag = 'r'): EngineView {
  const doc = prep.doc;
  const states = doc.states.map((s) => s.id);
  const readingsCache = new Map<string, { body: Buffer; etag: string }>();

  const needState = (state: string, path = '$.state') => {
    if (!prep.hasState(state)) {
      throw new HttpError(400, 'unknown_state', `This harness has no state "${state}"; its states are ${list(states)}.`, [{ path, message: `Unknown state "${state}"` }]);
    }
  };
  const needPins = (pairs: Array<[path: string, ref: string]>) => {
    const bad = pairs.filter(([, ref]) => !prep.hasPin(ref));
    if (bad.length) {
      throw new HttpError(
        400,
        'unknown_pin',
        `This harness has no pin ${list(bad.map(([, r]) => r))} (write a pin as COMPONENT.PIN, e.g. X12.3).`,
        bad.map(([path, ref]) => ({ path, message: `Unknown pin "${ref}"` })),
      );
    }
  };

  return {
    prepared: prep,

    readingsJson(state) {
      needState(state);
      let json = readingsCache.get(state);
      if (json === undefined) {
        const r = prep.readings(state)!;
        json = { body: Buffer.from(JSON.stringify({ state: r.state, status: r.status, pins: r.pins })), etag: `"${tag}-${Buffer.from(state).toString('base64url')}"` };
        readingsCache.set(state, json);
      }
      return json;
    },

    ohms(a, b, state) {
      needPins([
        ['$.a', a],
        ['$.b', b],
      ]);
      needState(state);
      return { a, b, state, ohms: prep.ohms(a, b, state) };
    },

    walk(from, to, state) {
      needPins([
        ['$.from', from],
        ['$.to', to],
      ]);
      if (state !== undefined) needState(state);
      return { from, to, state: state ?? null, ...prep.walk(from, to, state) };
    },

    suspects(observations) {
      const problems: Array<{ path: string; message: string }> = [];
      const fuses = new Set(doc.components.filter((c) => c.kind === 'fuse').map((c) => c.id));
      observations.forEach((o, i) => {
        const at = `$.observations[${i}]`;
        if ('fuse' in o) {
          if (!fuses.has(o.fuse)) problems.push({ path: `${at}.fuse`, message: `No fuse "${o.fuse}" in this harness` });
          return;
        }
        if (!prep.hasState(o.state)) problems.push({ path: `${at}.state`, message: `Unknown state "${o.state}"` });
        if ('pin' in o && !prep.hasPin(o.pin)) problems.push({ path: `${at}.pin`, message: `Unknown pin "${o.pin}"` });
        if ('a' in o) {
          if (!prep.hasPin(o.a)) problems.push({ path: `${at}.a`, message: `Unknown pin "${o.a}"` });
          if (!prep.hasPin(o.b)) problems.push({ path: `${at}.b`, message: `Unknown pin "${o.b}"` });
        }
      });
      if (problems.length) {
        throw new HttpError(400, 'unknown_reference', `${problems.length} observation field${problems.length === 1 ? ' names' : 's name'} something this harness does not have: ${problems.map((p) => `${p.path} ${p.message}`).join('; ')}.`, problems);
      }
      const result = prep.suspects(observations);
      return {
        suspects: result.suspects.map((s: Suspect) => ({ ...s, description: describeFault(doc, s.fault) })),
        nextUnplug: result.nextUnplug,
      };
    },

    fault(fault, state) {
      const stateId = state ?? states[0];
      if (stateId === undefined) throw new HttpError(400, 'unknown_state', 'This harness has no states to read.');
      needState(stateId);
      const f: Fault = { kind: fault.kind, ref: fault.ref, ...(fault.at !== undefined ? { at: fault.at } : {}), ...(fault.ohms !== undefined ? { ohms: fault.ohms } : {}) };
      const r = prep.faultReadings(f, stateId);
      if (!r) {
        const what = { open: 'a wire', short: 'a wire or a clamp', blown: 'a fuse', high: 'a wire or a mated cavity (COMPONENT.PIN)', missing: 'a resistor' }[fault.kind];
        throw new HttpError(400, 'unknown_reference', `A fault of kind "${fault.kind}" needs ${what}; "${fault.ref}" is not one in this harness.`, [
          { path: '$.fault.ref', message: `Not ${what} of this harness` },
        ]);
      }
      const healthy = prep.readings(stateId)!;
      const before = new Map(healthy.pins.map((p) => [p.ref, p.volts]));
      const changed = r.pins
        .filter((p) => {
          const b = before.get(p.ref) ?? null;
          return b === null || p.volts === null ? b !== p.volts : Math.abs(b - p.volts) > 1e-6;
        })
        .map((p) => ({ ref: p.ref, before: before.get(p.ref) ?? null, after: p.volts }));
      return { ...r, description: describeFault(doc, f), changed };
    },
  };
}

/**
 * Edits of a harness document that keep it consistent: renaming a component
 * renames its pin refs on wires, mates, states; removing one removes its
 * wires and their clamp entries. Pure: each answers a new document.
 */
import { componentPinIds, type Clamp, type Component, type ComponentKind, type HarnessDocument, type HarnessState, type Wire } from '@shared/harness';
import { splitRef, type Point, type Positions } from '@shared/drawing/geometry';

export function emptyDocument(name: string): HarnessDocument {
  return { format: 'wirewalk-harness', version: 1, name, nominalVolts: 12, temperatureC: 20, components: [], wires: [], clamps: [], states: [] };
}

const prefixes: Record<ComponentKind, string> = {
  battery: 'BATT', ground: 'G', fuse: 'F', resistor: 'R', load: 'L', splice: 'S', connector: 'X', switch: 'SW', relay: 'K', module: 'ECU',
};

/** The first free id of the form PREFIX + number among `taken`. */
export function freeId(prefix: string, taken: Set<string>): string {
  for (let i = 1; ; i++) {
    const id = `${prefix}${i}`;
    if (!taken.has(id)) return id;
  }
}

/** A new component of a kind with workable values (a lead edits them in the side panel). */
export function newComponent(kind: ComponentKind, taken: Set<string>): Component {
  const id = kind === 'battery' && !taken.has('BATT') ? 'BATT' : freeId(prefixes[kind], taken);
  switch (kind) {
    case 'battery': return { id, kind, label: 'Battery', volts: 12.6, internalOhms: 0.01 };
    case 'ground': return { id, kind, label: 'Chassis ground' };
    case 'fuse': return { id, kind, amps: 10 };
    case 'resistor': return { id, kind, ohms: 120 };
    case 'load': return { id, kind, label: 'Load', ohms: 10 };
    case 'splice': return { id, kind };
    case 'connector': return { id, kind, cavities: ['1', '2', '3', '4'] };
    case 'switch': return { id, kind, label: 'Switch', pins: ['B', 'OUT'], positions: { off: [], on: [['B', 'OUT']] } };
    case 'relay': return { id, kind, coilOhms: 85 };
    case 'module': return { id, kind, label: 'Controller', pins: [{ id: '1', role: 'supply', ohms: 150 }, { id: '2', role: 'ground' }] };
  }
}

export function componentIds(doc: HarnessDocument): Set<string> {
  return new Set(doc.components.map((c) => c.id));
}

export function addComponent(doc: HarnessDocument, c: Component): HarnessDocument {
  return { ...doc, components: [...doc.components, c] };
}

function renameRef(ref: string, from: string, to: string): string {
  const parts = splitRef(ref);
  return parts && parts[0] === from ? `${to}.${parts[1]}` : ref;
}

/**
 * Replaces component `id` with `next` (which may carry a new id). Wires on a pin
 * that no longer exists are removed, so the document stays consistent.
 */
export function updateComponent(doc: HarnessDocument, id: string, next: Component): HarnessDocument {
  const renamed = next.id !== id;
  const pins = new Set(componentPinIds(next));
  const onGonePin = (ref: string) => {
    const p = splitRef(ref);
    return !!p && p[0] === id && !pins.has(p[1]);
  };
  const removed = new Set(doc.wires.filter((w) => onGonePin(w.from) || onGonePin(w.to)).map((w) => w.id));
  const components = doc.components.map((c) => {
    if (c.id === id) return next;
    if (renamed && c.kind === 'connector' && c.matesWith === id) return { ...c, matesWith: next.id };
    return c;
  });
  let wires = doc.wires.filter((w) => !removed.has(w.id));
  let states = doc.states;
  if (renamed) {
    wires = wires.map((w) => (splitRef(w.from)?.[0] === id || splitRef(w.to)?.[0] === id ? { ...w, from: renameRef(w.from, id, next.id), to: renameRef(w.to, id, next.id) } : w));
    states = states.map((s) => renameInState(s, id, next.id));
  }
  const clamps = removed.size ? pruneClamps(doc.clamps, removed) : doc.clamps;
  return { ...doc, components, wires, clamps, states };
}

function renameKey<T>(rec: Record<string, T> | undefined, from: string, to: string): Record<string, T> | undefined {
  if (!rec || !(from in rec)) return rec;
  const out: Record<string, T> = {};
  for (const [k, v] of Object.entries(rec)) out[k === from ? to : k] = v;
  return out;
}

function renameInState(s: HarnessState, from: string, to: string): HarnessState {
  const next: HarnessState = { ...s, switches: renameKey(s.switches, from, to) ?? {} };
  if (s.sources) next.sources = renameKey(s.sources, from, to);
  if (s.outputs) next.outputs = s.outputs.map((r) => renameRef(r, from, to));
  if (s.unplugged) next.unplugged = s.unplugged.map((u) => (u === from ? to : u));
  return next;
}

function pruneClamps(clamps: Clamp[], removedWires: Set<string>): Clamp[] {
  return clamps.map((c) => (c.wires.some((w) => removedWires.has(w)) ? { ...c, wires: c.wires.filter((w) => !removedWires.has(w)) } : c));
}

/** Removes components (with their wires) and wires; clamps and states lose what pointed at them. */
export function removeItems(doc: HarnessDocument, componentIds: Iterable<string>, wireIds: Iterable<string> = []): HarnessDocument {
  const comps = new Set(componentIds);
  const wires = new Set(wireIds);
  for (const w of doc.wires) {
    const a = splitRef(w.from)?.[0];
    const b = splitRef(w.to)?.[0];
    if ((a && comps.has(a)) || (b && comps.has(b))) wires.add(w.id);
  }
  if (comps.size === 0 && wires.size === 0) return doc;
  const components = doc.components
    .filter((c) => !comps.has(c.id))
    .map((c) => (c.kind === 'connector' && c.matesWith && comps.has(c.matesWith) ? withoutKey(c, 'matesWith') : c));
  const states = comps.size
    ? doc.states.map((s) => {
        const next: HarnessState = { ...s, switches: Object.fromEntries(Object.entries(s.switches).filter(([k]) => !comps.has(k))) };
        if (s.sources) next.sources = Object.fromEntries(Object.entries(s.sources).filter(([k]) => !comps.has(k)));
        if (s.outputs) next.outputs = s.outputs.filter((r) => !comps.has(splitRef(r)?.[0] ?? ''));
        if (s.unplugged) next.unplugged = s.unplugged.filter((u) => !comps.has(u));
        return next;
      })
    : doc.states;
  return { ...doc, components, wires: doc.wires.filter((w) => !wires.has(w.id)), clamps: pruneClamps(doc.clamps, wires), states };
}

function withoutKey<T extends object, K extends keyof T>(o: T, k: K): T {
  const copy = { ...o };
  delete copy[k];
  return copy;
}

/** The wire ids of the document. */
export function wireIds(doc: HarnessDocument): Set<string> {
  return new Set(doc.wires.map((w) => w.id));
}

/**
 * A new wire between two pins. It copies size and colour from the last wire drawn,
 * so a run of similar wires goes quickly.
 */
export function newWire(doc: HarnessDocument, from: string, to: string): Wire {
  const last = doc.wires[doc.wires.length - 1];
  const w: Wire = { id: freeId('W', wireIds(doc)), from, to, size: last?.size ?? { mm2: 1 }, lengthM: 1 };
  if (last?.color) w.color = last.color;
  return w;
}

export function addWire(doc: HarnessDocument, w: Wire): HarnessDocument {
  return { ...doc, wires: [...doc.wires, w] };
}

export function updateWire(doc: HarnessDocument, id: string, next: Wire): HarnessDocument {
  const wires = doc.wires.map((w) => (w.id === id ? next : w));
  const clamps = next.id !== id ? doc.clamps.map((c) => (c.wires.includes(id) ? { ...c, wires: c.wires.map((x) => (x === id ? next.id : x)) } : c)) : doc.clamps;
  return { ...doc, wires, clamps };
}

export function reconnectWire(doc: HarnessDocument, id: string, from: string, to: string): HarnessDocument {
  return { ...doc, wires: doc.wires.map((w) => (w.id === id ? { ...w, from, to } : w)) };
}

export function upsertClamp(doc: HarnessDocument, id: string | null, next: Clamp): HarnessDocument {
  if (id === null) return { ...doc, clamps: [...doc.clamps, next] };
  return { ...doc, clamps: doc.clamps.map((c) => (c.id === id ? next : c)) };
}

export function removeClamp(doc: HarnessDocument, id: string): HarnessDocument {
  return { ...doc, clamps: doc.clamps.filter((c) => c.id !== id) };
}

export function upsertState(doc: HarnessDocument, id: string | null, next: HarnessState): HarnessDocument {
  if (id === null) return { ...doc, states: [...doc.states, next] };
  return { ...doc, states: doc.states.map((s) => (s.id === id ? next : s)) };
}

export function removeState(doc: HarnessDocument, id: string): HarnessDocument {
  return { ...doc, states: doc.states.filter((s) => s.id !== id) };
}

/** What a copy holds: components with their places, and the wires among them. */
export interface Fragment {
  components: Component[];
  wires: Wire[];
  positions: Positions;
}

export function copyFragment(doc: HarnessDocument, positions: Positions, ids: Iterable<string>): Fragment {
  const set = new Set(ids);
  const components = doc.components.filter((c) => set.has(c.id));
  const wires = doc.wires.filter((w) => set.has(splitRef(w.from)?.[0] ?? '') && set.has(splitRef(w.to)?.[0] ?? ''));
  const pos: Positions = {};
  for (const c of components) if (positions[c.id]) pos[c.id] = positions[c.id];
  return { components, wires, positions: pos };
}

/** Pastes a fragment with fresh ids (X3 → X4 …), offset from where it was copied. Answers the new ids. */
export function pasteFragment(doc: HarnessDocument, positions: Positions, frag: Fragment, offset: Point = { x: 40, y: 40 }) {
  const taken = componentIds(doc);
  const map = new Map<string, string>();
  for (const c of frag.components) {
    const prefix = c.id.replace(/\d+$/, '') || 'C';
    const id = taken.has(c.id) ? freeId(prefix, taken) : c.id;
    taken.add(id);
    map.set(c.id, id);
  }
  const components = frag.components.map((c) => {
    const copy = { ...c, id: map.get(c.id)! } as Component;
    if (copy.kind === 'connector' && copy.matesWith) {
      if (map.has(copy.matesWith)) copy.matesWith = map.get(copy.matesWith);
      else delete copy.matesWith;
    }
    return copy;
  });
  const wireTaken = wireIds(doc);
  const wires = frag.wires.map((w) => {
    const id = wireTaken.has(w.id) ? freeId('W', wireTaken) : w.id;
    wireTaken.add(id);
    const ref = (r: string) => {
      const p = splitRef(r)!;
      return `${map.get(p[0]) ?? p[0]}.${p[1]}`;
    };
    return { ...w, id, from: ref(w.from), to: ref(w.to) };
  });
  const nextPos: Positions = { ...positions };
  for (const c of frag.components) {
    const p = frag.positions[c.id];
    if (p) nextPos[map.get(c.id)!] = { x: p.x + offset.x, y: p.y + offset.y };
  }
  return { doc: { ...doc, components: [...doc.components, ...components], wires: [...doc.wires, ...wires] }, positions: nextPos, ids: [...map.values()] };
}

/** Drops positions of components that no longer exist. */
export function prunePositions(doc: HarnessDocument, positions: Positions): Positions {
  const ids = componentIds(doc);
  let changed = false;
  const out: Positions = {};
  for (const [k, v] of Object.entries(positions)) {
    if (ids.has(k)) out[k] = v;
    else changed = true;
  }
  return changed ? out : positions;
}

/**
 * Granular edits of a harness document: add, change or remove one component, pin, wire, clamp
 * or state. Pure functions from a document to a new document (the input is not changed); the
 * caller validates the result as a whole before anything is written.
 *
 * Removing something also removes what would otherwise point at nothing: a component's wires
 * (and those wires in clamps), its entries in states, a connector's mate reference to it;
 * a pin's wires and switch contacts. A clamp left without wires goes too.
 */
import { HttpError } from '../errors';

type Obj = Record<string, unknown>;
export type Section = 'components' | 'wires' | 'clamps' | 'states';
const sectionNames: Record<Section, string> = { components: 'component', wires: 'wire', clamps: 'clamp', states: 'state' };

const clone = <T>(v: T): T => structuredClone(v);
const list = (doc: Obj, section: Section): Obj[] => (Array.isArray(doc[section]) ? (doc[section] as Obj[]) : []);
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

function missing(section: Section, id: string): HttpError {
  return new HttpError(404, 'not_found', `The ${sectionNames[section]} ${id} is not in this revision.`);
}

/** Sets each field of `changes` on `item`; a `null` value removes the field. `id` (and `kind`) stay. */
export function applyChanges(item: Obj, changes: Obj, fixed: string[] = ['id']): Obj {
  for (const key of fixed) {
    if (key in changes && changes[key] !== item[key]) {
      throw new HttpError(400, 'invalid_request', `The ${key} cannot be changed here (it is ${JSON.stringify(item[key])}); remove the item and add a new one instead.`, [
        { path: `$.changes.${key}`, message: 'Cannot be changed' },
      ]);
    }
  }
  const out: Obj = { ...item };
  for (const [key, value] of Object.entries(changes)) {
    if (fixed.includes(key)) continue;
    if (value === null) delete out[key];
    else out[key] = value;
  }
  return out;
}

export function addItem(doc: Obj, section: Section, item: Obj): Obj {
  const next = clone(doc);
  const items = list(next, section);
  if (typeof item.id === 'string' && items.some((x) => x.id === item.id)) {
    throw new HttpError(409, 'already_exists', `There is already a ${sectionNames[section]} ${item.id} in this revision.`);
  }
  next[section] = [...items, item];
  return next;
}

export function updateItem(doc: Obj, section: Section, id: string, changes: Obj): Obj {
  const next = clone(doc);
  const items = list(next, section);
  const i = items.findIndex((x) => x.id === id);
  if (i < 0) throw missing(section, id);
  items[i] = applyChanges(items[i], changes, section === 'components' ? ['id', 'kind'] : ['id']);
  next[section] = items;
  return next;
}

/** Drops the wires in `gone` from clamps, and clamps left with no wire. */
function pruneClamps(doc: Obj, gone: Set<string>): void {
  if (!gone.size) return;
  doc.clamps = list(doc, 'clamps')
    .map((cl) => (Array.isArray(cl.wires) ? { ...cl, wires: (cl.wires as string[]).filter((w) => !gone.has(w)) } : cl))
    .filter((cl) => !Array.isArray(cl.wires) || (cl.wires as unknown[]).length > 0);
}

function removeWiresWhere(doc: Obj, test: (ref: string) => boolean): void {
  const gone = new Set<string>();
  doc.wires = list(doc, 'wires').filter((w) => {
    const hit = test(String(w.from)) || test(String(w.to));
    if (hit) gone.add(String(w.id));
    return !hit;
  });
  pruneClamps(doc, gone);
}

export function removeItem(doc: Obj, section: Section, id: string): Obj {
  const next = clone(doc);
  const items = list(next, section);
  if (!items.some((x) => x.id === id)) throw missing(section, id);
  next[section] = items.filter((x) => x.id !== id);
  if (section === 'wires') pruneClamps(next, new Set([id]));
  if (section === 'components') {
    const prefix = `${id}.`;
    removeWiresWhere(next, (ref) => ref.startsWith(prefix));
    next.components = list(next, 'components').map((c) => {
      if (c.matesWith !== id) return c;
      const { matesWith: _gone, ...rest } = c;
      return rest;
    });
    next.states = list(next, 'states').map((st) => {
      const out: Obj = { ...st };
      if (isObj(out.switches)) {
        const { [id]: _s, ...switches } = out.switches;
        out.switches = switches;
      }
      if (isObj(out.sources)) {
        const { [id]: _v, ...sources } = out.sources;
        out.sources = sources;
      }
      if (Array.isArray(out.outputs)) out.outputs = (out.outputs as string[]).filter((ref) => !ref.startsWith(prefix));
      if (Array.isArray(out.unplugged)) out.unplugged = (out.unplugged as string[]).filter((c) => c !== id);
      return out;
    });
  }
  return next;
}

// ---------------------------------------------------------------- pins

const pinListKey = (component: Obj): 'cavities' | 'pins' => {
  if (component.kind === 'connector') return 'cavities';
  if (component.kind === 'switch' || component.kind === 'module') return 'pins';
  throw new HttpError(400, 'fixed_pins', `A ${String(component.kind)} has fixed pins (see the harness format); only connectors, switches and modules list their own.`);
};
const pinIdOf = (entry: unknown) => (typeof entry === 'string' ? entry : isObj(entry) ? String(entry.id) : '');

function findComponent(doc: Obj, componentId: string): { component: Obj; index: number } {
  const items = list(doc, 'components');
  const index = items.findIndex((c) => c.id === componentId);
  if (index < 0) throw missing('components', componentId);
  return { component: items[index], index };
}

export function addPin(doc: Obj, componentId: string, pin: string | Obj): Obj {
  const next = clone(doc);
  const { component, index } = findComponent(next, componentId);
  const key = pinListKey(component);
  const pins = Array.isArray(component[key]) ? [...(component[key] as unknown[])] : [];
  const id = pinIdOf(pin);
  if (pins.some((p) => pinIdOf(p) === id)) throw new HttpError(409, 'already_exists', `${componentId} already has a pin ${id}.`);
  pins.push(pin);
  (next.components as Obj[])[index] = { ...component, [key]: pins };
  return next;
}

export function updatePin(doc: Obj, componentId: string, pinId: string, changes: Obj): Obj {
  const next = clone(doc);
  const { component, index } = findComponent(next, componentId);
  const key = pinListKey(component);
  const pins = Array.isArray(component[key]) ? [...(component[key] as unknown[])] : [];
  const i = pins.findIndex((p) => pinIdOf(p) === pinId);
  if (i < 0) throw new HttpError(404, 'not_found', `${componentId} has no pin ${pinId}.`);
  const current = pins[i];
  const updated = applyChanges(typeof current === 'string' ? { id: current } : (current as Obj), changes);
  // A cavity with nothing but its id is written back as a plain string.
  pins[i] = Object.keys(updated).length === 1 && typeof current === 'string' ? pinId : updated;
  (next.components as Obj[])[index] = { ...component, [key]: pins };
  return next;
}

export function removePin(doc: Obj, componentId: string, pinId: string): Obj {
  const next = clone(doc);
  const { component, index } = findComponent(next, componentId);
  const key = pinListKey(component);
  const pins = Array.isArray(component[key]) ? (component[key] as unknown[]) : [];
  if (!pins.some((p) => pinIdOf(p) === pinId)) throw new HttpError(404, 'not_found', `${componentId} has no pin ${pinId}.`);
  const updated: Obj = { ...component, [key]: pins.filter((p) => pinIdOf(p) !== pinId) };
  if (component.kind === 'switch' && isObj(component.positions)) {
    updated.positions = Object.fromEntries(
      Object.entries(component.positions).map(([pos, pairs]) => [pos, Array.isArray(pairs) ? pairs.filter((pair) => Array.isArray(pair) && !pair.includes(pinId)) : pairs]),
    );
  }
  (next.components as Obj[])[index] = updated;
  const ref = `${componentId}.${pinId}`;
  removeWiresWhere(next, (r) => r === ref);
  next.states = list(next, 'states').map((st) => (Array.isArray(st.outputs) ? { ...st, outputs: (st.outputs as string[]).filter((o) => o !== ref) } : st));
  return next;
}

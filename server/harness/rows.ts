/**
 * A harness document ⇄ the rows of the relational tables, as pure functions.
 *
 * Every field of the document lands somewhere: in its own column where it is searched or
 * shown in lists (ids, labels, circuits, colours, cavity functions), otherwise in a JSON field
 * kept as written. `rowsToDocument(documentToRows(doc))` equals `doc` (deep equality), which
 * is what makes export → import give the same readings.
 */
import { randomBytes } from 'node:crypto';
import { ID_LENGTH } from '../db/ids';

const alphabet = 'abcdefghijklmnopqrstuvwxyz234567';
/**
 * Ids in the scheme of server/db/ids.ts (26 lowercase base32 characters, 130 random bits),
 * made from one buffer of random bytes per document: a large document needs tens of thousands.
 */
function idMaker(): () => string {
  const codes = Buffer.from(alphabet, 'latin1');
  let buf = Buffer.alloc(0);
  let at = 0;
  return () => {
    if (at + ID_LENGTH > buf.length) {
      buf = randomBytes(ID_LENGTH * 4096);
      for (let i = 0; i < buf.length; i++) buf[i] = codes[buf[i] & 31];
      at = 0;
    }
    const out = buf.toString('latin1', at, at + ID_LENGTH);
    at += ID_LENGTH;
    return out;
  };
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

export interface Position {
  x: number;
  y: number;
}
export type Positions = Record<string, Position>;

/** Column limits: a value longer than its column is kept in the JSON field instead. */
const LIMITS = { label: 255, circuit: 64, color: 16, function: 255, role: 20, kind: 20 } as const;
const fits = (v: unknown, max: number): v is string => typeof v === 'string' && v.length <= max;

/** The pins a component has by its kind when it does not list them (harness-format.md). */
export function fixedPins(component: Obj): string[] {
  switch (component.kind) {
    case 'battery':
      return ['+', '-'];
    case 'ground':
      return ['G'];
    case 'fuse':
    case 'resistor':
    case 'load':
      return ['1', '2'];
    case 'splice':
      return ['S'];
    case 'relay':
      return component.normallyClosed === true ? ['85', '86', '30', '87', '87a'] : ['85', '86', '30', '87'];
    default:
      return [];
  }
}

/** The key that lists a component's pins, if it lists them. */
export function pinsKeyOf(component: Obj): 'cavities' | 'pins' | null {
  if (Array.isArray(component.cavities)) return 'cavities';
  if (Array.isArray(component.pins)) return 'pins';
  return null;
}

export interface RowContext {
  shopId: string;
  revisionId: string;
}

export interface DocumentRows {
  revision: {
    format: string;
    formatVersion: number;
    name: string;
    nominalVolts: number | null;
    temperatureC: number | null;
    notes: string | null;
    messages: unknown;
    extra: Obj | null;
  };
  components: Array<{
    id: string;
    shopId: string;
    revisionId: string;
    position: number;
    key: string;
    kind: string;
    label: string | null;
    notes: string | null;
    pinsKey: string | null;
    fields: Obj;
    x: number | null;
    y: number | null;
  }>;
  pins: Array<{
    id: string;
    shopId: string;
    revisionId: string;
    componentId: string;
    position: number;
    key: string;
    source: 'fixed' | 'string' | 'object';
    role: string | null;
    function: string | null;
    fields: Obj | null;
  }>;
  wires: Array<{
    id: string;
    shopId: string;
    revisionId: string;
    position: number;
    key: string;
    fromPinId: string;
    toPinId: string;
    color: string | null;
    size: Record<string, number> | null;
    lengthM: number | null;
    ohms: number | null;
    circuit: string | null;
    label: string | null;
    notes: string | null;
    extra: Obj | null;
  }>;
  clamps: Array<{ id: string; shopId: string; revisionId: string; position: number; key: string; label: string | null; fields: Obj }>;
  clampWires: Array<{ clampId: string; position: number; revisionId: string; wireId: string }>;
  states: Array<{ id: string; shopId: string; revisionId: string; position: number; key: string; label: string | null; body: Obj }>;
}

/** Raised when a document cannot be stored as rows (a reference the validator let through). */
export class RowsError extends Error {
  constructor(
    readonly path: string,
    message: string,
  ) {
    super(message);
  }
}

const DOC_COLUMNS = new Set(['format', 'version', 'name', 'nominalVolts', 'temperatureC', 'notes', 'messages', 'components', 'wires', 'clamps', 'states']);
const WIRE_COLUMNS = ['id', 'from', 'to', 'color', 'size', 'lengthM', 'ohms', 'circuit', 'label', 'notes'] as const;

function omit(o: Obj, keys: readonly string[] | Set<string>): Obj {
  const drop = Array.isArray(keys) ? (k: string) => keys.includes(k) : (k: string) => (keys as Set<string>).has(k);
  const out: Obj = {};
  for (const k in o) {
    const v = o[k];
    if (v !== undefined && !drop(k)) out[k] = v;
  }
  return out;
}

const numOrNull = (v: unknown) => (typeof v === 'number' ? v : null);
const strOrNull = (v: unknown) => (typeof v === 'string' ? v : null);

/** Splits a valid document into table rows with fresh ids. */
export function documentToRows(doc: Obj, ctx: RowContext, positions: Positions = {}): DocumentRows {
  const { shopId, revisionId } = ctx;
  const newId = idMaker();
  // A document-level field of an unexpected type stays in `extra`, as written.
  const columns = new Set(DOC_COLUMNS);
  if (doc.nominalVolts !== undefined && typeof doc.nominalVolts !== 'number') columns.delete('nominalVolts');
  if (doc.temperatureC !== undefined && typeof doc.temperatureC !== 'number') columns.delete('temperatureC');
  if (doc.notes !== undefined && typeof doc.notes !== 'string') columns.delete('notes');
  if (typeof doc.name !== 'string' || doc.name.length > 500) columns.delete('name');
  const extra = omit(doc, columns);
  // Key order and which optional sections were present are kept in `extra.$keys`.
  const keys = Object.keys(doc).filter((k) => doc[k] !== undefined);
  const rows: DocumentRows = {
    revision: {
      format: String(doc.format),
      formatVersion: Number(doc.version),
      name: columns.has('name') ? String(doc.name) : '',
      nominalVolts: numOrNull(doc.nominalVolts),
      temperatureC: numOrNull(doc.temperatureC),
      notes: strOrNull(doc.notes),
      messages: doc.messages === undefined ? null : doc.messages,
      extra: { ...extra, $keys: keys },
    },
    components: [],
    pins: [],
    wires: [],
    clamps: [],
    clampWires: [],
    states: [],
  };
  // Non-column fields whose values are not the expected type are kept in `fields`/`extra`.
  const pinIds = new Map<string, string>();
  const components = Array.isArray(doc.components) ? doc.components : [];
  components.forEach((c, ci) => {
    if (!isObj(c)) throw new RowsError(`$.components[${ci}]`, 'is not an object');
    const key = String(c.id);
    const componentId = newId();
    const pinsKey = pinsKeyOf(c);
    const labelFits = c.label === undefined || fits(c.label, LIMITS.label);
    const notesIsString = c.notes === undefined || typeof c.notes === 'string';
    const skip = ['id', 'kind'];
    if (labelFits) skip.push('label');
    if (notesIsString) skip.push('notes');
    if (pinsKey) skip.push(pinsKey);
    const pos = positions[key];
    rows.components.push({
      id: componentId,
      shopId,
      revisionId,
      position: ci,
      key,
      kind: String(c.kind),
      label: labelFits ? strOrNull(c.label) : null,
      notes: notesIsString ? strOrNull(c.notes) : null,
      pinsKey,
      fields: omit(c, skip),
      x: pos ? pos.x : null,
      y: pos ? pos.y : null,
    });
    const entries: unknown[] = pinsKey ? (c[pinsKey] as unknown[]) : fixedPins(c);
    entries.forEach((entry, pi) => {
      const pinRow: DocumentRows['pins'][number] = {
        id: newId(),
        shopId,
        revisionId,
        componentId,
        position: pi,
        key: '',
        source: pinsKey ? 'string' : 'fixed',
        role: null,
        function: null,
        fields: null,
      };
      if (typeof entry === 'string') {
        pinRow.key = entry;
      } else if (isObj(entry) && typeof entry.id === 'string') {
        pinRow.key = entry.id;
        pinRow.source = 'object';
        pinRow.fields = omit(entry, ['id']);
        if (fits(entry.role, LIMITS.role)) pinRow.role = entry.role;
        if (fits(entry.function, LIMITS.function)) pinRow.function = entry.function;
      } else {
        throw new RowsError(`$.components[${ci}].${pinsKey}[${pi}]`, 'is not a pin id or a pin with an id');
      }
      const ref = `${key}.${pinRow.key}`;
      if (pinIds.has(ref)) throw new RowsError(`$.components[${ci}].${pinsKey}[${pi}]`, `repeats pin ${ref}`);
      pinIds.set(ref, pinRow.id);
      rows.pins.push(pinRow);
    });
  });

  const wireIds = new Map<string, string>();
  const wires = Array.isArray(doc.wires) ? doc.wires : [];
  wires.forEach((w, wi) => {
    if (!isObj(w)) throw new RowsError(`$.wires[${wi}]`, 'is not an object');
    const fromPinId = pinIds.get(String(w.from));
    const toPinId = pinIds.get(String(w.to));
    if (!fromPinId) throw new RowsError(`$.wires[${wi}].from`, `names pin ${String(w.from)}, which does not exist`);
    if (!toPinId) throw new RowsError(`$.wires[${wi}].to`, `names pin ${String(w.to)}, which does not exist`);
    const id = newId();
    const key = String(w.id);
    wireIds.set(key, id);
    // A field goes to its column only when it has the column's type and fits; else to `extra`.
    const colOk = {
      color: w.color === undefined || fits(w.color, LIMITS.color),
      size: w.size === undefined || (isObj(w.size) && Object.values(w.size).every((v) => typeof v === 'number')),
      lengthM: w.lengthM === undefined || typeof w.lengthM === 'number',
      ohms: w.ohms === undefined || typeof w.ohms === 'number',
      circuit: w.circuit === undefined || fits(w.circuit, LIMITS.circuit),
      label: w.label === undefined || fits(w.label, LIMITS.label),
      notes: w.notes === undefined || typeof w.notes === 'string',
    };
    const inColumns = WIRE_COLUMNS.filter((k) => !(k in colOk) || colOk[k as keyof typeof colOk]);
    const extra = omit(w, inColumns);
    rows.wires.push({
      id,
      shopId,
      revisionId,
      position: wi,
      key,
      fromPinId,
      toPinId,
      color: colOk.color ? strOrNull(w.color) : null,
      size: colOk.size && w.size !== undefined ? (w.size as Record<string, number>) : null,
      lengthM: colOk.lengthM ? numOrNull(w.lengthM) : null,
      ohms: colOk.ohms ? numOrNull(w.ohms) : null,
      circuit: colOk.circuit ? strOrNull(w.circuit) : null,
      label: colOk.label ? strOrNull(w.label) : null,
      notes: colOk.notes ? strOrNull(w.notes) : null,
      extra: Object.keys(extra).length ? extra : null,
    });
  });

  const clamps = Array.isArray(doc.clamps) ? doc.clamps : [];
  clamps.forEach((cl, i) => {
    if (!isObj(cl)) throw new RowsError(`$.clamps[${i}]`, 'is not an object');
    const id = newId();
    const labelFits = cl.label === undefined || fits(cl.label, LIMITS.label);
    const wireList = Array.isArray(cl.wires) ? cl.wires : null;
    const skip = ['id'];
    if (labelFits) skip.push('label');
    if (wireList) skip.push('wires');
    rows.clamps.push({ id, shopId, revisionId, position: i, key: String(cl.id), label: labelFits ? strOrNull(cl.label) : null, fields: omit(cl, skip) });
    (wireList ?? []).forEach((wk, wi) => {
      const wireId = wireIds.get(String(wk));
      if (!wireId) throw new RowsError(`$.clamps[${i}].wires[${wi}]`, `names wire ${String(wk)}, which does not exist`);
      rows.clampWires.push({ clampId: id, position: wi, revisionId, wireId });
    });
    if (!wireList) rows.clamps[rows.clamps.length - 1].fields.$noWires = true;
  });

  const states = Array.isArray(doc.states) ? doc.states : [];
  states.forEach((st, i) => {
    if (!isObj(st)) throw new RowsError(`$.states[${i}]`, 'is not an object');
    const labelFits = st.label === undefined || fits(st.label, LIMITS.label);
    rows.states.push({
      id: newId(),
      shopId,
      revisionId,
      position: i,
      key: String(st.id),
      label: labelFits ? strOrNull(st.label) : null,
      body: omit(st, labelFits ? ['id', 'label'] : ['id']),
    });
  });
  return rows;
}

export interface StoredRows {
  revision: DocumentRows['revision'];
  components: Array<Pick<DocumentRows['components'][number], 'id' | 'position' | 'key' | 'kind' | 'label' | 'notes' | 'pinsKey' | 'fields' | 'x' | 'y'>>;
  pins: Array<Pick<DocumentRows['pins'][number], 'id' | 'componentId' | 'position' | 'key' | 'source' | 'fields'>>;
  wires: Array<Omit<DocumentRows['wires'][number], 'shopId' | 'revisionId'>>;
  clamps: Array<Pick<DocumentRows['clamps'][number], 'id' | 'position' | 'key' | 'label' | 'fields'>>;
  clampWires: Array<Pick<DocumentRows['clampWires'][number], 'clampId' | 'position' | 'wireId'>>;
  states: Array<Pick<DocumentRows['states'][number], 'id' | 'position' | 'key' | 'label' | 'body'>>;
}

const byPosition = <T extends { position: number }>(list: T[]) => [...list].sort((a, b) => a.position - b.position);

/** Puts the document back together from its rows, and the drawing positions beside it. */
export function rowsToDocument(stored: StoredRows): { document: Obj; positions: Positions } {
  const positions: Positions = {};
  const pinsByComponent = new Map<string, StoredRows['pins']>();
  for (const p of byPosition(stored.pins)) {
    const list = pinsByComponent.get(p.componentId);
    if (list) list.push(p);
    else pinsByComponent.set(p.componentId, [p]);
  }
  const pinRef = new Map<string, string>();
  const components = byPosition(stored.components).map((c) => {
    const out: Obj = { id: c.key, kind: c.kind };
    if (c.label !== null) out.label = c.label;
    if (c.notes !== null) out.notes = c.notes;
    Object.assign(out, c.fields);
    const pinRows = pinsByComponent.get(c.id) ?? [];
    for (const p of pinRows) pinRef.set(p.id, `${c.key}.${p.key}`);
    if (c.pinsKey) {
      out[c.pinsKey] = pinRows.map((p) => (p.source === 'object' ? { id: p.key, ...(p.fields ?? {}) } : p.key));
    }
    if (c.x !== null && c.y !== null) positions[c.key] = { x: c.x, y: c.y };
    return out;
  });
  const wireKey = new Map<string, string>();
  const wires = byPosition(stored.wires).map((w) => {
    wireKey.set(w.id, w.key);
    const out: Obj = { id: w.key, from: pinRef.get(w.fromPinId), to: pinRef.get(w.toPinId) };
    if (w.color !== null) out.color = w.color;
    if (w.size !== null) out.size = w.size;
    if (w.lengthM !== null) out.lengthM = w.lengthM;
    if (w.ohms !== null) out.ohms = w.ohms;
    if (w.circuit !== null) out.circuit = w.circuit;
    if (w.label !== null) out.label = w.label;
    if (w.notes !== null) out.notes = w.notes;
    if (w.extra) Object.assign(out, w.extra);
    return out;
  });
  const wiresOfClamp = new Map<string, string[]>();
  for (const cw of byPosition(stored.clampWires)) {
    const list = wiresOfClamp.get(cw.clampId) ?? [];
    list.push(wireKey.get(cw.wireId) ?? '');
    wiresOfClamp.set(cw.clampId, list);
  }
  const clamps = byPosition(stored.clamps).map((cl) => {
    const { $noWires, ...fields } = cl.fields;
    const out: Obj = { id: cl.key };
    if (cl.label !== null) out.label = cl.label;
    if (!$noWires) out.wires = wiresOfClamp.get(cl.id) ?? [];
    Object.assign(out, fields);
    return out;
  });
  const states = byPosition(stored.states).map((st) => {
    const out: Obj = { id: st.key };
    if (st.label !== null) out.label = st.label;
    Object.assign(out, st.body);
    return out;
  });

  const r = stored.revision;
  const { $keys, ...extra } = (r.extra ?? {}) as Obj & { $keys?: string[] };
  const values: Obj = {
    format: r.format,
    version: r.formatVersion,
    ...(r.name !== '' || !('name' in extra) ? { name: r.name } : {}),
    ...(r.nominalVolts !== null ? { nominalVolts: r.nominalVolts } : {}),
    ...(r.temperatureC !== null ? { temperatureC: r.temperatureC } : {}),
    ...(r.notes !== null ? { notes: r.notes } : {}),
    ...(r.messages !== null && r.messages !== undefined ? { messages: r.messages } : {}),
    components,
    wires,
    clamps,
    states,
    ...extra,
  };
  const keys = Array.isArray($keys) ? $keys : ['format', 'version', 'name', 'nominalVolts', 'temperatureC', 'notes', 'messages', 'components', 'wires', 'clamps', 'states'];
  const document: Obj = {};
  for (const k of keys) if (values[k] !== undefined) document[k] = values[k];
  // Sections the document came without stay absent, unless they gained items since.
  for (const k of ['components', 'wires', 'clamps', 'states']) {
    if (!(k in document) && Array.isArray(values[k]) && (values[k] as unknown[]).length) document[k] = values[k];
  }
  return { document, positions };
}

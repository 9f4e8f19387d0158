/**
 * What changed between two harness documents: components, wires, clamps and states added,
 * removed or changed field by field, and the document-level fields. Pure: takes two documents
 * (already valid, or at least shaped like one) and returns plain data; never throws.
 *
 * Items are matched by their `id`. A component's pin list (`cavities` of a connector, `pins`
 * of a switch or module) is compared pin by pin, so a changed cavity shows as
 * `cavities.3` rather than the whole list.
 */

export type DiffSection = 'components' | 'wires' | 'clamps' | 'states';
export const diffSections: readonly DiffSection[] = ['components', 'wires', 'clamps', 'states'];

export interface FieldChange {
  /** A top-level field (`color`, `ohms`), or `cavities.3` / `pins.IGN` for one pin of a list. */
  field: string;
  /** Absent when the field was added. */
  before?: unknown;
  /** Absent when the field was removed. */
  after?: unknown;
}

export interface ItemChange {
  id: string;
  changes: FieldChange[];
}

export interface SectionDiff {
  added: Array<{ id: string; item: unknown }>;
  removed: Array<{ id: string; item: unknown }>;
  changed: ItemChange[];
}

export interface HarnessDiff {
  /** Document-level fields (name, nominalVolts, temperatureC, notes, messages …). */
  document: FieldChange[];
  components: SectionDiff;
  wires: SectionDiff;
  clamps: SectionDiff;
  states: SectionDiff;
  /** Total count of added, removed and changed items plus document-level changes. */
  total: number;
  same: boolean;
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Structural equality of JSON values (key order does not matter, array order does). */
export function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== typeof b || a === null || b === null) return false;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!jsonEqual(a[i], b[i])) return false;
    return true;
  }
  if (Array.isArray(b)) return false;
  if (isObj(a) && isObj(b)) {
    const ka = Object.keys(a).filter((k) => a[k] !== undefined);
    const kb = Object.keys(b).filter((k) => b[k] !== undefined);
    if (ka.length !== kb.length) return false;
    for (const k of ka) if (!(k in b) || !jsonEqual(a[k], b[k])) return false;
    return true;
  }
  return false;
}

const listKeys = new Set(['components', 'wires', 'clamps', 'states']);

function fieldChanges(before: Obj, after: Obj, skip: Set<string> = new Set()): FieldChange[] {
  const out: FieldChange[] = [];
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  for (const key of keys) {
    if (skip.has(key)) continue;
    const b = before[key];
    const a = after[key];
    if (jsonEqual(b, a)) continue;
    if ((key === 'cavities' || key === 'pins') && (Array.isArray(b) || b === undefined) && (Array.isArray(a) || a === undefined)) {
      out.push(...pinListChanges(key, (b as unknown[]) ?? [], (a as unknown[]) ?? []));
      continue;
    }
    const change: FieldChange = { field: key };
    if (b !== undefined) change.before = b;
    if (a !== undefined) change.after = a;
    out.push(change);
  }
  return out;
}

const pinId = (entry: unknown): string | undefined => (typeof entry === 'string' ? entry : isObj(entry) && typeof entry.id === 'string' ? entry.id : undefined);

function pinListChanges(key: string, before: unknown[], after: unknown[]): FieldChange[] {
  const ids = (list: unknown[]) => list.map(pinId);
  const bIds = ids(before);
  const aIds = ids(after);
  // Pins without ids, or repeated ids, cannot be matched: report the whole list.
  const unmatchable = [...bIds, ...aIds].some((x) => x === undefined) || new Set(bIds).size !== bIds.length || new Set(aIds).size !== aIds.length;
  if (unmatchable) return [{ field: key, before, after }];
  const out: FieldChange[] = [];
  const bMap = new Map(before.map((e) => [pinId(e)!, e]));
  const aMap = new Map(after.map((e) => [pinId(e)!, e]));
  for (const [id, b] of bMap) {
    const a = aMap.get(id);
    if (a === undefined) out.push({ field: `${key}.${id}`, before: b });
    else if (!jsonEqual(a, b)) out.push({ field: `${key}.${id}`, before: b, after: a });
  }
  for (const [id, a] of aMap) if (!bMap.has(id)) out.push({ field: `${key}.${id}`, after: a });
  const commonB = bIds.filter((id) => aMap.has(id!));
  const commonA = aIds.filter((id) => bMap.has(id!));
  if (out.length === 0 && !jsonEqual(commonB, commonA)) out.push({ field: `${key} order`, before: bIds, after: aIds });
  return out;
}

function sectionDiff(before: unknown, after: unknown): SectionDiff {
  const list = (v: unknown): Obj[] => (Array.isArray(v) ? v.filter(isObj) : []);
  const keyOf = (item: Obj, i: number) => (typeof item.id === 'string' ? item.id : `#${i}`);
  const bMap = new Map(list(before).map((item, i) => [keyOf(item, i), item]));
  const aMap = new Map(list(after).map((item, i) => [keyOf(item, i), item]));
  const diff: SectionDiff = { added: [], removed: [], changed: [] };
  for (const [id, b] of bMap) {
    const a = aMap.get(id);
    if (!a) diff.removed.push({ id, item: b });
    else {
      const changes = fieldChanges(b, a, new Set(['id']));
      if (changes.length) diff.changed.push({ id, changes });
    }
  }
  for (const [id, a] of aMap) if (!bMap.has(id)) diff.added.push({ id, item: a });
  return diff;
}

/** The changes that turn `before` into `after`. */
export function diffDocuments(before: unknown, after: unknown): HarnessDiff {
  const b = isObj(before) ? before : {};
  const a = isObj(after) ? after : {};
  const document = fieldChanges(b, a, listKeys);
  const sections = Object.fromEntries(diffSections.map((s) => [s, sectionDiff(b[s], a[s])])) as Record<DiffSection, SectionDiff>;
  const total = document.length + diffSections.reduce((n, s) => n + sections[s].added.length + sections[s].removed.length + sections[s].changed.length, 0);
  return { document, ...sections, total, same: total === 0 };
}

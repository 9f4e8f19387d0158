/**
 * The reading set being taken: one per revision (and repair order), shared by
 * the pin cards and walks of that revision, kept in this tab's session storage
 * so moving from a card to a walk and back loses nothing. Saved to the server
 * on request (POST, then PUT with the version).
 */
import { useCallback, useSyncExternalStore } from 'react';
import type { Observation } from '@shared/readings/mark';
import { expectedOhms, expectedVolts, inRange, verdict, type ExpectedRange, type Tolerance } from '@shared/readings/expected';

export interface DraftSet {
  observations: Observation[];
  /** Once saved: the server's id and version. */
  savedId?: string;
  version?: number;
  savedAt?: string;
  /** The observations as last saved (JSON), to tell unsaved changes. */
  savedJson?: string;
}

const listeners = new Set<() => void>();
const memory = new Map<string, DraftSet>();
const empty: DraftSet = { observations: [] };

const storageKey = (revisionId: string, orderId: string | null) => `ww.readings.${revisionId}.${orderId ?? 'none'}`;

function read(key: string): DraftSet {
  const hit = memory.get(key);
  if (hit) return hit;
  let value = empty;
  try {
    const raw = sessionStorage.getItem(key);
    if (raw) value = JSON.parse(raw) as DraftSet;
  } catch {
    value = empty;
  }
  memory.set(key, value);
  return value;
}

function write(key: string, value: DraftSet) {
  memory.set(key, value);
  try {
    sessionStorage.setItem(key, JSON.stringify(value));
  } catch {
    /* storage full or off: the set stays in memory */
  }
  listeners.forEach((l) => l());
}

/** Same reading again (same pin/pair/fuse and state) replaces the old one. */
export function sameTarget(a: Observation, b: Observation): boolean {
  if (a.kind !== b.kind) return false;
  if (a.kind === 'volts' && b.kind === 'volts') return a.pin === b.pin && a.state === b.state;
  if (a.kind === 'ohms' && b.kind === 'ohms') return a.state === b.state && ((a.a === b.a && a.b === b.b) || (a.a === b.b && a.b === b.a));
  if (a.kind === 'fuse' && b.kind === 'fuse') return a.fuse === b.fuse;
  return false;
}

export function useDraftSet(revisionId: string, orderId: string | null) {
  const key = storageKey(revisionId, orderId);
  const set = useSyncExternalStore(
    (cb) => {
      listeners.add(cb);
      return () => listeners.delete(cb);
    },
    () => read(key),
    () => empty,
  );
  const add = useCallback(
    (o: Observation) => {
      const cur = read(key);
      write(key, { ...cur, observations: [...cur.observations.filter((x) => !sameTarget(x, o)), o] });
    },
    [key],
  );
  const remove = useCallback(
    (index: number) => {
      const cur = read(key);
      write(key, { ...cur, observations: cur.observations.filter((_, i) => i !== index) });
    },
    [key],
  );
  const markSaved = useCallback(
    (id: string, version: number, savedAt: string, observations: Observation[]) => {
      const cur = read(key);
      write(key, { ...cur, savedId: id, version, savedAt, savedJson: JSON.stringify(observations) });
    },
    [key],
  );
  const clear = useCallback(() => write(key, { observations: [] }), [key]);
  const dirty = set.observations.length > 0 && JSON.stringify(set.observations) !== set.savedJson;
  return { set, add, remove, markSaved, clear, dirty };
}

export interface LocalMark {
  inRange: boolean | null;
  verdict: string;
  expected: ExpectedRange | null;
}

/**
 * Marks one reading in the browser, at once, with the same rules the server uses
 * (shared/readings): `volts` is the engine's expected value for that pin and state
 * (undefined while not known yet), `ohms` the expected two-point resistance.
 */
export function markLocal(o: Observation, expected: { volts?: number | null; ohms?: number | null }, tolerance?: Tolerance | null): LocalMark {
  if (o.kind === 'fuse') {
    const ok = !o.blowsOnInsert;
    return { inRange: ok, verdict: `${ok ? 'OK' : 'OUT'}: fuse ${ok ? 'holds' : 'blows on insert'}, expected it to hold`, expected: null };
  }
  if (o.kind === 'volts') {
    if (expected.volts === undefined) return { inRange: null, verdict: 'Working out the expected reading…', expected: null };
    const range = expectedVolts(expected.volts, tolerance ?? null);
    const ok = inRange(range, o.volts);
    return { inRange: ok, verdict: verdict(range, o.volts, ok), expected: range };
  }
  if (expected.ohms === undefined) return { inRange: null, verdict: 'Working out the expected reading…', expected: null };
  const range = expectedOhms(expected.ohms);
  const ok = inRange(range, o.ohms);
  return { inRange: ok, verdict: verdict(range, o.ohms, ok), expected: range };
}

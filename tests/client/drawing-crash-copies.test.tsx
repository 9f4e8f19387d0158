/**
 * The crash copies' storage logic (src/features/drawing/backup.ts) over
 * in-memory storages: one localStorage shared by the tabs of a browser, a
 * sessionStorage and a page load of each tab, and a clock the test moves.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { HarnessDocument } from '@shared/harness';
import { HEARTBEAT_MS, STALE_MS, backupKey, crashCopies, editingKey, type CrashCopyEnv, type KeyValueStore } from '@/features/drawing/backup';

class MemoryStorage implements KeyValueStore {
  private items = new Map<string, string>();
  get length() {
    return this.items.size;
  }
  key(i: number) {
    return [...this.items.keys()][i] ?? null;
  }
  getItem(k: string) {
    return this.items.get(k) ?? null;
  }
  setItem(k: string, v: string) {
    this.items.set(k, String(v));
  }
  removeItem(k: string) {
    this.items.delete(k);
  }
  keys() {
    return [...this.items.keys()];
  }
  copy() {
    const c = new MemoryStorage();
    for (const [k, v] of this.items) c.setItem(k, v);
    return c;
  }
}

const R = 'r'.repeat(26);
const doc = (wires: number): HarnessDocument => ({
  format: 'wirewalk-harness',
  version: 1,
  name: 'Boom lights',
  nominalVolts: 12,
  temperatureC: 20,
  components: [{ id: 'BATT', kind: 'battery', volts: 12.6 }, { id: 'G1', kind: 'ground' }],
  wires: Array.from({ length: wires }, (_, i) => ({ id: `W${i + 1}`, from: 'BATT.-', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 })),
  clamps: [],
  states: [],
});
const saved = { doc: doc(1), positions: { BATT: { x: 0, y: 0 }, G1: { x: 200, y: 0 } } };
const copyOf = (wires: number, at: number) => ({ doc: doc(wires), positions: saved.positions, at, version: 3 });

/** One browser: shared localStorage, a clock. Each tab is a sessionStorage; each page load an env. */
function browser() {
  const local = new MemoryStorage();
  let time = Date.parse('2026-12-01T10:00:00Z');
  let pages = 0;
  const now = () => time;
  const tab = (session = new MemoryStorage()) => {
    const load = (reloaded = false): CrashCopyEnv => ({ local, session, now, page: `page${++pages}`, reloaded });
    return { session, load };
  };
  return { local, tab, now, advance: (ms: number) => (time += ms) };
}

// The heartbeat's timer runs on fake time; a crashed tab's is simply never stopped.
beforeEach(() => {
  vi.useFakeTimers();
});
afterEach(() => {
  vi.clearAllTimers();
  vi.useRealTimers();
});

describe('crash copies, one per tab', () => {
  it('keeps a copy per tab: two tabs on one draft never overwrite each other', () => {
    const b = browser();
    const a = crashCopies(R, b.tab().load());
    const c = crashCopies(R, b.tab().load());
    expect(a.tab).not.toBe(c.tab);
    a.write(copyOf(2, b.now()));
    c.write(copyOf(3, b.now()));
    expect(JSON.parse(b.local.getItem(backupKey(R, a.tab))!).doc.wires).toHaveLength(2);
    expect(JSON.parse(b.local.getItem(backupKey(R, c.tab))!).doc.wires).toHaveLength(3);
    a.remove();
    expect(b.local.getItem(backupKey(R, a.tab))).toBeNull();
    expect(b.local.getItem(backupKey(R, c.tab))).not.toBeNull();
  });

  it('does not offer (or remove) the copy of another tab still editing the draft, and offers it once that tab closes', () => {
    const b = browser();
    const other = crashCopies(R, b.tab().load());
    const stop = other.editing();
    other.write(copyOf(3, b.now()));
    // A copy equal to the draft would be removed, but not one of a tab at work.
    const otherKey = backupKey(R, other.tab);
    const opening = crashCopies(R, b.tab().load());
    expect(opening.offers(saved)).toEqual([]);
    expect(opening.offers({ ...saved, doc: doc(3) })).toEqual([]);
    expect(b.local.getItem(otherKey)).not.toBeNull();
    stop();
    const offers = opening.offers(saved);
    expect(offers).toHaveLength(1);
    expect(offers[0]).toMatchObject({ key: otherKey, tab: other.tab, mine: false });
    expect(offers[0].doc.wires).toHaveLength(3);
  });

  it('offers the copy of a tab that crashed once its mark has gone stale, and clears the mark', () => {
    const b = browser();
    const crashed = crashCopies(R, b.tab().load());
    crashed.editing(); // never stopped: the tab died
    crashed.write(copyOf(2, b.now()));
    b.advance(STALE_MS - 1000);
    const opening = crashCopies(R, b.tab().load());
    expect(opening.offers(saved)).toEqual([]);
    b.advance(2000);
    expect(opening.offers(saved).map((o) => o.tab)).toEqual([crashed.tab]);
    expect(b.local.getItem(editingKey(R, crashed.tab))).toBeNull();
  });

  it('lets a live tab renew its mark on the heartbeat, and drop it on pagehide', () => {
    const b = browser();
    const other = crashCopies(R, b.tab().load());
    const stop = other.editing();
    other.write(copyOf(2, b.now()));
    const opening = crashCopies(R, b.tab().load());
    for (let i = 0; i < 20; i++) {
      b.advance(HEARTBEAT_MS);
      vi.advanceTimersByTime(HEARTBEAT_MS);
    }
    // Five minutes later the other tab is still at work: its copy stays its own.
    expect(opening.offers(saved)).toEqual([]);
    window.dispatchEvent(new Event('pagehide'));
    expect(opening.offers(saved)).toHaveLength(1);
    stop();
  });

  it('gives a reloaded tab its own copy back at once, even when the page before crashed', () => {
    const b = browser();
    const t = b.tab();
    const before = crashCopies(R, t.load());
    before.editing(); // the page crashed: its mark is still fresh
    before.write(copyOf(2, b.now()));
    b.advance(5000);
    const after = crashCopies(R, t.load(true));
    expect(after.tab).toBe(before.tab);
    const offers = after.offers(saved);
    expect(offers).toHaveLength(1);
    expect(offers[0]).toMatchObject({ mine: true, key: backupKey(R, before.tab) });
    // Another tab does not see it while the crashed page's mark is fresh.
    expect(crashCopies(R, b.tab().load()).offers(saved)).toEqual([]);
  });

  it('gives a duplicated tab (a copy of the sessionStorage) an id of its own while the original edits', () => {
    const b = browser();
    const original = b.tab();
    const first = crashCopies(R, original.load());
    const stop = first.editing();
    first.write(copyOf(2, b.now()));
    const dup = crashCopies(R, b.tab(original.session.copy()).load());
    expect(dup.tab).not.toBe(first.tab);
    dup.write(copyOf(5, b.now()));
    expect(JSON.parse(b.local.getItem(backupKey(R, first.tab))!).doc.wires).toHaveLength(2);
    // The original's copy is not the duplicate's to offer.
    expect(dup.offers(saved).map((o) => o.tab)).toEqual([dup.tab]);
    stop();
  });

  it('finds the single copy older versions kept, and lists every copy newest first with when it was written', () => {
    const b = browser();
    const t0 = b.now();
    b.local.setItem(backupKey(R), JSON.stringify({ doc: doc(4), positions: saved.positions, at: t0 - 60_000 }));
    const closed = crashCopies(R, b.tab().load());
    closed.write(copyOf(2, t0 - 10_000));
    const me = b.tab();
    const earlier = crashCopies(R, me.load());
    earlier.write(copyOf(3, t0 - 30_000));
    // A copy of another draft, and one that cannot be read: neither is offered.
    b.local.setItem(backupKey('s'.repeat(26), 'zzzz'), JSON.stringify(copyOf(9, t0)));
    b.local.setItem(backupKey(R, 'broken'), '{not json');

    const offers = crashCopies(R, me.load(true)).offers(saved);
    expect(offers.map((o) => ({ tab: o.tab, mine: o.mine, at: o.at, wires: o.doc.wires.length }))).toEqual([
      { tab: closed.tab, mine: false, at: t0 - 10_000, wires: 2 },
      { tab: earlier.tab, mine: true, at: t0 - 30_000, wires: 3 },
      { tab: null, mine: false, at: t0 - 60_000, wires: 4 },
    ]);
    expect(offers[2].version).toBeUndefined();
    expect(b.local.getItem(backupKey(R, 'broken'))).toBe('{not json');
  });

  it('removes a copy that holds nothing the draft does not', () => {
    const b = browser();
    const gone = crashCopies(R, b.tab().load());
    gone.write({ ...saved, at: b.now(), version: 3 });
    b.local.setItem(backupKey(R), JSON.stringify({ ...saved, at: b.now() }));
    expect(crashCopies(R, b.tab().load()).offers(saved)).toEqual([]);
    expect(b.local.keys().filter((k) => k.startsWith('wirewalk.drawing.unsaved.'))).toEqual([]);
  });

  it('keeps working without storage', () => {
    const copies = crashCopies(R, { local: null, session: null, now: Date.now, page: 'p', reloaded: false });
    expect(copies.write(copyOf(2, 0))).toBe(false);
    expect(copies.offers(saved)).toEqual([]);
    copies.editing()();
  });
});

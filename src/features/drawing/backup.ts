/**
 * The crash copies of a draft: written to this browser's storage while changes
 * wait for the server, removed once the server has them. An editor that
 * opens and finds copies that differ from the draft offers them back.
 *
 * Each tab keeps its own copy (key: revision and tab), so two tabs or windows
 * on one draft never overwrite each other's. The tab's id lives in
 * sessionStorage, which survives a reload (and a crash and reload) of that tab
 * but is not shared with other tabs, so a reloaded tab finds its own copy.
 *
 * Another tab's copy is offered only once that tab has stopped editing the
 * draft. An editor says it is editing with a mark it rewrites every
 * HEARTBEAT_MS and removes when it closes (unmount, pagehide); a tab that
 * crashed leaves a mark that stops being renewed and counts as gone after
 * STALE_MS. A timestamp needs nothing but localStorage, works the same in every
 * browser, and is read synchronously when the editor opens (no waiting for
 * other tabs to answer a message, which a crashed tab never would).
 */
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';

export interface DraftBackup {
  doc: HarnessDocument;
  positions: Positions;
  /** When it was written (ms since the epoch). */
  at: number;
  /** The draft's version the copy was made on (absent in copies written before it was recorded). */
  version?: number;
}

/** A copy found in storage. */
export interface CrashCopy extends DraftBackup {
  key: string;
  /** The tab that wrote it; null for the one copy per draft that versions before tabs kept. */
  tab: string | null;
  /** Written by this tab (before a reload or a crash). */
  mine: boolean;
}

/** The part of the Storage interface used here (tests pass their own). */
export type KeyValueStore = Pick<Storage, 'getItem' | 'setItem' | 'removeItem' | 'key' | 'length'>;

export interface CrashCopyEnv {
  local: KeyValueStore | null;
  session: KeyValueStore | null;
  now: () => number;
  /** This page load; tells a tab's own earlier page (reload) from a duplicated tab. */
  page: string;
  /** This page load is a reload of the tab. */
  reloaded: boolean;
}

/**
 * A background tab's timers may run only once a minute (browsers throttle hidden
 * tabs), so a mark counts as live for two minutes. A crashed tab's copy waits
 * that long before other tabs offer it; the crashed tab itself, reloaded,
 * finds it at once.
 */
export const HEARTBEAT_MS = 15_000;
export const STALE_MS = 120_000;

const COPY = 'wirewalk.drawing.unsaved.';
const EDITING = 'wirewalk.drawing.editing.';
const TAB = 'wirewalk.tab';

/** The copy of one tab, or (no tab) the single copy versions before tabs kept. */
export const backupKey = (revisionId: string, tab?: string) => (tab ? `${COPY}${revisionId}.${tab}` : `${COPY}${revisionId}`);
export const editingKey = (revisionId: string, tab: string) => `${EDITING}${revisionId}.${tab}`;

const newId = () => Math.random().toString(36).slice(2, 10).padEnd(8, '0');

interface Mark {
  at: number;
  page: string;
}

function readMark(local: KeyValueStore, key: string): Mark | null {
  try {
    const m = JSON.parse(local.getItem(key) ?? 'null') as Partial<Mark> | null;
    return m && typeof m.at === 'number' && typeof m.page === 'string' ? { at: m.at, page: m.page } : null;
  } catch {
    return null;
  }
}

/** Keys of this draft's copies and marks (collected first: removing while walking the storage shifts the indexes). */
function keysOf(local: KeyValueStore, prefix: string): Array<{ key: string; tab: string | null }> {
  const out: Array<{ key: string; tab: string | null }> = [];
  for (let i = 0; i < local.length; i++) {
    const key = local.key(i);
    if (!key?.startsWith(prefix)) continue;
    const rest = key.slice(prefix.length);
    if (rest === '') out.push({ key, tab: null });
    else if (rest.startsWith('.') && rest.length > 1) out.push({ key, tab: rest.slice(1) });
  }
  return out;
}

function parseCopy(raw: string | null): DraftBackup | null {
  if (!raw) return null;
  let parsed: unknown;
  try {
    parsed = JSON.parse(raw);
  } catch {
    return null;
  }
  const b = parsed as Partial<DraftBackup> | null;
  const doc = b?.doc as Partial<HarnessDocument> | undefined;
  if (!b || typeof b !== 'object' || !doc || !Array.isArray(doc.components) || !Array.isArray(doc.wires) || typeof b.at !== 'number') return null;
  return { doc: b.doc!, positions: b.positions && typeof b.positions === 'object' ? b.positions : {}, at: b.at, version: typeof b.version === 'number' ? b.version : undefined };
}

function samePositions(a: Positions, b: Positions): boolean {
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  return ka.every((k) => b[k] && a[k].x === b[k].x && a[k].y === b[k].y);
}

export interface CrashCopies {
  /** This tab's id. */
  readonly tab: string;
  /**
   * The copies worth offering for this draft, newest first: this tab's and those of tabs no
   * longer editing it (and an old single copy). A copy that cannot be read is left alone; one
   * that holds nothing the draft does not is removed. A copy may be a document with problems:
   * it was never checked, that is why it was not saved.
   */
  offers(current: { doc: HarnessDocument; positions: Positions }): CrashCopy[];
  /** Writes this tab's copy; false when storage refused it. */
  write(backup: DraftBackup): boolean;
  /** Removes one copy (this tab's when no key is given). */
  remove(key?: string): void;
  /** Marks this tab as editing the draft until the function returned is called. */
  editing(): () => void;
}

/** The crash copies of one draft, as seen from this tab. */
export function crashCopies(revisionId: string, env: CrashCopyEnv = browserEnv()): CrashCopies {
  const { local, now, page } = env;
  const tab = claimTab(revisionId, env);
  const own = backupKey(revisionId, tab);
  const mark = editingKey(revisionId, tab);

  const live = (t: string) => {
    const m = local && readMark(local, editingKey(revisionId, t));
    return !!m && now() - m.at < STALE_MS;
  };
  const remove = (key = own) => {
    try {
      local?.removeItem(key);
    } catch {
      /* storage blocked */
    }
  };
  const beat = () => {
    try {
      local?.setItem(mark, JSON.stringify({ at: now(), page } satisfies Mark));
    } catch {
      /* storage full or blocked: other tabs may offer this tab's copy early, nothing is lost */
    }
  };
  const unmark = () => {
    // Only this page's mark: a duplicated tab that kept the id (see claimTab) must not lose its own.
    if (local && readMark(local, mark)?.page === page) remove(mark);
  };

  return {
    tab,
    offers(current) {
      if (!local) return [];
      const out: CrashCopy[] = [];
      try {
        // Marks of tabs that crashed are never removed by their tab.
        for (const { key, tab: t } of keysOf(local, `${EDITING}${revisionId}`)) if (t && t !== tab && !live(t)) remove(key);
        for (const { key, tab: t } of keysOf(local, `${COPY}${revisionId}`)) {
          const mine = t === tab;
          // Another tab still editing keeps its copy to itself: it is neither offered nor removed here.
          if (t && !mine && live(t)) continue;
          const b = parseCopy(local.getItem(key));
          if (!b) continue;
          if (JSON.stringify(b.doc) === JSON.stringify(current.doc) && samePositions(b.positions, current.positions)) {
            remove(key);
            continue;
          }
          out.push({ ...b, key, tab: t, mine });
        }
      } catch {
        /* storage blocked */
      }
      return out.sort((a, b) => b.at - a.at);
    },
    write(backup) {
      if (!local) return false;
      try {
        local.setItem(own, JSON.stringify(backup));
        return true;
      } catch {
        /* storage full or blocked: the server copy still saves */
        return false;
      }
    },
    remove,
    editing() {
      beat();
      const timer = setInterval(beat, HEARTBEAT_MS);
      // A reload or a closed tab stops editing at once; a page kept for the back button and shown again resumes.
      const onShow = (e: PageTransitionEvent) => e.persisted && beat();
      window.addEventListener('pagehide', unmark);
      window.addEventListener('pageshow', onShow);
      return () => {
        clearInterval(timer);
        window.removeEventListener('pagehide', unmark);
        window.removeEventListener('pageshow', onShow);
        unmark();
      };
    },
  };
}

/**
 * This tab's id, kept in sessionStorage. A duplicated tab starts with a copy of the
 * original's sessionStorage, so the same id: when another page load with this id is
 * editing this draft and this one is not a reload, this tab takes an id of its own.
 * (A tab reloaded after a crash finds its earlier page's mark still fresh; as a reload
 * it keeps its id, and so finds its own copy.)
 */
function claimTab(revisionId: string, { local, session, now, page, reloaded }: CrashCopyEnv): string {
  let tab: string | null = null;
  try {
    tab = session?.getItem(TAB) ?? null;
  } catch {
    tab = null;
  }
  if (tab && local && !reloaded) {
    const m = readMark(local, editingKey(revisionId, tab));
    if (m && m.page !== page && now() - m.at < STALE_MS) tab = null;
  }
  if (!tab) {
    tab = newId();
    try {
      session?.setItem(TAB, tab);
    } catch {
      /* without sessionStorage the id lasts as long as the page: copies stay apart, a reload finds its own after STALE_MS */
    }
  }
  return tab;
}

const thisPage = newId();

function browserEnv(): CrashCopyEnv {
  // Reading window.localStorage itself throws where storage is blocked.
  const get = (name: 'localStorage' | 'sessionStorage') => {
    try {
      return window[name];
    } catch {
      return null;
    }
  };
  const nav = typeof performance !== 'undefined' ? (performance.getEntriesByType?.('navigation')[0] as PerformanceNavigationTiming | undefined) : undefined;
  return { local: get('localStorage'), session: get('sessionStorage'), now: Date.now, page: thisPage, reloaded: nav?.type === 'reload' };
}

/** What the copy changes, in words: "3 components more, 2 wires fewer", "the same parts, placed differently" … */
export function backupDifference(backup: DraftBackup, current: HarnessDocument): string {
  const parts: string[] = [];
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  const dc = backup.doc.components.length - current.components.length;
  const dw = backup.doc.wires.length - current.wires.length;
  if (dc) parts.push(`${count(Math.abs(dc), 'component', 'components')} ${dc > 0 ? 'more' : 'fewer'}`);
  if (dw) parts.push(`${count(Math.abs(dw), 'wire', 'wires')} ${dw > 0 ? 'more' : 'fewer'}`);
  if (parts.length) return parts.join(', ');
  return JSON.stringify(backup.doc) === JSON.stringify(current) ? 'the same parts, placed differently' : 'as many parts and wires, with changes';
}

/**
 * Lays out harnesses on a worker thread (elkjs blocks the thread it runs on for a second or more on a
 * few hundred components). One thread, started on first use, holding the process open only while it
 * has work;
 * requests queue on it, and a request that waits too long is answered with no positions (the editor
 * then lays the drawing out itself, as for any draft without them).
 */
import { Worker } from 'node:worker_threads';
import type { HarnessDocument } from '../../shared/harness';
import type { Positions } from './rows';

/** Harnesses up to this many components are laid out when imported; bigger ones take too long. */
export const LAYOUT_AT_IMPORT_MAX_COMPONENTS = 2500;
/** Longest a request waits for its positions, queue included. */
const LAYOUT_TIMEOUT_MS = 20_000;
/** Requests already queued beyond which a new one is not laid out at all. */
const MAX_WAITING = 3;

type Pending = { resolve: (p: Positions | undefined) => void; timer: NodeJS.Timeout };

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

function settle(id: number, positions: Positions | undefined): void {
  const p = pending.get(id);
  if (!p) return;
  pending.delete(id);
  clearTimeout(p.timer);
  if (pending.size === 0) worker?.unref();
  p.resolve(positions);
}

/** Ends the thread and answers everything it held with no positions (a crash, a stuck layout, the server stopping). */
export function stopLayoutThread(): void {
  const w = worker;
  worker = null;
  if (w) void w.terminate();
  for (const id of [...pending.keys()]) settle(id, undefined);
}

function thread(): Worker {
  if (worker) return worker;
  const w = new Worker(new URL('./layout-thread.worker.mjs', import.meta.url));
  w.on('message', (m: { id: number; positions?: Positions; error?: string }) => {
    if (m.error) console.warn(`layout on import failed: ${m.error}`);
    settle(m.id, m.positions);
  });
  w.on('error', (error) => {
    console.warn(`layout thread stopped: ${error.message}`);
    if (worker === w) stopLayoutThread();
  });
  w.on('exit', () => {
    if (worker === w) stopLayoutThread();
  });
  worker = w;
  return w;
}

/**
 * Positions for every component, laid out off the request thread; undefined when the harness is too
 * big, the queue too long, the layout too slow or failed. Never rejects: an import goes on without them.
 */
export function layOutOffThread(doc: Pick<HarnessDocument, 'components' | 'wires'>): Promise<Positions | undefined> {
  if (doc.components.length === 0 || doc.components.length > LAYOUT_AT_IMPORT_MAX_COMPONENTS || pending.size >= MAX_WAITING) {
    return Promise.resolve(undefined);
  }
  return new Promise((resolve) => {
    const id = nextId++;
    // A layout this slow is stuck or far too big: end the thread so the next one starts fresh.
    const timer = setTimeout(() => {
      console.warn(`layout on import took over ${LAYOUT_TIMEOUT_MS} ms; the harness is stored without positions`);
      stopLayoutThread();
    }, LAYOUT_TIMEOUT_MS);
    timer.unref();
    pending.set(id, { resolve, timer });
    try {
      const w = thread();
      // Listeners re-reference a worker, so this comes after them: held open while a layout is owed.
      w.ref();
      w.postMessage({ id, doc: { components: doc.components, wires: doc.wires } });
    } catch (error) {
      console.warn(`layout thread could not start: ${(error as Error).message}`);
      settle(id, undefined);
    }
  });
}

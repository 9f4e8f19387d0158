/** Runs layouts in the worker (created on first use) and answers promises. */
import type { Positions } from './geometry';
import type { LayoutRequest } from './layout';
import type { LayoutAnswer, LayoutMessage } from './layout.worker';

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, { resolve: (v: LayoutResult) => void; reject: (e: Error) => void }>();

export interface LayoutResult {
  positions: Positions;
  /** The worker's time for this layout. */
  ms: number;
  /** The worker's warm-up run, when it had one. */
  warmMs: number | null;
}

function getWorker(): Worker {
  if (worker) return worker;
  worker = new Worker(new URL('./layout.worker.ts', import.meta.url), { type: 'module' });
  worker.onmessage = (event: MessageEvent<LayoutAnswer>) => {
    const a = event.data;
    const p = pending.get(a.requestId);
    if (!p) return;
    pending.delete(a.requestId);
    if (a.ok) p.resolve({ positions: a.positions, ms: a.ms, warmMs: a.warmMs });
    else p.reject(new Error(a.message));
  };
  worker.onerror = (event) => {
    for (const p of pending.values()) p.reject(new Error(event.message || 'The layout worker stopped'));
    pending.clear();
    worker?.terminate();
    worker = null;
  };
  return worker;
}

/** Starts the worker ahead of need (it loads and warms elkjs up while the document is fetched). */
export function prepareLayout(): void {
  if (typeof Worker !== 'undefined') getWorker();
}

/** Lays out the drawing (or just `only`) in the worker. */
export function runLayout(req: LayoutRequest): Promise<LayoutResult> {
  const requestId = nextId++;
  const message: LayoutMessage = { requestId, doc: { components: req.doc.components, wires: req.doc.wires }, only: req.only, positions: req.positions };
  return new Promise((resolve, reject) => {
    pending.set(requestId, { resolve, reject });
    getWorker().postMessage(message);
  });
}

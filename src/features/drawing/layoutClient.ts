/** Runs layouts in the worker (created on first use) and answers promises. */
import type { Positions } from '@shared/drawing/geometry';
import type { LayoutRequest } from '@shared/drawing/layout';
import type { LayoutAnswer, LayoutMessage } from './layout.worker';
import { workerCalls } from './workerCalls';

export interface LayoutResult {
  positions: Positions;
  /** The worker's time for this layout. */
  ms: number;
  /** The worker's warm-up run, when it had one. */
  warmMs: number | null;
}

const layoutWorker = workerCalls<LayoutMessage, LayoutAnswer>(() => new Worker(new URL('./layout.worker.ts', import.meta.url), { type: 'module' }), 'layout');

/** Starts the worker ahead of need: it loads elkjs and warms it up, on `doc` when given (see layout.worker). */
export function prepareLayout(doc: LayoutRequest['doc'] = { components: [], wires: [] }): void {
  const started = performance.now();
  layoutWorker
    .call({ warmUp: true, doc: { components: doc.components, wires: doc.wires } })
    // For the speed bench: when the warm-up was over, and how long it took in the worker.
    .then((a) => performance.measure('ww-layout-warm-up', { start: started, detail: { workerMs: a.ok ? a.warmMs : null, components: doc.components.length } }))
    .catch(() => undefined);
}

/** Lays out the drawing (or just `only`) in the worker. */
export async function runLayout(req: LayoutRequest): Promise<LayoutResult> {
  const a = await layoutWorker.call({ doc: { components: req.doc.components, wires: req.doc.wires }, only: req.only, positions: req.positions });
  if (!a.ok) throw new Error(a.message);
  return { positions: a.positions, ms: a.ms, warmMs: a.warmMs };
}

/** Runs layouts in the worker (created on first use) and answers promises. */
import type { Positions } from '@shared/drawing/geometry';
import type { LayoutRequest } from '@shared/drawing/layout';
import type { LayoutAnswer, LayoutMessage } from './layout.worker';
import { WARM_UP_STEPS } from './layoutWarmUp';
import { workerCalls } from './workerCalls';

export interface LayoutResult {
  positions: Positions;
  /** The worker's time for this layout. */
  ms: number;
  /** The worker's warm-up run, when it had one. */
  warmMs: number | null;
}

const layoutWorker = workerCalls<LayoutMessage, LayoutAnswer>(() => new Worker(new URL('./layout.worker.ts', import.meta.url), { type: 'module' }), 'layout');

/** A layout was asked for: the worker is warm, or about to be (no more warm-up runs are sent). */
let layoutAsked = false;

/** Starts the worker ahead of a layout that is coming: it loads elkjs and warms it up in one go (see layout.worker). */
export function prepareLayout(): void {
  const started = performance.now();
  layoutWorker
    .call({ warmUp: true, doc: { components: [], wires: [] } })
    // For the speed bench: when the warm-up was over, and how long it took in the worker.
    .then((a) => performance.measure('ww-layout-warm-up', { start: started, detail: { workerMs: a.ok ? a.warmMs : null, runs: null } }))
    .catch(() => undefined);
}

const INPUT_EVENTS = ['pointermove', 'pointerdown', 'wheel', 'keydown'] as const;

/**
 * Warms the worker up for a later layout while a laid-out drawing is open: no sooner than `afterMs`,
 * then one short run at a time, each sent only once no pointer, wheel or key input came for `quietMs`
 * and the page is idle. A run holds a core for some 50-800 ms, so a pan started meanwhile shares the
 * machine for at most the rest of one run (a whole warm-up in one go is seconds of it). Stops after
 * the runs of WARM_UP_STEPS, when a layout is asked for, or with the cleanup it returns.
 */
export function warmUpWhenIdle(afterMs: number, quietMs: number): () => void {
  let lastInput = -Infinity;
  let timer = 0;
  let stopped = false;
  let runs = 0;
  let workerMs = 0;
  const started = performance.now();
  const onInput = () => {
    lastInput = performance.now();
  };
  const stop = () => {
    stopped = true;
    window.clearTimeout(timer);
    for (const e of INPUT_EVENTS) window.removeEventListener(e, onInput, true);
  };
  const send = () => {
    if (stopped || layoutAsked) return stop();
    // Input may have come while this waited for an idle moment.
    if (performance.now() - lastInput < quietMs) return next();
    const sentAt = performance.now();
    layoutWorker.call({ warmStep: WARM_UP_STEPS[runs], doc: { components: [], wires: [] } }).then(
      (a) => {
        if (!a.ok) return stop();
        // For the speed bench: when each run was (it holds a core meanwhile).
        performance.measure('ww-layout-warm-step', { start: sentAt, detail: { workerMs: a.ms } });
        runs++;
        workerMs += a.ms;
        if (runs < WARM_UP_STEPS.length) return next();
        // For the speed bench: when the warm-up was over, and its runs' time in the worker.
        performance.measure('ww-layout-warm-up', { start: started, detail: { workerMs, runs } });
        stop();
      },
      stop,
    );
  };
  function next() {
    if (stopped || layoutAsked) return stop();
    const wait = lastInput + quietMs - performance.now();
    if (wait > 0) timer = window.setTimeout(next, wait);
    else requestIdleCallback(send, { timeout: 1000 });
  }
  for (const e of INPUT_EVENTS) window.addEventListener(e, onInput, { capture: true, passive: true });
  timer = window.setTimeout(next, afterMs);
  return stop;
}

/** Lays out the drawing (or just `only`) in the worker. */
export async function runLayout(req: LayoutRequest): Promise<LayoutResult> {
  layoutAsked = true;
  const a = await layoutWorker.call({ doc: { components: req.doc.components, wires: req.doc.wires }, only: req.only, positions: req.positions });
  if (!a.ok) throw new Error(a.message);
  return { positions: a.positions, ms: a.ms, warmMs: a.warmMs };
}

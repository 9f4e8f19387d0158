/// <reference lib="webworker" />
/**
 * The drawing's layout, off the main thread: elkjs (the bundled build, run
 * inside this worker) lays out the graph built by layout.ts.
 *
 * elkjs is a large compiled program and its first runs pay for compiling the
 * code they use, so the worker warms up on a small made-up harness before a
 * layout is asked for: all at once while the page fetches a document that has
 * to be laid out (prepareLayout), or one short run per message while a laid-out
 * drawing is open, each sent only while the lead has paused (warmUpWhenIdle).
 * A run takes a core for itself; on a two-core machine a long one under a pan
 * is felt, so no run is the drawing itself.
 */
import ELK from 'elkjs/lib/elk.bundled.js';
import { buildGraph, layOutDrawing, type LayoutRequest } from '@shared/drawing/layout';
import { WARM_RUNS, warmUpDocument } from './layoutWarmUp';

export interface LayoutMessage extends LayoutRequest {
  requestId: number;
  /** Only warm elkjs up, in one go (answered once the warm-up is over); `doc` is not used. */
  warmUp?: boolean;
  /** Only one warm-up run, on the made-up harness of this many circuits (answered with its time). */
  warmStep?: number;
}

export type LayoutAnswer =
  | { requestId: number; ok: true; positions: Record<string, { x: number; y: number }>; ms: number; warmMs: number | null }
  | { requestId: number; ok: false; message: string };

const elk = new ELK();
const scope = self as unknown as DedicatedWorkerGlobalScope;

/** Set by the first real request: the warm-up stops at the end of its current run. */
let wanted = false;
let warmUp: Promise<number | null> | null = null;

// Started by the page's first message, not when this script loads: a layout asked for while the
// script was still loading is held by the browser until the worker's first task is done, and it
// would wait behind the whole warm-up; asked for after the warm-up message, it stops it after one run.
function startWarmUp(): Promise<number | null> {
  return (warmUp ??= (async () => {
    const started = performance.now();
    try {
      // A few runs while nothing waits: the engine compiles the hot paths once they have run often enough.
      let runs = 0;
      do {
        await warmUpRun();
        runs++;
      } while (!wanted && runs < WARM_RUNS && performance.now() - started < 1500);
      return Math.round(performance.now() - started);
    } catch {
      return null;
    }
  })());
}

const warmUpGraphs = new Map<number, ReturnType<typeof buildGraph>['graph']>();
/** One layout of the made-up harness (elkjs lays out a copy: it writes into the graph it is given). */
async function warmUpRun(circuits = 12): Promise<void> {
  let graph = warmUpGraphs.get(circuits);
  if (!graph) warmUpGraphs.set(circuits, (graph = buildGraph({ doc: warmUpDocument(circuits) }).graph));
  await elk.layout(structuredClone(graph));
}

// The bundled elkjs claims `self.onmessage` when loaded in a worker; this worker answers its own messages.
scope.onmessage = async (event: MessageEvent<LayoutMessage>) => {
  const req = event.data;
  if (req.warmStep !== undefined) {
    const started = performance.now();
    try {
      await warmUpRun(req.warmStep);
      scope.postMessage({ requestId: req.requestId, ok: true, positions: {}, ms: Math.round(performance.now() - started), warmMs: null } satisfies LayoutAnswer);
    } catch (error) {
      scope.postMessage({ requestId: req.requestId, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies LayoutAnswer);
    }
    return;
  }
  if (req.warmUp) {
    const warmMs = await startWarmUp();
    scope.postMessage({ requestId: req.requestId, ok: true, positions: {}, ms: 0, warmMs } satisfies LayoutAnswer);
    return;
  }
  wanted = true;
  // `ms` is this layout's own time; a request that came during the warm-up waits for its current run (the round trip shows that).
  const warmMs = warmUp ? await warmUp : null;
  const started = performance.now();
  try {
    const positions = await layOutDrawing(elk, req);
    const answer: LayoutAnswer = { requestId: req.requestId, ok: true, positions, ms: Math.round(performance.now() - started), warmMs };
    scope.postMessage(answer);
  } catch (error) {
    const answer: LayoutAnswer = { requestId: req.requestId, ok: false, message: error instanceof Error ? error.message : String(error) };
    scope.postMessage(answer);
  }
};

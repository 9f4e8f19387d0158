/// <reference lib="webworker" />
/**
 * The drawing's layout, off the main thread: elkjs (the bundled build, run
 * inside this worker) lays out the graph built by layout.ts.
 *
 * Asked to warm up (prepareLayout), the worker lays out a small made-up
 * harness a few times, or once the drawing itself when it is given: elkjs is a
 * large compiled program and its first runs pay for compiling the code they use
 * (and a big drawing takes other paths than a small one). Those runs happen
 * while the page fetches the document or after the drawing is shown, not while
 * the lead waits.
 */
import ELK from 'elkjs/lib/elk.bundled.js';
import type { HarnessDocument } from '@shared/harness';
import { buildGraph, layOutDrawing, type LayoutRequest } from '@shared/drawing/layout';

export interface LayoutMessage extends LayoutRequest {
  requestId: number;
  /** Only warm elkjs up (answered once the warm-up is over), on `doc` when it has components. */
  warmUp?: boolean;
}

export type LayoutAnswer =
  | { requestId: number; ok: true; positions: Record<string, { x: number; y: number }>; ms: number; warmMs: number | null }
  | { requestId: number; ok: false; message: string };

const elk = new ELK();
const WARM_RUNS = 20;
/** Runs on the drawing itself: the engine optimises elkjs's hot paths over the first two or three. */
const OWN_WARM_RUNS = 2;
const scope = self as unknown as DedicatedWorkerGlobalScope;

/** A few circuits with every kind of node the layout treats differently (ports, a mated pair, splices). */
export function warmUpDocument(circuits = 12): Pick<HarnessDocument, 'components' | 'wires'> {
  const components: HarnessDocument['components'] = [
    { id: 'B', kind: 'battery', volts: 12 },
    { id: 'G', kind: 'ground' },
    { id: 'S', kind: 'splice' },
    { id: 'R', kind: 'splice' },
  ];
  const wires: HarnessDocument['wires'] = [];
  const wire = (id: string, from: string, to: string) => wires.push({ id, from, to, size: { mm2: 1 }, lengthM: 1 });
  wire('w0', 'B.+', 'S.S');
  wire('w1', 'B.-', 'G.G');
  wire('w2', 'R.S', 'G.G');
  for (let i = 0; i < circuits; i++) {
    components.push(
      { id: `F${i}`, kind: 'fuse', amps: 10 },
      { id: `A${i}`, kind: 'connector', cavities: ['1', '2', '3'], matesWith: `C${i}` },
      { id: `C${i}`, kind: 'connector', cavities: ['1', '2', '3'] },
      { id: `L${i}`, kind: 'load', ohms: 10 },
    );
    wire(`a${i}`, 'S.S', `F${i}.1`);
    wire(`b${i}`, `F${i}.2`, `A${i}.1`);
    wire(`c${i}`, `C${i}.1`, `L${i}.1`);
    wire(`d${i}`, `L${i}.2`, `C${i}.2`);
    wire(`e${i}`, `A${i}.2`, 'R.S');
  }
  return { components, wires };
}

/** Set by the first real request: the warm-up stops at the end of its current run. */
let wanted = false;
let warmUp: Promise<number | null> | null = null;

// Started by the page's first message, not when this script loads: a layout asked for while the
// script was still loading is held by the browser until the worker's first task is done, and it
// would wait behind the whole warm-up; asked for after the warm-up message, it stops it after one run.
function startWarmUp(doc: LayoutRequest['doc']): Promise<number | null> {
  return (warmUp ??= (async () => {
    const started = performance.now();
    const own = doc.components.length > 0;
    const graph = buildGraph({ doc: own ? doc : warmUpDocument() }).graph;
    try {
      // A few runs while nothing waits: the engine compiles the hot paths once they have run often enough.
      let runs = 0;
      do {
        await elk.layout(structuredClone(graph));
        runs++;
      } while (!wanted && (own ? runs < OWN_WARM_RUNS : runs < WARM_RUNS && performance.now() - started < 1500));
      return Math.round(performance.now() - started);
    } catch {
      return null;
    }
  })());
}

// The bundled elkjs claims `self.onmessage` when loaded in a worker; this worker answers its own messages.
scope.onmessage = async (event: MessageEvent<LayoutMessage>) => {
  const req = event.data;
  if (req.warmUp) {
    const warmMs = await startWarmUp(req.doc);
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

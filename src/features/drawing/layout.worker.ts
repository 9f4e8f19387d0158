/// <reference lib="webworker" />
/**
 * The drawing's layout, off the main thread: elkjs (the bundled build, run
 * inside this worker) lays out the graph built by layout.ts.
 */
import ELK from 'elkjs/lib/elk.bundled.js';
import { buildGraph, positionsFromGraph, type LayoutRequest } from './layout';

export interface LayoutMessage extends LayoutRequest {
  requestId: number;
}

export type LayoutAnswer =
  | { requestId: number; ok: true; positions: Record<string, { x: number; y: number }>; ms: number }
  | { requestId: number; ok: false; message: string };

const elk = new ELK();
const scope = self as unknown as DedicatedWorkerGlobalScope;

// The bundled elkjs claims `self.onmessage` when loaded in a worker; this worker answers its own messages.
scope.onmessage = async (event: MessageEvent<LayoutMessage>) => {
  const req = event.data;
  const started = performance.now();
  try {
    const built = buildGraph(req);
    const laid = await elk.layout(built.graph);
    const positions = positionsFromGraph(laid, built, req);
    const answer: LayoutAnswer = { requestId: req.requestId, ok: true, positions, ms: Math.round(performance.now() - started) };
    scope.postMessage(answer);
  } catch (error) {
    const answer: LayoutAnswer = { requestId: req.requestId, ok: false, message: error instanceof Error ? error.message : String(error) };
    scope.postMessage(answer);
  }
};

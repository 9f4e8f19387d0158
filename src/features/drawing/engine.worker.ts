/// <reference lib="webworker" />
/**
 * The shared engine, off the main thread: expected volts of every pin in a
 * state, and the walk between two pins, recomputed as the drawing changes.
 */
import type { HarnessDocument } from '@shared/harness';
import { readings, walk, type WalkPath } from '@shared/engine';

export type EngineRequest =
  | { requestId: number; type: 'readings'; doc: HarnessDocument; state: string }
  | { requestId: number; type: 'walk'; doc: HarnessDocument; from: string; to: string; state?: string };

export type EngineAnswer =
  | { requestId: number; ok: true; type: 'readings'; volts: Array<[string, number | null]>; unsettled: boolean }
  | { requestId: number; ok: true; type: 'walk'; paths: WalkPath[] }
  | { requestId: number; ok: false; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

function answer(req: EngineRequest): EngineAnswer {
  if (req.type === 'readings') {
    const result = readings(req.doc, req.state);
    if (!result) throw new Error(`There is no state ${req.state} in this drawing.`);
    return { requestId: req.requestId, ok: true, type: 'readings', volts: result.pins.map((p) => [p.ref, p.volts]), unsettled: result.status === 'unsettled' };
  }
  return { requestId: req.requestId, ok: true, type: 'walk', paths: walk(req.doc, req.from, req.to, req.state).paths };
}

scope.onmessage = (event: MessageEvent<EngineRequest>) => {
  const req = event.data;
  try {
    scope.postMessage(answer(req));
  } catch (error) {
    scope.postMessage({ requestId: req.requestId, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies EngineAnswer);
  }
};

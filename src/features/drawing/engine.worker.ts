/// <reference lib="webworker" />
/**
 * The shared engine, off the main thread: expected volts of every pin in a
 * state, and the walk between two pins, recomputed as the drawing changes.
 */
import type { HarnessDocument } from '@shared/harness';

export type EngineRequest =
  | { requestId: number; type: 'readings'; doc: HarnessDocument; state: string }
  | { requestId: number; type: 'walk'; doc: HarnessDocument; from: string; to: string; state?: string };

export type EngineAnswer =
  | { requestId: number; ok: true; type: 'readings'; volts: Array<[string, number | null]>; unsettled?: boolean }
  | { requestId: number; ok: true; type: 'walk'; paths: WalkPath[] }
  | { requestId: number; ok: false; message: string };

export interface WalkStep {
  [key: string]: unknown;
}
export interface WalkPath {
  steps: WalkStep[];
  [key: string]: unknown;
}

interface EngineModule {
  readings: (doc: HarnessDocument, state: string) => unknown;
  walk: (doc: HarnessDocument, from: string, to: string, state?: string) => unknown;
}

// The engine module is looked up at build time; the worker says so plainly if it is not there.
const modules = import.meta.glob<EngineModule>('../../../shared/engine/index.ts');
let engine: Promise<EngineModule | null> | null = null;
const load = () => (engine ??= (Object.values(modules)[0]?.() ?? Promise.resolve(null)));

const scope = self as unknown as DedicatedWorkerGlobalScope;

function pinsOf(result: unknown): Array<[string, number | null]> {
  const r = result as { pins?: Array<{ ref: string; volts: number | null }> } | Array<{ ref: string; volts: number | null }> | Map<string, number | null>;
  if (r instanceof Map) return [...r.entries()];
  const list = Array.isArray(r) ? r : r?.pins ?? [];
  return list.map((p) => [p.ref, p.volts ?? null]);
}

scope.onmessage = async (event: MessageEvent<EngineRequest>) => {
  const req = event.data;
  try {
    const mod = await load();
    if (!mod) throw new Error('The engine is not part of this build yet.');
    if (req.type === 'readings') {
      const result = mod.readings(req.doc, req.state);
      if (!result) throw new Error(`There is no state ${req.state} in this drawing.`);
      const r = result as { unsettled?: boolean; status?: string };
      const unsettled = !!r.unsettled || r.status === 'unsettled';
      scope.postMessage({ requestId: req.requestId, ok: true, type: 'readings', volts: pinsOf(result), unsettled } satisfies EngineAnswer);
    } else {
      const result = mod.walk(req.doc, req.from, req.to, req.state) as { paths?: WalkPath[] } | WalkPath[];
      const paths = Array.isArray(result) ? result : result?.paths ?? [];
      scope.postMessage({ requestId: req.requestId, ok: true, type: 'walk', paths } satisfies EngineAnswer);
    }
  } catch (error) {
    scope.postMessage({ requestId: req.requestId, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies EngineAnswer);
  }
};

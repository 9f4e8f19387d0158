/** Talks to the engine worker (created on first use). */
import type { HarnessDocument } from '@shared/harness';
import type { EngineAnswer, EngineRequest, WalkPath } from './engine.worker';

export type { WalkPath, WalkStep } from './engine.worker';

let worker: Worker | null = null;
let next = 1;
const pending = new Map<number, (a: EngineAnswer) => void>();

function getWorker() {
  if (worker) return worker;
  worker = new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module' });
  worker.onmessage = (e: MessageEvent<EngineAnswer>) => {
    const done = pending.get(e.data.requestId);
    pending.delete(e.data.requestId);
    done?.(e.data);
  };
  return worker;
}

type Distribute<T> = T extends unknown ? Omit<T, 'requestId'> : never;

function ask(req: Distribute<EngineRequest>): Promise<EngineAnswer> {
  const requestId = next++;
  return new Promise((resolve) => {
    pending.set(requestId, resolve);
    getWorker().postMessage({ ...req, requestId });
  });
}

export async function engineReadings(doc: HarnessDocument, state: string): Promise<{ volts: Map<string, number | null>; unsettled: boolean }> {
  const a = await ask({ type: 'readings', doc, state });
  if (!a.ok) throw new Error(a.message);
  if (a.type !== 'readings') throw new Error('Unexpected answer');
  return { volts: new Map(a.volts), unsettled: !!a.unsettled };
}

export async function engineWalk(doc: HarnessDocument, from: string, to: string, state?: string): Promise<WalkPath[]> {
  const a = await ask({ type: 'walk', doc, from, to, state });
  if (!a.ok) throw new Error(a.message);
  if (a.type !== 'walk') throw new Error('Unexpected answer');
  return a.paths;
}

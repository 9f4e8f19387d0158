/** Talks to the engine worker (created on first use). */
import type { HarnessDocument } from '@shared/harness';
import type { WalkPath } from '@shared/engine';
import type { EngineAnswer, EngineRequest } from './engine.worker';
import { workerCalls } from './workerCalls';

export type { WalkPath, WalkStep } from '@shared/engine';

const engine = workerCalls<EngineRequest, EngineAnswer>(() => new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module' }), 'engine');

export async function engineReadings(doc: HarnessDocument, state: string): Promise<{ volts: Map<string, number | null>; unsettled: boolean }> {
  const a = await engine.call({ type: 'readings', doc, state });
  if (!a.ok) throw new Error(a.message);
  if (a.type !== 'readings') throw new Error('Unexpected answer');
  return { volts: new Map(a.volts), unsettled: a.unsettled };
}

export async function engineWalk(doc: HarnessDocument, from: string, to: string, state?: string): Promise<WalkPath[]> {
  const a = await engine.call({ type: 'walk', doc, from, to, state });
  if (!a.ok) throw new Error(a.message);
  if (a.type !== 'walk') throw new Error('Unexpected answer');
  return a.paths;
}

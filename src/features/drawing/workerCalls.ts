/**
 * Calls into a worker that answers every message with one carrying the same
 * `requestId`: each call is a promise. The worker starts on first use; if it
 * dies, every call waiting on it fails and the next call starts a new one.
 */
type WithoutId<T> = T extends unknown ? Omit<T, 'requestId'> : never;

export interface WorkerCalls<Request extends { requestId: number }, Answer extends { requestId: number }> {
  call(request: WithoutId<Request>, transfer?: Transferable[]): Promise<Answer>;
}

export function workerCalls<Request extends { requestId: number }, Answer extends { requestId: number }>(create: () => Worker, name: string): WorkerCalls<Request, Answer> {
  let worker: Worker | null = null;
  let next = 1;
  const pending = new Map<number, { resolve: (a: Answer) => void; reject: (e: Error) => void }>();
  const get = (): Worker => {
    if (worker) return worker;
    const w = create();
    w.onmessage = (event: MessageEvent<Answer>) => {
      const p = pending.get(event.data.requestId);
      pending.delete(event.data.requestId);
      p?.resolve(event.data);
    };
    w.onerror = (event) => {
      for (const p of pending.values()) p.reject(new Error(event.message || `The ${name} worker stopped`));
      pending.clear();
      w.terminate();
      if (worker === w) worker = null;
    };
    worker = w;
    return w;
  };
  return {
    call(request, transfer = []) {
      const requestId = next++;
      return new Promise<Answer>((resolve, reject) => {
        pending.set(requestId, { resolve, reject });
        get().postMessage({ ...request, requestId }, transfer);
      });
    },
  };
}

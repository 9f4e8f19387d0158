import { beforeEach, vi } from 'vitest';

/** jsdom has no ResizeObserver and xyflow needs one: each test of the calling file gets one that never reports. */
export function stubResizeObserverEachTest(): void {
  beforeEach(() => {
    class RO {
      observe() {}
      unobserve() {}
      disconnect() {}
    }
    vi.stubGlobal('ResizeObserver', RO);
  });
}

/**
 * Sizes work done a batch a frame (nodes coming back after the overview, wires after them) by what a
 * batch really cost: from the start of the frame's animation callback to the end of that frame's
 * rendering (React's commit, style, layout, paint and xyflow's measuring in its resize observer all
 * run in that one task). The next batch is as big as fits the budget at the cost per item measured
 * last (and at most twice the last), so a slow machine, or code the browser has not compiled yet, gets smaller batches rather
 * than long tasks.
 */
export interface FrameBatches {
  /** How many items the next batch may take. */
  size(): number;
  /**
   * Call from the animation-frame callback that is about to do a batch of `items`, with the
   * callback's start time: the frame's cost is taken once its rendering is over.
   */
  measure(items: number, startedAt: number): void;
}

export function frameBatches(budgetMs: number, first: number, max: number): FrameBatches {
  let size = first;
  return {
    size: () => size,
    measure(items, startedAt) {
      if (items <= 0) return;
      // A message posted now runs as the next task, after the rendering of this frame.
      const channel = new MessageChannel();
      channel.port1.onmessage = () => {
        channel.port1.close();
        const perItem = Math.max(0.01, (performance.now() - startedAt) / items);
        // Grown at most twice over a frame: one quick frame may have been luck.
        size = Math.max(1, Math.min(max, size * 2, Math.floor(budgetMs / perItem)));
      };
      channel.port2.postMessage(null);
    },
  };
}

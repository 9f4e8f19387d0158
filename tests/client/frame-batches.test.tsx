import { describe, expect, it } from 'vitest';
import { frameBatches } from '@/features/drawing/frameBatches';

/** The frame's cost is read by a message that runs after it: wait for that. */
const afterFrame = () => new Promise<void>((r) => setTimeout(r, 20));

describe('batches sized by what a frame cost', () => {
  it('starts at the first size and sizes the next batch to the budget at the measured cost per item', async () => {
    const b = frameBatches(25, 8, 32);
    expect(b.size()).toBe(8);
    // 8 items in a frame of 40 ms or more: 5 ms each or more, so 5 fit in 25 ms (fewer if the test ran slow).
    b.measure(8, performance.now() - 40);
    await afterFrame();
    expect(b.size()).toBeLessThanOrEqual(5);
    expect(b.size()).toBeGreaterThanOrEqual(1);
  });

  it('never goes below one item, however slow', async () => {
    const b = frameBatches(25, 8, 32);
    b.measure(2, performance.now() - 500);
    await afterFrame();
    expect(b.size()).toBe(1);
  });

  it('grows at most twice over a frame, and never past the most', async () => {
    // A budget no test machine's frame comes near: only the growth rule and the most bind.
    const b = frameBatches(1000, 2, 6);
    b.measure(2, performance.now());
    await afterFrame();
    expect(b.size()).toBe(4);
    b.measure(4, performance.now());
    await afterFrame();
    expect(b.size()).toBe(6);
  });

  it('takes nothing from an empty batch', async () => {
    const b = frameBatches(25, 3, 32);
    b.measure(0, performance.now() - 1000);
    await afterFrame();
    expect(b.size()).toBe(3);
  });
});

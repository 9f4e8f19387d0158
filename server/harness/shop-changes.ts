/**
 * A per-shop count of changes to its harness list on this app instance: harnesses imported,
 * renamed, filed under a model or deleted; drafts started, saved, published or discarded; models
 * renamed or deleted. Every such write calls `harnessesChanged(shopId)` after its transaction
 * commits, and the small read caches below (which revision ids a shop has, what a search covers)
 * drop what they kept for the shop.
 *
 * The trade-off, and its bound: another app instance does not hear of the change, so its
 * entries also end after `SHOP_CACHE_MS` (2 s). There, for at most that long, a search may not
 * yet cover a draft saved or a harness published elsewhere, and a deleted harness's published
 * readings may still be read by its own shop. Never another shop's data: entries are per shop.
 */
export const SHOP_CACHE_MS = 2000;

const generations = new Map<string, number>();

export function harnessesChanged(shopId: string): void {
  generations.set(shopId, (generations.get(shopId) ?? 0) + 1);
}

/** Take this before reading from the database; an entry stored with it is void after a change. */
export function shopGeneration(shopId: string): number {
  return generations.get(shopId) ?? 0;
}

/**
 * Bounded, per-shop, short-lived: what a read computed from rows that `harnessesChanged` covers.
 * `capacity` bounds memory; the oldest entries go first.
 */
export class ShopCache<V> {
  private readonly entries = new Map<string, { shopId: string; value: V; generation: number; until: number }>();

  constructor(
    readonly capacity: number,
    readonly ttlMs = SHOP_CACHE_MS,
    private readonly now: () => number = Date.now,
  ) {}

  get(key: string): V | undefined {
    const e = this.entries.get(key);
    if (!e) return undefined;
    if (e.until <= this.now() || e.generation !== shopGeneration(e.shopId)) {
      this.entries.delete(key);
      return undefined;
    }
    return e.value;
  }

  /** `generation` is `shopGeneration(shopId)` as it was before the read that made `value`. */
  set(key: string, shopId: string, value: V, generation: number): void {
    if (this.ttlMs <= 0 || generation !== shopGeneration(shopId)) return;
    this.entries.delete(key);
    this.entries.set(key, { shopId, value, generation, until: this.now() + this.ttlMs });
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next();
      if (oldest.done) break;
      this.entries.delete(oldest.value);
    }
  }

  get size(): number {
    return this.entries.size;
  }
}

import { count } from 'drizzle-orm';
import type { AppDeps } from '../server/deps';
import type { Db } from '../server/db/client';
import { shops } from '../server/db/schema';
import { demoShop, seedShop, type SeededShop } from './shop';
import { seedLibrary } from '../server/harness/seed';
import { seedOrders } from './orders';

export { DEMO_PASSWORD, demoShop, seedShop } from './shop';
export type { SeededShop, SeededUser, ShopSpec } from './shop';

/** What the demo seed made; later seeders receive it (the shop id, the people by role). */
export type DemoSeed = SeededShop;

export interface SeedOptions {
  /** 'accounts': the shop and its four people only (fast, for tests); 'full' (default): everything. */
  demo?: 'accounts' | 'full';
}

/**
 * The invented demo shop. npm start calls it on an empty database only.
 * Other areas add one line each below, e.g. `await seedHarnesses(deps, seed);`.
 */
export async function seedDemo(deps: Pick<AppDeps, 'db' | 'config' | 'storage'>, options: SeedOptions = {}): Promise<DemoSeed> {
  const seed = await seedShop(deps, demoShop);
  if ((options.demo ?? 'full') === 'full') {
    // Area seeders, one line each:
    const library = await seedLibrary(deps, seed);
    await seedOrders(deps, seed, library);
  }
  return seed;
}

/** true when the database has no shop yet (a fresh install). */
export async function databaseIsEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: count() }).from(shops);
  return Number(row?.n ?? 0) === 0;
}

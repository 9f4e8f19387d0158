import type { ReadingSetView } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { readingSetViews } from '../readings/service';

/** The reading sets taken on an order, for the order page, the report and the customer view. */
export async function loadReadingSets(deps: Pick<AppDeps, 'db'>, shopId: string, orderId: string): Promise<ReadingSetView[]> {
  const sets = await readingSetViews(deps.db, shopId, { repairOrderId: orderId });
  return sets.map((s) => ({ ...s, readings: s.readings as ReadingSetView['readings'], suspects: s.suspects as ReadingSetView['suspects'] }));
}

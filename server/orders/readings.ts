import type { ReadingSetView } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { readingSetViews } from '../readings/service';

/** The reading sets taken on an order, as the readings API answers them (marks and suspects as saved). */
export async function loadReadingSets(deps: Pick<AppDeps, 'db'>, shopId: string, orderId: string): Promise<ReadingSetView[]> {
  const sets = await readingSetViews(deps.db, shopId, { repairOrderId: orderId });
  // Oldest first in the report, the way the job went.
  return (sets as unknown as ReadingSetView[]).slice().reverse();
}

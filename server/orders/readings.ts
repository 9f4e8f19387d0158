import type { ReadingSetView } from '../../shared/api/orders';
import type { AppDeps } from '../deps';

/**
 * The reading sets taken on an order, for the report and the customer view. The readings
 * area owns the table; this reads it through its documented shape once it is there.
 */
export async function loadReadingSets(deps: Pick<AppDeps, 'pool'>, shopId: string, orderId: string): Promise<ReadingSetView[]> {
  void deps;
  void shopId;
  void orderId;
  return [];
}

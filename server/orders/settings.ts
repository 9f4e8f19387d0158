import { randomBytes } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import type { OrderSettings } from '../../shared/api/orders';
import type { DbOrTx } from '../harness/store';
import { orderSettings } from '../db/schema/orders';

export type { DbOrTx };

/** Makes the shop's settings row when it is not there yet (INSERT IGNORE: safe when two race). */
export async function ensureSettings(db: DbOrTx, shopId: string): Promise<void> {
  await db
    .insert(orderSettings)
    .ignore()
    .values({ shopId, linkKey: randomBytes(32).toString('hex'), updatedAt: new Date() });
}

export async function loadSettingsRow(db: DbOrTx, shopId: string) {
  let [row] = await db.select().from(orderSettings).where(eq(orderSettings.shopId, shopId)).limit(1);
  if (!row) {
    await ensureSettings(db, shopId);
    [row] = await db.select().from(orderSettings).where(eq(orderSettings.shopId, shopId)).limit(1);
  }
  return row;
}

export async function getSettings(db: DbOrTx, shopId: string): Promise<OrderSettings> {
  const row = await loadSettingsRow(db, shopId);
  return { stalledDiagnosisHours: row.stalledDiagnosisHours, stalledDays: row.stalledDays ?? null, linkDays: row.linkDays };
}

/** The next repair-order number of the shop; call inside the transaction that inserts the order. */
export async function nextOrderNumber(tx: DbOrTx, shopId: string): Promise<number> {
  await ensureSettings(tx, shopId);
  await tx
    .update(orderSettings)
    .set({ lastOrderNumber: sql`${orderSettings.lastOrderNumber} + 1` })
    .where(eq(orderSettings.shopId, shopId));
  const [row] = await tx.select({ n: orderSettings.lastOrderNumber }).from(orderSettings).where(eq(orderSettings.shopId, shopId)).limit(1);
  return row.n;
}

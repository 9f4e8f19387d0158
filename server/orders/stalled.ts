import { and, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import { memberships, users } from '../db/schema/auth';
import { customers, repairOrders } from '../db/schema/orders';
import { orderStatusLabels } from '../../shared/api/orders';
import { defaultOrderSettings } from '../../shared/api/orders';

/**
 * Stalled orders: still open or diagnosing past the shop's diagnosis hours (or days since
 * opened). Each gets one e-mail to the shop's leads (to the owners where there is no lead).
 *
 * Safe with several app instances: an instance claims an order with one UPDATE that sets
 * `stalled_notified_at` only where it is still NULL and the order is still stalled; only the
 * instance whose UPDATE changed the row sends. A failed send clears the claim, so a later
 * round tries again.
 */
const stalledSql = sql`(
  ${repairOrders.status} in ('open', 'diagnosing')
  and (
    (select coalesce(sum(te.minutes), 0) from time_entries te where te.order_id = ${repairOrders.id} and te.kind = 'diagnosis')
      >= coalesce((select s.stalled_diagnosis_hours from order_settings s where s.shop_id = ${repairOrders.shopId}), ${defaultOrderSettings.stalledDiagnosisHours}) * 60
    or ${repairOrders.openedAt} <= date_sub(utc_timestamp(3), interval coalesce((select s2.stalled_days from order_settings s2 where s2.shop_id = ${repairOrders.shopId}), 100000) day)
  )
)`;

export interface StalledRound {
  claimed: number;
  sent: number;
  failed: number;
}

export async function runStalledCheck(deps: Pick<AppDeps, 'db' | 'mailer' | 'config'>, limit = 50): Promise<StalledRound> {
  const { db } = deps;
  const candidates = await db
    .select({ id: repairOrders.id, shopId: repairOrders.shopId, number: repairOrders.number, status: repairOrders.status, complaint: repairOrders.complaint, customer: customers.name, techId: repairOrders.assignedTechId })
    .from(repairOrders)
    .innerJoin(customers, eq(customers.id, repairOrders.customerId))
    .where(and(isNull(repairOrders.stalledNotifiedAt), stalledSql))
    .limit(limit);
  const round: StalledRound = { claimed: 0, sent: 0, failed: 0 };
  for (const c of candidates) {
    const claimedAt = new Date();
    const [result] = await db
      .update(repairOrders)
      .set({ stalledNotifiedAt: claimedAt })
      .where(and(eq(repairOrders.id, c.id), isNull(repairOrders.stalledNotifiedAt), stalledSql));
    if (result.affectedRows !== 1) continue;
    round.claimed += 1;
    try {
      const people = await db
        .select({ email: users.email, name: users.name, role: memberships.role, id: users.id })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.shopId, c.shopId), inArray(memberships.role, ['lead', 'owner'])));
      const leads = people.filter((p) => p.role === 'lead');
      const to = (leads.length ? leads : people).map((p) => p.email);
      if (!to.length) continue;
      const [minutes] = await db.execute(sql`select coalesce(sum(minutes), 0) as m from time_entries where order_id = ${c.id} and kind = 'diagnosis'`);
      const diag = Number((minutes as unknown as { m: string }[])[0]?.m ?? 0);
      const tech = c.techId ? people.find((p) => p.id === c.techId)?.name : undefined;
      const [techRow] = c.techId && !tech ? await db.select({ name: users.name }).from(users).where(eq(users.id, c.techId)).limit(1) : [];
      const url = `${deps.config.publicUrl}/repair-orders/${c.id}`;
      await deps.mailer.send({
        to: to.join(', '),
        subject: `Order ${c.number} is stalled: ${(diag / 60).toFixed(1)} h of diagnosis`,
        text: [
          `Repair order ${c.number} for ${c.customer} is still ${orderStatusLabels[c.status].toLowerCase()} with ${(diag / 60).toFixed(1)} h of diagnosis logged.`,
          `Technician: ${tech ?? techRow?.name ?? 'not assigned'}.`,
          `Complaint: ${c.complaint}`,
          '',
          'A second pair of eyes now costs less than more hours on the bill. Open the order:',
          url,
          '',
          'Wirewalk sends this once per order.',
        ].join('\n'),
        shopId: c.shopId,
      });
      round.sent += 1;
    } catch (err) {
      round.failed += 1;
      console.error(`[stalled] order ${c.number}: the e-mail failed, will try again:`, err instanceof Error ? err.message : err);
      await db.update(repairOrders).set({ stalledNotifiedAt: null }).where(and(eq(repairOrders.id, c.id), eq(repairOrders.stalledNotifiedAt, claimedAt)));
    }
  }
  return round;
}

/** Runs the check every `intervalMs` (unref'd: never keeps the process alive). Answers stop(). */
export function startStalledChecks(deps: Pick<AppDeps, 'db' | 'mailer' | 'config'>, intervalMs = 5 * 60_000): () => void {
  let running = false;
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      await runStalledCheck(deps);
    } catch (err) {
      console.error('[stalled] the check failed:', err instanceof Error ? err.message : err);
    } finally {
      running = false;
    }
  };
  const first = setTimeout(tick, Math.min(intervalMs, 30_000));
  const timer = setInterval(tick, intervalMs);
  first.unref();
  timer.unref();
  return () => {
    clearTimeout(first);
    clearInterval(timer);
  };
}

import { and, eq } from 'drizzle-orm';
import type { Request } from 'express';
import type { Role } from '../../shared/api/auth';
import { repairOrders } from '../db/schema/orders';
import { HttpError, notFound } from '../errors';
import type { DbOrTx } from './settings';

/** Writers, leads and owners run the desk side of an order: create, edit, assign, send. */
export const deskRoles: Role[] = ['writer', 'lead', 'owner'];
export const isDesk = (role: Role) => deskRoles.includes(role);
/** Leads and owners may do everything a tech does on any order. */
export const isLeadOrOwner = (role: Role) => role === 'lead' || role === 'owner';

export type OrderRow = typeof repairOrders.$inferSelect;

/** The order of the signed-in member's shop, or 404 (another shop's order is "not found"). */
export async function loadOrder(db: DbOrTx, req: Request, orderId: string): Promise<OrderRow> {
  const [order] = await db
    .select()
    .from(repairOrders)
    .where(and(eq(repairOrders.id, orderId), eq(repairOrders.shopId, req.auth.shopId)))
    .limit(1);
  if (!order) throw notFound('The repair order');
  return order;
}

/** May the member add findings (readings, photos, drawings, time, ticks) to this order? */
export function canWorkOn(req: Request, order: OrderRow): boolean {
  const { role, userId } = req.auth;
  if (isLeadOrOwner(role)) return true;
  if (role === 'tech') return order.assignedTechId === userId;
  return false;
}

export function requireWorkOn(req: Request, order: OrderRow, what = 'add findings to'): void {
  if (canWorkOn(req, order)) return;
  if (req.auth.role === 'tech') throw new HttpError(403, 'forbidden', `Order ${order.number} is not assigned to you; ask the lead to assign it before you ${what} it.`);
  throw new HttpError(403, 'forbidden', `Your role does not allow you to ${what} an order; the assigned technician or a lead does.`);
}

export function requireDesk(req: Request, what: string): void {
  if (!isDesk(req.auth.role)) throw new HttpError(403, 'forbidden', `Your role does not allow you to ${what}.`);
}

/** The member may touch either as desk staff or as the order's tech. */
export function requireDeskOrWork(req: Request, order: OrderRow, what: string): void {
  if (isDesk(req.auth.role) || canWorkOn(req, order)) return;
  requireWorkOn(req, order, what);
}

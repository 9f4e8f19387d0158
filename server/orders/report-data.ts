import { and, asc, eq, inArray } from 'drizzle-orm';
import { cautions } from '../../src/components/cautions';
import type { ReadingSetView } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { shops } from '../db/schema/auth';
import { customers, orderAttachments, orderDrawings, orderProcedures, orderProcedureSteps, repairOrders } from '../db/schema/orders';
import { drawingPng } from './markups';
import type { OrderRow } from './access';
import { loadReadingSets } from './readings';
import { buildReportPdf, type ReportInput } from './report-pdf';
import { peopleById, unitsOfOrders } from './views';

/** The cautions every report carries (product.md). */
export const reportCautions = [cautions.disconnectBattery, cautions.blockAttachments, cautions.fuseRating, cautions.arcingFuse, cautions.backProbe, cautions.expectations].map((c) => ({
  title: c.title,
  text: c.text,
}));

export async function loadOrderById(deps: Pick<AppDeps, 'db'>, shopId: string, orderId: string): Promise<OrderRow | null> {
  const [row] = await deps.db.select().from(repairOrders).where(and(eq(repairOrders.id, orderId), eq(repairOrders.shopId, shopId))).limit(1);
  return row ?? null;
}

/** Everything the report shows, read from the database and storage. */
export async function reportInput(deps: Pick<AppDeps, 'db' | 'storage' | 'pool'>, order: OrderRow): Promise<{ input: ReportInput; readingSets: ReadingSetView[] }> {
  const { db } = deps;
  const [[shop], [customer], unitMap, procs, drawings, photos, readingSets] = await Promise.all([
    db.select({ name: shops.name }).from(shops).where(eq(shops.id, order.shopId)).limit(1),
    db.select().from(customers).where(and(eq(customers.id, order.customerId), eq(customers.shopId, order.shopId))).limit(1),
    unitsOfOrders(db, [order.id]),
    db.select().from(orderProcedures).where(eq(orderProcedures.orderId, order.id)).orderBy(asc(orderProcedures.attachedAt)),
    db.select().from(orderDrawings).where(and(eq(orderDrawings.orderId, order.id), eq(orderDrawings.inReport, true))).orderBy(asc(orderDrawings.createdAt)),
    db
      .select()
      .from(orderAttachments)
      .where(and(eq(orderAttachments.orderId, order.id), eq(orderAttachments.inReport, true), eq(orderAttachments.kind, 'photo')))
      .orderBy(asc(orderAttachments.createdAt)),
    loadReadingSets(deps, order.shopId, order.id),
  ]);
  const steps = procs.length
    ? await db.select().from(orderProcedureSteps).where(inArray(orderProcedureSteps.orderProcedureId, procs.map((p) => p.id))).orderBy(asc(orderProcedureSteps.position))
    : [];
  const people = await peopleById(db, [order.assignedTechId, ...steps.map((s) => s.doneBy)]);
  const photoData = (
    await Promise.all(
      photos.map(async (p) => {
        const found = await deps.storage.get(p.storageKey);
        return found ? { caption: p.caption, filename: p.filename, data: found.data } : null;
      }),
    )
  ).filter((p): p is NonNullable<typeof p> => p !== null);
  const input: ReportInput = {
    shopName: shop?.name ?? 'Repair shop',
    number: order.number,
    status: order.status,
    openedAt: order.openedAt,
    customer: { name: customer.name, company: customer.company },
    units: (unitMap.get(order.id) ?? []).map((u) => ({ modelName: u.modelName, serialNumber: u.serialNumber, hourMeter: u.hourMeter })),
    complaint: order.complaint,
    cause: order.cause,
    correction: order.correction,
    customerNotes: order.customerNotes,
    tech: order.assignedTechId ? (people.get(order.assignedTechId)?.name ?? null) : null,
    procedures: procs.map((p) => ({
      title: p.title,
      steps: steps.filter((s) => s.orderProcedureId === p.id).map((s) => ({ text: s.text, doneBy: s.doneBy ? (people.get(s.doneBy)?.name ?? null) : null, doneAt: s.doneAt })),
    })),
    drawings: await Promise.all(
      drawings.map(async (d) => ({ title: d.title, harnessName: d.harnessName, revisionNumber: d.revisionNumber, notes: d.notes, markers: d.markers, png: await drawingPng(d) })),
    ),
    photos: photoData,
    readingSets,
    cautions: reportCautions,
    generatedAt: new Date(),
  };
  return { input, readingSets };
}

export async function orderReportPdf(deps: Pick<AppDeps, 'db' | 'storage' | 'pool'>, order: OrderRow): Promise<Buffer> {
  const { input } = await reportInput(deps, order);
  return buildReportPdf(input);
}

export const reportFilename = (number: number) => `repair-order-${number}-report.pdf`;

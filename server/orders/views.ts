import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Request } from 'express';
import type {
  Attachment,
  Customer,
  CustomerLinkInfo,
  MarkupSummary,
  OrderDetail,
  OrderProcedure,
  OrderSettings,
  PersonRef,
  ReportSend,
  TimeEntry,
  Unit,
} from '../../shared/api/orders';
import { users } from '../db/schema/auth';
import { equipmentModels } from '../db/schema/harness';
import {
  customerLinks,
  customers,
  orderAttachments,
  orderDrawings,
  orderProcedures,
  orderProcedureSteps,
  repairOrderUnits,
  reportSends,
  timeEntries,
  units,
} from '../db/schema/orders';
import { canWorkOn, isDesk, type OrderRow } from './access';
import { getSettings, type DbOrTx } from './settings';

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

export const ACTIVE_STATUSES = ['open', 'diagnosing'] as const;

/** Stalled: still open or diagnosing and past the shop's diagnosis hours (or days since opened). */
export function isStalled(order: Pick<OrderRow, 'status' | 'openedAt'>, diagnosisMinutes: number, settings: OrderSettings, now = new Date()): boolean {
  if (!(ACTIVE_STATUSES as readonly string[]).includes(order.status)) return false;
  if (diagnosisMinutes >= settings.stalledDiagnosisHours * 60) return true;
  if (settings.stalledDays !== null && now.getTime() - order.openedAt.getTime() >= settings.stalledDays * 86_400_000) return true;
  return false;
}

/** Names of members by id (one query). */
export async function peopleById(db: DbOrTx, ids: (string | null | undefined)[]): Promise<Map<string, PersonRef>> {
  const wanted = [...new Set(ids.filter((v): v is string => !!v))];
  if (!wanted.length) return new Map();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r]));
}

export function customerView(row: typeof customers.$inferSelect): Customer {
  return {
    id: row.id,
    name: row.name,
    company: row.company,
    email: row.email,
    phone: row.phone,
    contacts: row.contacts ?? [],
    notes: row.notes,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

type UnitRow = typeof units.$inferSelect & { maker?: string | null; model?: string | null; customerName?: string | null };

export function unitView(row: UnitRow): Unit {
  const modelName = row.maker || row.model ? `${row.maker ?? ''} ${row.model ?? ''}`.trim() : row.description;
  return {
    id: row.id,
    customerId: row.customerId,
    ...(row.customerName ? { customerName: row.customerName } : {}),
    kind: row.kind,
    modelId: row.modelId,
    modelName: modelName ?? null,
    description: row.description,
    serialNumber: row.serialNumber,
    hourMeter: row.hourMeter,
    notes: row.notes,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Units with their library model names. */
export function unitSelect(db: DbOrTx) {
  return db
    .select({ unit: units, maker: equipmentModels.maker, model: equipmentModels.model, customerName: customers.name })
    .from(units)
    .leftJoin(equipmentModels, eq(equipmentModels.id, units.modelId))
    .innerJoin(customers, eq(customers.id, units.customerId));
}

export async function unitsOfOrders(db: DbOrTx, orderIds: string[]): Promise<Map<string, Unit[]>> {
  const map = new Map<string, Unit[]>();
  if (!orderIds.length) return map;
  const rows = await db
    .select({ orderId: repairOrderUnits.orderId, unit: units, maker: equipmentModels.maker, model: equipmentModels.model })
    .from(repairOrderUnits)
    .innerJoin(units, eq(units.id, repairOrderUnits.unitId))
    .leftJoin(equipmentModels, eq(equipmentModels.id, units.modelId))
    .where(inArray(repairOrderUnits.orderId, orderIds))
    .orderBy(asc(repairOrderUnits.position));
  for (const r of rows) {
    const list = map.get(r.orderId) ?? [];
    list.push(unitView({ ...r.unit, maker: r.maker, model: r.model }));
    map.set(r.orderId, list);
  }
  return map;
}

export async function minutesOfOrders(db: DbOrTx, orderIds: string[]): Promise<Map<string, { diagnosis: number; total: number }>> {
  const map = new Map<string, { diagnosis: number; total: number }>();
  if (!orderIds.length) return map;
  const rows = await db
    .select({
      orderId: timeEntries.orderId,
      diagnosis: sql<string>`coalesce(sum(case when ${timeEntries.kind} = 'diagnosis' then ${timeEntries.minutes} else 0 end), 0)`,
      total: sql<string>`coalesce(sum(${timeEntries.minutes}), 0)`,
    })
    .from(timeEntries)
    .where(inArray(timeEntries.orderId, orderIds))
    .groupBy(timeEntries.orderId);
  for (const r of rows) map.set(r.orderId, { diagnosis: Number(r.diagnosis), total: Number(r.total) });
  return map;
}

export function markupView(row: typeof orderDrawings.$inferSelect, people: Map<string, PersonRef>): MarkupSummary {
  return {
    id: row.id,
    revisionId: row.revisionId,
    harnessName: row.harnessName,
    revisionNumber: row.revisionNumber,
    title: row.title,
    notes: row.notes,
    markers: row.markers,
    highlight: row.highlight,
    viewport: row.viewport ?? null,
    inReport: row.inReport,
    version: row.version,
    createdBy: row.createdBy ? (people.get(row.createdBy) ?? null) : null,
    createdAt: row.createdAt.toISOString(),
    svgUrl: `/api/repair-orders/${row.orderId}/drawings/${row.id}/image.svg?v=${row.version}`,
    pngUrl: `/api/repair-orders/${row.orderId}/drawings/${row.id}/image.png?v=${row.version}`,
  };
}

export function attachmentView(row: typeof orderAttachments.$inferSelect, people: Map<string, PersonRef>): Attachment {
  return {
    id: row.id,
    kind: row.kind,
    filename: row.filename,
    contentType: row.contentType,
    size: row.size,
    width: row.width,
    height: row.height,
    caption: row.caption,
    inReport: row.inReport,
    uploadedBy: row.uploadedBy ? (people.get(row.uploadedBy) ?? null) : null,
    createdAt: row.createdAt.toISOString(),
    url: `/api/attachments/${row.id}/file`,
    thumbUrl: row.thumbKey ? `/api/attachments/${row.id}/thumb` : null,
  };
}

/** Everything the order page shows, in one answer. */
export async function orderDetail(db: DbOrTx, req: Request, order: OrderRow): Promise<OrderDetail> {
  const shopId = order.shopId;
  const [customerRows, unitMap, minutes, settings, entries, procs, steps, drawings, files, sends, links] = await Promise.all([
    db.select().from(customers).where(and(eq(customers.id, order.customerId), eq(customers.shopId, shopId))).limit(1),
    unitsOfOrders(db, [order.id]),
    minutesOfOrders(db, [order.id]),
    getSettings(db, shopId),
    db.select().from(timeEntries).where(eq(timeEntries.orderId, order.id)).orderBy(desc(timeEntries.workDate), desc(timeEntries.createdAt)),
    db.select().from(orderProcedures).where(eq(orderProcedures.orderId, order.id)).orderBy(asc(orderProcedures.attachedAt)),
    db
      .select({ step: orderProcedureSteps })
      .from(orderProcedureSteps)
      .innerJoin(orderProcedures, eq(orderProcedures.id, orderProcedureSteps.orderProcedureId))
      .where(eq(orderProcedures.orderId, order.id))
      .orderBy(asc(orderProcedureSteps.position)),
    db.select().from(orderDrawings).where(eq(orderDrawings.orderId, order.id)).orderBy(asc(orderDrawings.createdAt)),
    db.select().from(orderAttachments).where(eq(orderAttachments.orderId, order.id)).orderBy(asc(orderAttachments.createdAt)),
    db.select().from(reportSends).where(eq(reportSends.orderId, order.id)).orderBy(desc(reportSends.sentAt)),
    db.select().from(customerLinks).where(eq(customerLinks.orderId, order.id)).orderBy(desc(customerLinks.createdAt)),
  ]);
  const people = await peopleById(db, [
    order.assignedTechId,
    order.openedBy,
    ...entries.map((e) => e.techId),
    ...procs.map((p) => p.attachedBy),
    ...steps.map((s) => s.step.doneBy),
    ...drawings.map((d) => d.createdBy),
    ...files.map((f) => f.uploadedBy),
    ...sends.map((s) => s.sentBy),
    ...links.map((l) => l.createdBy),
  ]);
  const person = (id: string | null) => (id ? (people.get(id) ?? null) : null);
  const m = minutes.get(order.id) ?? { diagnosis: 0, total: 0 };
  const timeViews: TimeEntry[] = entries.map((e) => ({
    id: e.id,
    tech: people.get(e.techId) ?? { id: e.techId, name: 'Former member' },
    kind: e.kind,
    minutes: e.minutes,
    workDate: String(e.workDate),
    note: e.note,
    createdAt: e.createdAt.toISOString(),
  }));
  const procedureViews: OrderProcedure[] = procs.map((p) => ({
    id: p.id,
    procedureId: p.procedureId,
    title: p.title,
    notes: p.notes,
    attachedBy: person(p.attachedBy),
    attachedAt: p.attachedAt.toISOString(),
    steps: steps
      .filter((s) => s.step.orderProcedureId === p.id)
      .map(({ step }) => ({ id: step.id, position: step.position, text: step.text, doneBy: person(step.doneBy), doneAt: iso(step.doneAt) })),
  }));
  const sendViews: ReportSend[] = sends.map((s) => ({
    id: s.id,
    sentBy: person(s.sentBy),
    sentAt: s.sentAt.toISOString(),
    to: s.to,
    subject: s.subject,
    filename: s.filename,
    bytes: s.bytes,
    linkId: s.linkId,
  }));
  const linkViews: CustomerLinkInfo[] = links.map((l) => ({
    id: l.id,
    createdBy: person(l.createdBy),
    createdAt: l.createdAt.toISOString(),
    expiresAt: l.expiresAt.toISOString(),
    revokedAt: iso(l.revokedAt),
    lastOpenedAt: iso(l.lastOpenedAt),
  }));
  const work = canWorkOn(req, order);
  const desk = isDesk(req.auth.role);
  return {
    id: order.id,
    number: order.number,
    status: order.status,
    customer: customerView(customerRows[0]),
    units: unitMap.get(order.id) ?? [],
    complaint: order.complaint,
    cause: order.cause,
    correction: order.correction,
    labourNotes: order.labourNotes,
    internalNotes: order.internalNotes,
    customerNotes: order.customerNotes,
    assignedTech: person(order.assignedTechId),
    openedBy: person(order.openedBy),
    openedAt: order.openedAt.toISOString(),
    updatedAt: order.updatedAt.toISOString(),
    closedAt: iso(order.closedAt),
    stalledNotifiedAt: iso(order.stalledNotifiedAt),
    diagnosisMinutes: m.diagnosis,
    totalMinutes: m.total,
    stalled: isStalled(order, m.diagnosis, settings),
    version: order.version,
    timeEntries: timeViews,
    procedures: procedureViews,
    drawings: drawings.map((d) => markupView(d, people)),
    attachments: files.map((f) => attachmentView(f, people)),
    sends: sendViews,
    links: linkViews,
    can: { edit: desk, editFindings: desk || work, send: desk, assign: desk },
  };
}

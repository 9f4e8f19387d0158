import { and, asc, count, desc, eq, gte, inArray, isNull, like, lt, or, sql, type SQL } from 'drizzle-orm';
import { Router, type Request } from 'express';
import { z } from 'zod';
import {
  attachProcedureSchema,
  idParam,
  markupCreateSchema,
  markupUpdateSchema,
  orderCreateSchema,
  orderListQuery,
  orderSettingsSchema,
  orderUpdateSchema,
  techOrderFields,
  tickStepSchema,
  timeEntryCreateSchema,
  type OrderListItem,
} from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { memberships, users } from '../db/schema/auth';
import {
  customers,
  orderDrawings,
  orderProcedures,
  orderProcedureSteps,
  orderSettings,
  procedures,
  repairOrders,
  repairOrderUnits,
  timeEntries,
  units,
} from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams, parseQuery } from '../errors';
import { deskRoles, isDesk, isLeadOrOwner, loadOrder, requireWorkOn, type OrderRow } from '../orders/access';
import { checkAgainstDocument, drawingPng, drawingSvg, harnessDocumentOf, placeMarkers, revisionSnapshot } from '../orders/markups';
import { ensureSettings, getSettings, nextOrderNumber, type DbOrTx } from '../orders/settings';
import { isStalled, markupView, minutesOfOrders, orderDetail, peopleById, unitsOfOrders } from '../orders/views';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);
const twoIds = z.object({ id: idParam.shape.id, childId: idParam.shape.id });
const threeIds = z.object({ id: idParam.shape.id, childId: idParam.shape.id, stepId: idParam.shape.id });

/** SQL: the order's diagnosis minutes. */
const diagnosisMinutesSql = sql<number>`(select coalesce(sum(te.minutes), 0) from time_entries te where te.order_id = ${repairOrders.id} and te.kind = 'diagnosis')`;

/** SQL condition: the order is stalled under the given settings. */
export function stalledCondition(settings: { stalledDiagnosisHours: number; stalledDays: number | null }, now = new Date()): SQL {
  const byHours = sql`${diagnosisMinutesSql} >= ${Math.round(settings.stalledDiagnosisHours * 60)}`;
  const byDays = settings.stalledDays !== null ? sql`${repairOrders.openedAt} <= ${new Date(now.getTime() - settings.stalledDays * 86_400_000)}` : sql`false`;
  return sql`(${inArray(repairOrders.status, ['open', 'diagnosing'])} and (${byHours} or ${byDays}))`;
}

async function checkUnits(db: DbOrTx, shopId: string, customerId: string, unitIds: string[]) {
  if (new Set(unitIds).size !== unitIds.length) throw new HttpError(400, 'invalid_request', 'A unit is listed twice.', [{ path: '$.unitIds', message: 'Listed twice' }]);
  const rows = await db.select({ id: units.id, customerId: units.customerId }).from(units).where(and(eq(units.shopId, shopId), inArray(units.id, unitIds)));
  const found = new Map(rows.map((r) => [r.id, r.customerId]));
  const problems = unitIds.flatMap((u, i) =>
    !found.has(u) ? [{ path: `$.unitIds[${i}]`, message: 'No such unit in this shop' }] : found.get(u) !== customerId ? [{ path: `$.unitIds[${i}]`, message: 'This unit belongs to another customer' }] : [],
  );
  if (problems.length) throw new HttpError(400, 'invalid_request', `The units do not fit the order: ${problems[0].message}.`, problems);
}

async function checkMember(db: DbOrTx, shopId: string, userId: string, path: string) {
  const [m] = await db.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId))).limit(1);
  if (!m) throw new HttpError(400, 'invalid_request', 'That person is not a member of this shop.', [{ path, message: 'Not a member of this shop' }]);
  return m.role;
}

function staleOrder(current: OrderRow): HttpError {
  return new HttpError(409, 'stale_version', `Order ${current.number} was changed by someone else (now version ${current.version}). Reload it and make your change again.`, {
    currentVersion: current.version,
  });
}

/**
 * `/api/repair-orders`. Every member reads; writers, leads and owners open, edit, assign;
 * the assigned tech (and leads, owners) add findings: cause, correction, labour notes, time,
 * procedure ticks, marked-up drawings.
 */
export function repairOrdersRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;
  router.use(requireAuth);

  const detail = async (req: Request, id: string) => orderDetail(db, req, await loadOrder(db, req, id));

  // ---- settings and people -----------------------------------------------------------------
  router.get('/settings', async (req, res) => {
    res.json({ settings: await getSettings(db, req.auth.shopId) });
  });
  router.put('/settings', requireRole('lead', 'owner'), async (req, res) => {
    const body = parseBody(orderSettingsSchema, req.body);
    await ensureSettings(db, req.auth.shopId);
    await db.update(orderSettings).set({ ...body, updatedAt: new Date() }).where(eq(orderSettings.shopId, req.auth.shopId));
    res.json({ settings: await getSettings(db, req.auth.shopId) });
  });
  /** Who an order can be assigned to: the shop's techs and leads. */
  router.get('/people', async (req, res) => {
    const rows = await db
      .select({ id: users.id, name: users.name, role: memberships.role })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.shopId, req.auth.shopId), inArray(memberships.role, ['tech', 'lead'])))
      .orderBy(asc(users.name));
    res.json({ people: rows });
  });
  /** Time per tech and kind over a date range: leads and owners see everyone, others themselves. */
  router.get('/time-summary', async (req, res) => {
    const q = parseQuery(z.object({ from: z.iso.date().optional(), to: z.iso.date().optional() }), req.query);
    const rows = await db
      .select({ techId: timeEntries.techId, name: users.name, kind: timeEntries.kind, minutes: sql<string>`sum(${timeEntries.minutes})`, orders: sql<string>`count(distinct ${timeEntries.orderId})` })
      .from(timeEntries)
      .innerJoin(users, eq(users.id, timeEntries.techId))
      .where(
        and(
          eq(timeEntries.shopId, req.auth.shopId),
          isLeadOrOwner(req.auth.role) ? undefined : eq(timeEntries.techId, req.auth.userId),
          q.from ? gte(timeEntries.workDate, q.from) : undefined,
          q.to ? sql`${timeEntries.workDate} <= ${q.to}` : undefined,
        ),
      )
      .groupBy(timeEntries.techId, users.name, timeEntries.kind)
      .orderBy(asc(users.name));
    res.json({ rows: rows.map((r) => ({ ...r, minutes: Number(r.minutes), orders: Number(r.orders) })) });
  });

  // ---- list and create ---------------------------------------------------------------------
  router.get('/', async (req, res) => {
    const q = parseQuery(orderListQuery, req.query);
    const settings = await getSettings(db, req.auth.shopId);
    const numeric = q.q && /^\d{1,9}$/.test(q.q) ? Number(q.q) : null;
    const where = and(
      eq(repairOrders.shopId, req.auth.shopId),
      q.status?.length ? inArray(repairOrders.status, q.status) : undefined,
      q.techId === 'me' ? eq(repairOrders.assignedTechId, req.auth.userId) : q.techId === 'none' ? isNull(repairOrders.assignedTechId) : q.techId ? eq(repairOrders.assignedTechId, q.techId) : undefined,
      q.customerId ? eq(repairOrders.customerId, q.customerId) : undefined,
      q.from ? gte(repairOrders.openedAt, new Date(`${q.from}T00:00:00Z`)) : undefined,
      q.to ? lt(repairOrders.openedAt, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)) : undefined,
      q.stalled ? stalledCondition(settings) : undefined,
      q.q
        ? or(
            numeric !== null ? eq(repairOrders.number, numeric) : undefined,
            like(repairOrders.complaint, `%${escapeLike(q.q)}%`),
            like(customers.name, `%${escapeLike(q.q)}%`),
            like(customers.company, `%${escapeLike(q.q)}%`),
            sql`exists (select 1 from repair_order_units ru join units u on u.id = ru.unit_id where ru.order_id = ${repairOrders.id} and u.serial_number like ${`%${escapeLike(q.q)}%`})`,
          )
        : undefined,
    );
    const sortColumn = { number: repairOrders.number, openedAt: repairOrders.openedAt, updatedAt: repairOrders.updatedAt, status: repairOrders.status, customer: customers.name }[q.sort];
    const order = q.dir === 'asc' ? asc(sortColumn) : desc(sortColumn);
    const [rows, [{ n }]] = await Promise.all([
      db
        .select({ order: repairOrders, customerName: customers.name, customerCompany: customers.company, techName: users.name })
        .from(repairOrders)
        .innerJoin(customers, eq(customers.id, repairOrders.customerId))
        .leftJoin(users, eq(users.id, repairOrders.assignedTechId))
        .where(where)
        .orderBy(...(numeric !== null ? [desc(sql`${repairOrders.number} = ${numeric}`)] : []), order, desc(repairOrders.number))
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize),
      db.select({ n: count() }).from(repairOrders).innerJoin(customers, eq(customers.id, repairOrders.customerId)).where(where),
    ]);
    const ids = rows.map((r) => r.order.id);
    const [unitMap, minutes] = await Promise.all([unitsOfOrders(db, ids), minutesOfOrders(db, ids)]);
    const orders: OrderListItem[] = rows.map(({ order: o, customerName, customerCompany, techName }) => {
      const m = minutes.get(o.id) ?? { diagnosis: 0, total: 0 };
      return {
        id: o.id,
        number: o.number,
        status: o.status,
        customer: { id: o.customerId, name: customerName, company: customerCompany },
        units: (unitMap.get(o.id) ?? []).map((u) => ({ id: u.id, serialNumber: u.serialNumber, modelName: u.modelName })),
        complaint: o.complaint,
        assignedTech: o.assignedTechId ? { id: o.assignedTechId, name: techName ?? 'Former member' } : null,
        openedAt: o.openedAt.toISOString(),
        updatedAt: o.updatedAt.toISOString(),
        diagnosisMinutes: m.diagnosis,
        totalMinutes: m.total,
        stalled: isStalled(o, m.diagnosis, settings),
        version: o.version,
      };
    });
    res.json({ orders, total: Number(n), page: q.page, pageSize: q.pageSize, settings });
  });

  router.post('/', requireRole(...deskRoles), async (req, res) => {
    const body = parseBody(orderCreateSchema, req.body);
    const shopId = req.auth.shopId;
    const [customer] = await db.select({ id: customers.id }).from(customers).where(and(eq(customers.id, body.customerId), eq(customers.shopId, shopId))).limit(1);
    if (!customer) throw new HttpError(400, 'invalid_request', 'The customer was not found in this shop.', [{ path: '$.customerId', message: 'No such customer' }]);
    await checkUnits(db, shopId, body.customerId, body.unitIds);
    if (body.assignedTechId) await checkMember(db, shopId, body.assignedTechId, '$.assignedTechId');
    const id = newId();
    await db.transaction(async (tx) => {
      const number = await nextOrderNumber(tx, shopId);
      const now = new Date();
      await tx.insert(repairOrders).values({
        id,
        shopId,
        number,
        customerId: body.customerId,
        status: 'open',
        complaint: body.complaint,
        assignedTechId: body.assignedTechId,
        customerNotes: body.customerNotes,
        internalNotes: body.internalNotes,
        openedBy: req.auth.userId,
        openedAt: now,
        updatedAt: now,
      });
      await tx.insert(repairOrderUnits).values(body.unitIds.map((unitId, position) => ({ orderId: id, unitId, shopId, position })));
      if (body.hourMeter !== null) {
        await tx
          .update(units)
          .set({ hourMeter: body.hourMeter, updatedAt: now, version: sql`${units.version} + 1` })
          .where(and(eq(units.id, body.unitIds[0]), eq(units.shopId, shopId), or(isNull(units.hourMeter), lt(units.hourMeter, body.hourMeter))));
      }
    });
    res.status(201).json({ order: await detail(req, id) });
  });

  // ---- one order ---------------------------------------------------------------------------
  router.get('/:id', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    res.json({ order: await detail(req, id) });
  });

  router.patch('/:id', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(orderUpdateSchema, req.body);
    const order = await loadOrder(db, req, id);
    const { version, unitIds, ...fields } = body;
    const sent = Object.keys(fields).filter((k) => (fields as Record<string, unknown>)[k] !== undefined) as (keyof typeof fields)[];
    if (!isDesk(req.auth.role)) {
      requireWorkOn(req, order, 'change');
      const notAllowed = [...sent.filter((k) => !(techOrderFields as readonly string[]).includes(k)), ...(unitIds ? ['unitIds'] : [])];
      if (notAllowed.length) throw new HttpError(403, 'forbidden', `A technician records findings; ${notAllowed.join(', ')} ${notAllowed.length > 1 ? 'are' : 'is'} for the service desk or a lead.`);
      if (fields.status === 'closed' && req.auth.role === 'tech') throw new HttpError(403, 'forbidden', 'A technician marks the order ready; the service desk closes it.');
    }
    const shopId = req.auth.shopId;
    const customerId = fields.customerId ?? order.customerId;
    if (fields.customerId && fields.customerId !== order.customerId && !unitIds) {
      throw new HttpError(400, 'invalid_request', 'When the customer changes, pick that customer’s units too.', [{ path: '$.unitIds', message: 'Pick the new customer’s units' }]);
    }
    if (fields.customerId) {
      const [c] = await db.select({ id: customers.id }).from(customers).where(and(eq(customers.id, fields.customerId), eq(customers.shopId, shopId))).limit(1);
      if (!c) throw new HttpError(400, 'invalid_request', 'The customer was not found in this shop.', [{ path: '$.customerId', message: 'No such customer' }]);
    }
    if (unitIds) await checkUnits(db, shopId, customerId, unitIds);
    if (fields.assignedTechId) await checkMember(db, shopId, fields.assignedTechId, '$.assignedTechId');
    const now = new Date();
    const set: Partial<typeof repairOrders.$inferInsert> = {};
    for (const k of sent) (set as Record<string, unknown>)[k] = fields[k];
    if (fields.status && fields.status !== order.status) set.closedAt = fields.status === 'closed' ? now : null;
    await db.transaction(async (tx) => {
      const [result] = await tx
        .update(repairOrders)
        .set({ ...set, version: version + 1, updatedAt: now })
        .where(and(eq(repairOrders.id, id), eq(repairOrders.shopId, shopId), eq(repairOrders.version, version)));
      if (result.affectedRows === 0) throw staleOrder(await loadOrder(tx, req, id));
      if (unitIds) {
        await tx.delete(repairOrderUnits).where(eq(repairOrderUnits.orderId, id));
        await tx.insert(repairOrderUnits).values(unitIds.map((unitId, position) => ({ orderId: id, unitId, shopId, position })));
      }
    });
    res.json({ order: await detail(req, id) });
  });

  // ---- time entries ------------------------------------------------------------------------
  router.post('/:id/time-entries', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(timeEntryCreateSchema, req.body);
    const order = await loadOrder(db, req, id);
    requireWorkOn(req, order, 'log time on');
    const techId = body.techId ?? req.auth.userId;
    if (techId !== req.auth.userId) {
      if (!isLeadOrOwner(req.auth.role)) throw new HttpError(403, 'forbidden', 'You log your own time; a lead logs time for others.');
      await checkMember(db, req.auth.shopId, techId, '$.techId');
    }
    await db.insert(timeEntries).values({
      id: newId(),
      shopId: req.auth.shopId,
      orderId: id,
      techId,
      kind: body.kind,
      minutes: body.minutes,
      workDate: body.workDate ?? new Date().toISOString().slice(0, 10),
      note: body.note,
      createdBy: req.auth.userId,
    });
    res.status(201).json({ order: await detail(req, id) });
  });

  router.delete('/:id/time-entries/:childId', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    const order = await loadOrder(db, req, id);
    const [entry] = await db.select().from(timeEntries).where(and(eq(timeEntries.id, childId), eq(timeEntries.orderId, id), eq(timeEntries.shopId, req.auth.shopId))).limit(1);
    if (!entry) throw notFound('The time entry');
    if (!isLeadOrOwner(req.auth.role) && !(entry.techId === req.auth.userId && req.auth.role === 'tech' && order.assignedTechId === req.auth.userId)) {
      throw new HttpError(403, 'forbidden', 'You can remove only your own time entries; a lead removes others.');
    }
    await db.delete(timeEntries).where(eq(timeEntries.id, childId));
    res.json({ order: await detail(req, id) });
  });

  // ---- procedures on the order -------------------------------------------------------------
  router.post('/:id/procedures', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(attachProcedureSchema, req.body);
    const order = await loadOrder(db, req, id);
    if (!isDesk(req.auth.role)) requireWorkOn(req, order, 'attach a procedure to');
    const [proc] = await db.select().from(procedures).where(and(eq(procedures.id, body.procedureId), eq(procedures.shopId, req.auth.shopId))).limit(1);
    if (!proc) throw new HttpError(400, 'invalid_request', 'The procedure was not found in this shop.', [{ path: '$.procedureId', message: 'No such procedure' }]);
    const opId = newId();
    await db.transaction(async (tx) => {
      await tx.insert(orderProcedures).values({ id: opId, shopId: req.auth.shopId, orderId: id, procedureId: proc.id, title: proc.title, notes: proc.notes, attachedBy: req.auth.userId });
      await tx.insert(orderProcedureSteps).values(proc.steps.map((text, position) => ({ id: newId(), shopId: req.auth.shopId, orderProcedureId: opId, position, text })));
    });
    res.status(201).json({ order: await detail(req, id) });
  });

  router.delete('/:id/procedures/:childId', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    await loadOrder(db, req, id);
    if (!isLeadOrOwner(req.auth.role) && req.auth.role !== 'writer') throw new HttpError(403, 'forbidden', 'The service desk or a lead removes a procedure from an order.');
    const [result] = await db.delete(orderProcedures).where(and(eq(orderProcedures.id, childId), eq(orderProcedures.orderId, id), eq(orderProcedures.shopId, req.auth.shopId)));
    if (result.affectedRows === 0) throw notFound('The procedure on this order');
    res.json({ order: await detail(req, id) });
  });

  router.put('/:id/procedures/:childId/steps/:stepId', async (req, res) => {
    const { id, childId, stepId } = parseParams(threeIds, req.params);
    const { done } = parseBody(tickStepSchema, req.body);
    const order = await loadOrder(db, req, id);
    requireWorkOn(req, order, 'tick steps on');
    const [step] = await db
      .select({ id: orderProcedureSteps.id, doneBy: orderProcedureSteps.doneBy })
      .from(orderProcedureSteps)
      .innerJoin(orderProcedures, eq(orderProcedures.id, orderProcedureSteps.orderProcedureId))
      .where(and(eq(orderProcedureSteps.id, stepId), eq(orderProcedures.id, childId), eq(orderProcedures.orderId, id), eq(orderProcedures.shopId, req.auth.shopId)))
      .limit(1);
    if (!step) throw notFound('The step');
    // Ticking a ticked step keeps who ticked it first.
    if (done && !step.doneBy) await db.update(orderProcedureSteps).set({ doneBy: req.auth.userId, doneAt: new Date() }).where(and(eq(orderProcedureSteps.id, stepId), isNull(orderProcedureSteps.doneBy)));
    if (!done) await db.update(orderProcedureSteps).set({ doneBy: null, doneAt: null }).where(eq(orderProcedureSteps.id, stepId));
    res.json({ order: await detail(req, id) });
  });

  // ---- marked-up drawings ------------------------------------------------------------------
  const loadDrawing = async (req: Request, orderId: string, drawingId: string) => {
    const [row] = await db
      .select()
      .from(orderDrawings)
      .where(and(eq(orderDrawings.id, drawingId), eq(orderDrawings.orderId, orderId), eq(orderDrawings.shopId, req.auth.shopId)))
      .limit(1);
    if (!row) throw notFound('The marked-up drawing');
    return row;
  };

  router.post('/:id/drawings', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(markupCreateSchema, req.body);
    const order = await loadOrder(db, req, id);
    requireWorkOn(req, order, 'attach a drawing to');
    const snap = await revisionSnapshot(db, req.auth.shopId, body.revisionId);
    checkAgainstDocument(snap.document, body.highlight, body.markers);
    const drawingId = newId();
    await db.insert(orderDrawings).values({
      id: drawingId,
      shopId: req.auth.shopId,
      orderId: id,
      revisionId: body.revisionId,
      harnessName: snap.revision.harnessName,
      revisionNumber: snap.revision.number,
      title: body.title,
      viewport: body.viewport,
      highlight: body.highlight,
      markers: placeMarkers(snap.document, snap.positions, body.markers),
      notes: body.notes,
      inReport: body.inReport,
      snapshot: { document: snap.document, positions: snap.positions },
      createdBy: req.auth.userId,
    });
    const row = await loadDrawing(req, id, drawingId);
    res.status(201).json({ drawing: markupView(row, await peopleById(db, [row.createdBy])) });
  });

  /** The drawing as data, with the frozen document and positions to re-open it. */
  router.get('/:id/drawings/:childId', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    await loadOrder(db, req, id);
    const row = await loadDrawing(req, id, childId);
    res.json({ drawing: markupView(row, await peopleById(db, [row.createdBy])), document: row.snapshot.document, positions: row.snapshot.positions });
  });

  router.patch('/:id/drawings/:childId', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    const { version, markers, ...changes } = parseBody(markupUpdateSchema, req.body);
    const order = await loadOrder(db, req, id);
    requireWorkOn(req, order, 'change drawings on');
    const row = await loadDrawing(req, id, childId);
    const frozen = harnessDocumentOf(row.snapshot.document);
    checkAgainstDocument(frozen, changes.highlight, markers);
    const [result] = await db
      .update(orderDrawings)
      .set({
        ...changes,
        ...(markers ? { markers: placeMarkers(frozen, row.snapshot.positions ?? {}, markers) } : {}),
        version: version + 1,
        updatedAt: new Date(),
      })
      .where(and(eq(orderDrawings.id, childId), eq(orderDrawings.version, version)));
    const after = await loadDrawing(req, id, childId);
    if (result.affectedRows === 0) throw new HttpError(409, 'stale_version', `This drawing was changed by someone else (now version ${after.version}). Reload it and make your change again.`, { currentVersion: after.version });
    res.json({ drawing: markupView(after, await peopleById(db, [after.createdBy])) });
  });

  router.delete('/:id/drawings/:childId', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    const order = await loadOrder(db, req, id);
    requireWorkOn(req, order, 'remove drawings from');
    await loadDrawing(req, id, childId);
    await db.delete(orderDrawings).where(eq(orderDrawings.id, childId));
    res.status(204).end();
  });

  router.get('/:id/drawings/:childId/image.svg', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    await loadOrder(db, req, id);
    const row = await loadDrawing(req, id, childId);
    res.type('image/svg+xml').set('Content-Security-Policy', "default-src 'none'; style-src 'unsafe-inline'").send(drawingSvg(row));
  });

  router.get('/:id/drawings/:childId/image.png', async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    await loadOrder(db, req, id);
    const row = await loadDrawing(req, id, childId);
    res.type('image/png').send(await drawingPng(row));
  });

  return router;
}

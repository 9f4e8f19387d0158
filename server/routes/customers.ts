import { and, asc, count, eq, like, or } from 'drizzle-orm';
import { Router } from 'express';
import { customerCreateSchema, customerListQuery, customerUpdateSchema, idParam } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { customers, units } from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams, parseQuery } from '../errors';
import { deskRoles } from '../orders/access';
import { customerView, unitSelect, unitView } from '../orders/views';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * `/api/customers`: every member reads; writers, leads and owners create and edit.
 * GET / (?q, page, pageSize) → { customers, total, page, pageSize }; POST / → { customer };
 * GET /:id → { customer, units }; PATCH /:id { version, … } → { customer } (409 when stale).
 */
export function customersRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;
  router.use(requireAuth);

  router.get('/', async (req, res) => {
    const q = parseQuery(customerListQuery, req.query);
    const where = and(
      eq(customers.shopId, req.auth.shopId),
      q.q ? or(like(customers.name, `%${escapeLike(q.q)}%`), like(customers.company, `%${escapeLike(q.q)}%`), like(customers.email, `%${escapeLike(q.q)}%`)) : undefined,
    );
    const [rows, [{ n }]] = await Promise.all([
      db.select().from(customers).where(where).orderBy(asc(customers.name), asc(customers.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
      db.select({ n: count() }).from(customers).where(where),
    ]);
    res.json({ customers: rows.map(customerView), total: Number(n), page: q.page, pageSize: q.pageSize });
  });

  router.post('/', requireRole(...deskRoles), async (req, res) => {
    const body = parseBody(customerCreateSchema, req.body);
    const row = { id: newId(), shopId: req.auth.shopId, ...body, createdAt: new Date(), updatedAt: new Date(), version: 1 };
    await db.insert(customers).values(row);
    res.status(201).json({ customer: customerView(row) });
  });

  router.get('/:id', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const [row] = await db.select().from(customers).where(and(eq(customers.id, id), eq(customers.shopId, req.auth.shopId))).limit(1);
    if (!row) throw notFound('The customer');
    const unitRows = await unitSelect(db).where(and(eq(units.customerId, id), eq(units.shopId, req.auth.shopId))).orderBy(asc(units.serialNumber));
    res.json({ customer: customerView(row), units: unitRows.map((r) => unitView({ ...r.unit, maker: r.maker, model: r.model, customerName: r.customerName })) });
  });

  router.patch('/:id', requireRole(...deskRoles), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const { version, ...changes } = parseBody(customerUpdateSchema, req.body);
    const where = and(eq(customers.id, id), eq(customers.shopId, req.auth.shopId));
    const [result] = await db
      .update(customers)
      .set({ ...changes, version: version + 1, updatedAt: new Date() })
      .where(and(where, eq(customers.version, version)));
    const [row] = await db.select().from(customers).where(where).limit(1);
    if (!row) throw notFound('The customer');
    if (result.affectedRows === 0) {
      throw new HttpError(409, 'stale_version', `This customer was changed by someone else (now version ${row.version}). Reload it and make your change again.`, { current: customerView(row) });
    }
    res.json({ customer: customerView(row) });
  });

  return router;
}

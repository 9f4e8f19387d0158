import { and, asc, count, eq, like, or } from 'drizzle-orm';
import { Router } from 'express';
import { idParam, unitCreateSchema, unitListQuery, unitUpdateSchema } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { equipmentModels } from '../db/schema/harness';
import { customers, units } from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams, parseQuery } from '../errors';
import { deskRoles } from '../orders/access';
import { unitSelect, unitView } from '../orders/views';
import type { DbOrTx } from '../orders/settings';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

async function checkModel(db: DbOrTx, shopId: string, modelId: string | null | undefined) {
  if (!modelId) return;
  const [m] = await db.select({ id: equipmentModels.id }).from(equipmentModels).where(and(eq(equipmentModels.id, modelId), eq(equipmentModels.shopId, shopId))).limit(1);
  if (!m) throw new HttpError(400, 'invalid_request', 'The model is not in this shop’s library.', [{ path: '$.modelId', message: 'No such model in the library' }]);
}

/**
 * `/api/units`: a customer's machines and attachments. Every member reads; writers, leads and
 * owners create and edit. GET / (?customerId, q) → { units, total, page, pageSize };
 * POST / → { unit }; GET /:id → { unit }; PATCH /:id { version, … } → { unit }.
 */
export function unitsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;
  router.use(requireAuth);

  const loadOne = async (shopId: string, id: string) => {
    const [r] = await unitSelect(db).where(and(eq(units.id, id), eq(units.shopId, shopId))).limit(1);
    return r ? unitView({ ...r.unit, maker: r.maker, model: r.model, customerName: r.customerName }) : null;
  };

  router.get('/', async (req, res) => {
    const q = parseQuery(unitListQuery, req.query);
    const where = and(
      eq(units.shopId, req.auth.shopId),
      q.customerId ? eq(units.customerId, q.customerId) : undefined,
      q.q ? or(like(units.serialNumber, `%${escapeLike(q.q)}%`), like(units.description, `%${escapeLike(q.q)}%`), like(equipmentModels.model, `%${escapeLike(q.q)}%`)) : undefined,
    );
    const [rows, [{ n }]] = await Promise.all([
      unitSelect(db).where(where).orderBy(asc(units.serialNumber), asc(units.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
      db.select({ n: count() }).from(units).leftJoin(equipmentModels, eq(equipmentModels.id, units.modelId)).where(where),
    ]);
    res.json({ units: rows.map((r) => unitView({ ...r.unit, maker: r.maker, model: r.model, customerName: r.customerName })), total: Number(n), page: q.page, pageSize: q.pageSize });
  });

  router.post('/', requireRole(...deskRoles), async (req, res) => {
    const body = parseBody(unitCreateSchema, req.body);
    const [customer] = await db.select({ id: customers.id }).from(customers).where(and(eq(customers.id, body.customerId), eq(customers.shopId, req.auth.shopId))).limit(1);
    if (!customer) throw new HttpError(400, 'invalid_request', 'The customer was not found in this shop.', [{ path: '$.customerId', message: 'No such customer' }]);
    if (!body.modelId && !body.description) {
      throw new HttpError(400, 'invalid_request', 'Pick a model from the library or describe the unit (maker and model).', [{ path: '$.description', message: 'Pick a model or describe the unit' }]);
    }
    await checkModel(db, req.auth.shopId, body.modelId);
    const id = newId();
    await db.insert(units).values({ id, shopId: req.auth.shopId, ...body, version: 1, createdAt: new Date(), updatedAt: new Date() });
    res.status(201).json({ unit: await loadOne(req.auth.shopId, id) });
  });

  router.get('/:id', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const unit = await loadOne(req.auth.shopId, id);
    if (!unit) throw notFound('The unit');
    res.json({ unit });
  });

  router.patch('/:id', requireRole(...deskRoles), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const { version, ...changes } = parseBody(unitUpdateSchema, req.body);
    const where = and(eq(units.id, id), eq(units.shopId, req.auth.shopId));
    await checkModel(db, req.auth.shopId, changes.modelId);
    const [result] = await db.update(units).set({ ...changes, version: version + 1, updatedAt: new Date() }).where(and(where, eq(units.version, version)));
    const unit = await loadOne(req.auth.shopId, id);
    if (!unit) throw notFound('The unit');
    if (result.affectedRows === 0) {
      throw new HttpError(409, 'stale_version', `This unit was changed by someone else (now version ${unit.version}). Reload it and make your change again.`, { current: unit });
    }
    res.json({ unit });
  });

  return router;
}

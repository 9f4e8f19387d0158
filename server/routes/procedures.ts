import { and, asc, eq } from 'drizzle-orm';
import { Router } from 'express';
import { idParam, procedureSchema, procedureUpdateSchema, type Procedure } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { procedures } from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams } from '../errors';
import { peopleById } from '../orders/views';

/**
 * `/api/procedures`: checklists a lead writes once (recalibrations after a controller is
 * reprogrammed, …) and attaches to orders. Every member reads; leads and owners write.
 */
export function proceduresRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;
  router.use(requireAuth);

  const view = (row: typeof procedures.$inferSelect, people: Awaited<ReturnType<typeof peopleById>>): Procedure => ({
    id: row.id,
    title: row.title,
    notes: row.notes,
    steps: row.steps,
    version: row.version,
    createdBy: row.createdBy ? (people.get(row.createdBy) ?? null) : null,
    updatedAt: row.updatedAt.toISOString(),
  });
  const one = async (shopId: string, id: string) => {
    const [row] = await db.select().from(procedures).where(and(eq(procedures.id, id), eq(procedures.shopId, shopId))).limit(1);
    return row;
  };

  router.get('/', async (req, res) => {
    const rows = await db.select().from(procedures).where(eq(procedures.shopId, req.auth.shopId)).orderBy(asc(procedures.title));
    const people = await peopleById(db, rows.map((r) => r.createdBy));
    res.json({ procedures: rows.map((r) => view(r, people)) });
  });

  router.get('/:id', async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const row = await one(req.auth.shopId, id);
    if (!row) throw notFound('The procedure');
    res.json({ procedure: view(row, await peopleById(db, [row.createdBy])) });
  });

  router.post('/', requireRole('lead', 'owner'), async (req, res) => {
    const body = parseBody(procedureSchema, req.body);
    const id = newId();
    await db.insert(procedures).values({ id, shopId: req.auth.shopId, ...body, createdBy: req.auth.userId });
    const row = await one(req.auth.shopId, id);
    res.status(201).json({ procedure: view(row!, await peopleById(db, [row!.createdBy])) });
  });

  router.put('/:id', requireRole('lead', 'owner'), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const { version, ...body } = parseBody(procedureUpdateSchema, req.body);
    const [result] = await db
      .update(procedures)
      .set({ ...body, version: version + 1, updatedAt: new Date() })
      .where(and(eq(procedures.id, id), eq(procedures.shopId, req.auth.shopId), eq(procedures.version, version)));
    const row = await one(req.auth.shopId, id);
    if (!row) throw notFound('The procedure');
    if (result.affectedRows === 0) throw new HttpError(409, 'stale_version', `This procedure was changed by someone else (now version ${row.version}). Reload it and make your change again.`, { currentVersion: row.version });
    res.json({ procedure: view(row, await peopleById(db, [row.createdBy])) });
  });

  /** Removing a template leaves the copies already on orders (and their ticks) as they are. */
  router.delete('/:id', requireRole('lead', 'owner'), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const [result] = await db.delete(procedures).where(and(eq(procedures.id, id), eq(procedures.shopId, req.auth.shopId)));
    if (result.affectedRows === 0) throw notFound('The procedure');
    res.status(204).end();
  });

  return router;
}

import { Router } from 'express';
import { and, asc, count, eq, like, or } from 'drizzle-orm';
import { modelCreateSchema, modelListQuerySchema, modelUpdateSchema, type ModelSummary } from '../../shared/api/harness';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { equipmentModels, harnesses } from '../db/schema/harness';
import { HttpError, notFound, parseBody, parseQuery } from '../errors';
import { requireAuth, requireRole } from '../auth/middleware';
import { listHarnesses, modelDisplayName } from '../harness/harnesses';
import { harnessesChanged } from '../harness/shop-changes';
import { isDuplicate } from '../harness/revisions';
import { idParam } from './harnesses';

type ModelRow = typeof equipmentModels.$inferSelect;

const summary = (m: ModelRow, harnessCount: number): ModelSummary => ({
  id: m.id,
  kind: m.kind,
  maker: m.maker,
  model: m.model,
  series: m.series,
  notes: m.notes,
  displayName: modelDisplayName(m),
  harnessCount,
  createdAt: m.createdAt.toISOString(),
  updatedAt: m.updatedAt.toISOString(),
});

const duplicate = () => new HttpError(409, 'already_exists', 'The library already has a model with that maker and model name.');
const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

async function getModel(db: Db, shopId: string, id: string): Promise<ModelRow> {
  const [m] = await db
    .select()
    .from(equipmentModels)
    .where(and(eq(equipmentModels.id, id), eq(equipmentModels.shopId, shopId)))
    .limit(1);
  if (!m) throw notFound('The model');
  return m;
}

/**
 * The library: machine and attachment models.
 * - `GET /api/models?kind=&q=` → `{ models: ModelSummary[] }` (any role)
 * - `GET /api/models/:id` → `{ model, harnesses: HarnessSummary[] }`
 * - `POST /api/models` `{ kind, maker, model, series?, notes? }` → 201 `{ model }` (lead, owner)
 * - `PATCH /api/models/:id` (any of those fields) → `{ model }` (lead, owner)
 * - `DELETE /api/models/:id` → 204; its harnesses stay, unfiled (lead, owner)
 */
export function modelsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const writers = requireRole('lead', 'owner');

  router.get('/', requireAuth, async (req, res) => {
    const q = parseQuery(modelListQuerySchema, req.query);
    const text = q.q ? `%${escapeLike(q.q)}%` : null;
    const rows = await db
      .select()
      .from(equipmentModels)
      .where(
        and(
          eq(equipmentModels.shopId, req.auth.shopId),
          q.kind ? eq(equipmentModels.kind, q.kind) : undefined,
          text ? or(like(equipmentModels.maker, text), like(equipmentModels.model, text), like(equipmentModels.series, text)) : undefined,
        ),
      )
      .orderBy(asc(equipmentModels.kind), asc(equipmentModels.maker), asc(equipmentModels.model));
    // Harness counts as this viewer sees them (techs: published harnesses only).
    const visible = await listHarnesses(db, req.auth);
    const counts = new Map<string, number>();
    for (const h of visible) if (h.modelId) counts.set(h.modelId, (counts.get(h.modelId) ?? 0) + 1);
    res.json({ models: rows.map((m) => summary(m, counts.get(m.id) ?? 0)) });
  });

  router.get('/:id', requireAuth, async (req, res) => {
    const m = await getModel(db, req.auth.shopId, idParam(req, 'id', 'The model'));
    const list = await listHarnesses(db, req.auth, { modelId: m.id });
    res.json({ model: summary(m, list.length), harnesses: list });
  });

  router.post('/', writers, async (req, res) => {
    const body = parseBody(modelCreateSchema, req.body);
    const id = newId();
    const now = new Date();
    try {
      await db.insert(equipmentModels).values({
        id,
        shopId: req.auth.shopId,
        kind: body.kind,
        maker: body.maker,
        model: body.model,
        series: body.series || null,
        notes: body.notes || null,
        createdAt: now,
        updatedAt: now,
      });
    } catch (err) {
      if (isDuplicate(err)) throw duplicate();
      throw err;
    }
    res.status(201).json({ model: summary(await getModel(db, req.auth.shopId, id), 0) });
  });

  router.patch('/:id', writers, async (req, res) => {
    const id = idParam(req, 'id', 'The model');
    const body = parseBody(modelUpdateSchema, req.body);
    await getModel(db, req.auth.shopId, id);
    const set: Partial<ModelRow> = { updatedAt: new Date() };
    if (body.kind !== undefined) set.kind = body.kind;
    if (body.maker !== undefined) set.maker = body.maker;
    if (body.model !== undefined) set.model = body.model;
    if (body.series !== undefined) set.series = body.series || null;
    if (body.notes !== undefined) set.notes = body.notes || null;
    try {
      await db
        .update(equipmentModels)
        .set(set)
        .where(and(eq(equipmentModels.id, id), eq(equipmentModels.shopId, req.auth.shopId)));
    } catch (err) {
      if (isDuplicate(err)) throw duplicate();
      throw err;
    }
    // Search results show the model's name.
    harnessesChanged(req.auth.shopId);
    const [n] = await db.select({ n: count() }).from(harnesses).where(eq(harnesses.modelId, id));
    res.json({ model: summary(await getModel(db, req.auth.shopId, id), Number(n?.n ?? 0)) });
  });

  router.delete('/:id', writers, async (req, res) => {
    const id = idParam(req, 'id', 'The model');
    await getModel(db, req.auth.shopId, id);
    await db.transaction(async (tx) => {
      await tx.update(harnesses).set({ modelId: null }).where(and(eq(harnesses.modelId, id), eq(harnesses.shopId, req.auth.shopId)));
      await tx.delete(equipmentModels).where(and(eq(equipmentModels.id, id), eq(equipmentModels.shopId, req.auth.shopId)));
    });
    harnessesChanged(req.auth.shopId);
    res.status(204).end();
  });

  return router;
}

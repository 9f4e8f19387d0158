import { Router, type Request } from 'express';
import { and, desc, eq, sql } from 'drizzle-orm';
import {
  bookmarkOpenedSchema,
  bookmarkPinnedSchema,
  evaluateBodySchema,
  readingSetCreateSchema,
  readingSetListQuerySchema,
  readingSetUpdateSchema,
  toleranceSchema,
  type ConnectorBookmark,
} from '../../shared/api/readings';
import type { ReadingObservation as Observation } from '../../shared/readings';
import type { AppDeps } from '../deps';
import { newId } from '../db/ids';
import { components, harnesses, revisions } from '../db/schema/harness';
import { units } from '../db/schema/orders';
import { connectorBookmarks, pinTolerances, readingSets } from '../db/schema/readings';
import { HttpError, notFound, parseBody, parseQuery } from '../errors';
import { requireAuth, requireRole } from '../auth/middleware';
import { engineFor } from '../harness/engine';
import { visibleRevision } from '../harness/revisions';
import { loadOrder, requireWorkOn } from '../orders/access';
import { evaluate, readingSetViews, tolerancesOf } from '../readings/service';
import { idParam } from './harnesses';

const pinPattern = /^[A-Za-z0-9_-]{1,32}\.[A-Za-z0-9_+-]{1,16}$/;

/**
 * Readings a tech takes, and what the tech's pages keep per person.
 * - `POST /api/revisions/:id/evaluate` `{ observations }` → `{ readings, suspects, nextUnplug }` (nothing saved)
 * - `GET /api/revisions/:id/tolerances` → `{ tolerances: [{ pin, below, above }] }`
 * - `PUT|DELETE /api/harnesses/:harnessId/tolerances/:pin` `{ below, above }` (lead, owner)
 * - `POST /api/reading-sets`, `GET /api/reading-sets?repairOrderId=&revisionId=&harnessId=&mine=1`,
 *   `GET|PUT|DELETE /api/reading-sets/:id` (PUT carries `version`; stale → 409)
 * - `GET /api/connector-bookmarks`, `POST /api/connector-bookmarks/opened`, `PUT /api/connector-bookmarks/pinned`
 */
export function readingsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  // Writers read the sets for the report; taking readings is the techs', leads' and owners' work.
  const takers = requireRole('tech', 'lead', 'owner');

  async function evaluationFor(req: Request, revisionId: string, observations: Observation[]) {
    const revision = await visibleRevision(db, req.auth, revisionId);
    const view = await engineFor(db, revision);
    const tolerances = await tolerancesOf(db, req.auth.shopId, revision.harnessId);
    return { revision, result: evaluate(view, observations, tolerances) };
  }

  router.post('/revisions/:id/evaluate', requireAuth, async (req, res) => {
    const body = parseBody(evaluateBodySchema, req.body);
    const { result } = await evaluationFor(req, idParam(req, 'id', 'The revision'), body.observations);
    res.json(result);
  });

  router.get('/revisions/:id/tolerances', requireAuth, async (req, res) => {
    const revision = await visibleRevision(db, req.auth, idParam(req, 'id', 'The revision'));
    const map = await tolerancesOf(db, req.auth.shopId, revision.harnessId);
    res.json({ tolerances: [...map].map(([pin, t]) => ({ pin, ...t })) });
  });

  /** The harness of the member's shop, or 404. */
  async function shopHarness(req: Request, harnessId: string): Promise<string> {
    const [h] = await db
      .select({ id: harnesses.id })
      .from(harnesses)
      .where(and(eq(harnesses.id, harnessId), eq(harnesses.shopId, req.auth.shopId)))
      .limit(1);
    if (!h) throw notFound('The harness');
    return h.id;
  }
  const ownHarness = (req: Request) => shopHarness(req, idParam(req, 'harnessId'));
  const pinParam = (req: Request) => {
    const pin = String(req.params.pin ?? '');
    if (!pinPattern.test(pin)) throw new HttpError(400, 'invalid_request', `"${pin}" is not a pin; write it as COMPONENT.PIN, e.g. X12.3.`, [{ path: '$.pin', message: 'Not COMPONENT.PIN' }]);
    return pin;
  };

  router.put('/harnesses/:harnessId/tolerances/:pin', requireAuth, requireRole('lead', 'owner'), async (req, res) => {
    const harnessId = await ownHarness(req);
    const pin = pinParam(req);
    const body = parseBody(toleranceSchema, req.body);
    await db
      .insert(pinTolerances)
      .values({ shopId: req.auth.shopId, harnessId, pin, below: body.below, above: body.above, setBy: req.auth.userId, setAt: new Date() })
      .onDuplicateKeyUpdate({ set: { below: body.below, above: body.above, setBy: req.auth.userId, setAt: new Date() } });
    res.json({ pin, ...body });
  });

  router.delete('/harnesses/:harnessId/tolerances/:pin', requireAuth, requireRole('lead', 'owner'), async (req, res) => {
    const harnessId = await ownHarness(req);
    await db.delete(pinTolerances).where(and(eq(pinTolerances.harnessId, harnessId), eq(pinTolerances.pin, pinParam(req))));
    res.status(204).end();
  });

  // ------------------------------------------------------------------ reading sets

  /** The order and unit a set is kept with must be the shop's, and the taker must work on the order. */
  async function checkLinks(req: Request, links: { repairOrderId?: string | null; unitId?: string | null }) {
    if (links.repairOrderId) requireWorkOn(req, await loadOrder(db, req, links.repairOrderId), 'record readings on');
    if (links.unitId) {
      const [u] = await db
        .select({ id: units.id })
        .from(units)
        .where(and(eq(units.id, links.unitId), eq(units.shopId, req.auth.shopId)))
        .limit(1);
      if (!u) throw new HttpError(400, 'invalid_request', 'The unit named is not one of this shop’s.', [{ path: '$.unitId', message: 'Unknown unit' }]);
    }
  }

  const oneSet = async (req: Request, id: string) => {
    const [view] = await readingSetViews(db, req.auth.shopId, { ids: [id] });
    if (!view) throw notFound('The reading set');
    return view;
  };

  router.post('/reading-sets', requireAuth, takers, async (req, res) => {
    const body = parseBody(readingSetCreateSchema, req.body);
    await checkLinks(req, body);
    const { revision, result } = await evaluationFor(req, body.revisionId, body.observations);
    const id = newId();
    await db.insert(readingSets).values({
      id,
      shopId: req.auth.shopId,
      revisionId: revision.id,
      harnessId: revision.harnessId,
      repairOrderId: body.repairOrderId ?? null,
      unitId: body.unitId ?? null,
      title: body.title ?? null,
      observations: body.observations,
      marked: result.readings,
      suspects: { suspects: result.suspects, nextUnplug: result.nextUnplug },
      takenBy: req.auth.userId,
    });
    res.status(201).json(await oneSet(req, id));
  });

  router.get('/reading-sets', requireAuth, async (req, res) => {
    const q = parseQuery(readingSetListQuerySchema, req.query);
    const sets = await readingSetViews(db, req.auth.shopId, {
      repairOrderId: q.repairOrderId,
      revisionId: q.revisionId,
      harnessId: q.harnessId,
      takenBy: q.mine ? req.auth.userId : undefined,
    });
    res.json({ readingSets: sets });
  });

  router.get('/reading-sets/:id', requireAuth, async (req, res) => {
    res.json(await oneSet(req, idParam(req, 'id', 'The reading set')));
  });

  const mayChange = (req: Request, takenBy: string | null) => {
    if (req.auth.role === 'lead' || req.auth.role === 'owner' || (req.auth.role === 'tech' && takenBy === req.auth.userId)) return;
    throw new HttpError(403, 'forbidden', 'Only the technician who took these readings, or a lead, may change them.');
  };

  router.put('/reading-sets/:id', requireAuth, takers, async (req, res) => {
    const id = idParam(req, 'id', 'The reading set');
    const body = parseBody(readingSetUpdateSchema, req.body);
    const current = await oneSet(req, id);
    mayChange(req, current.takenBy?.id ?? null);
    const { result } = await evaluationFor(req, current.revisionId, body.observations);
    const [update] = await db
      .update(readingSets)
      .set({
        observations: body.observations,
        marked: result.readings,
        suspects: { suspects: result.suspects, nextUnplug: result.nextUnplug },
        ...(body.title !== undefined ? { title: body.title } : {}),
        version: sql`${readingSets.version} + 1`,
        updatedAt: new Date(),
      })
      .where(and(eq(readingSets.id, id), eq(readingSets.shopId, req.auth.shopId), eq(readingSets.version, body.version)));
    if (update.affectedRows !== 1) {
      const now = await oneSet(req, id);
      throw new HttpError(409, 'version_conflict', `These readings were changed since you opened them (now version ${now.version}). Reload them, then add yours again.`, {
        current: { version: now.version, updatedAt: now.updatedAt },
      });
    }
    res.json(await oneSet(req, id));
  });

  router.delete('/reading-sets/:id', requireAuth, takers, async (req, res) => {
    const id = idParam(req, 'id', 'The reading set');
    const current = await oneSet(req, id);
    mayChange(req, current.takenBy?.id ?? null);
    await db.delete(readingSets).where(and(eq(readingSets.id, id), eq(readingSets.shopId, req.auth.shopId)));
    res.status(204).end();
  });

  // ------------------------------------------------------------------ connector bookmarks

  /** The connector's label in the newest revision of its harness that has it. */
  async function connectorLabel(harnessId: string, connectorId: string): Promise<string | null> {
    const [row] = await db
      .select({ label: components.label })
      .from(components)
      .innerJoin(revisions, eq(revisions.id, components.revisionId))
      .where(and(eq(revisions.harnessId, harnessId), eq(components.key, connectorId)))
      .orderBy(desc(revisions.number))
      .limit(1);
    return row?.label ?? null;
  }

  router.get('/connector-bookmarks', requireAuth, async (req, res) => {
    const rows = await db
      .select({ b: connectorBookmarks, harnessName: harnesses.name })
      .from(connectorBookmarks)
      .innerJoin(harnesses, eq(harnesses.id, connectorBookmarks.harnessId))
      .where(and(eq(connectorBookmarks.userId, req.auth.userId), eq(connectorBookmarks.shopId, req.auth.shopId)))
      .orderBy(desc(connectorBookmarks.openedAt))
      .limit(60);
    const all: ConnectorBookmark[] = await Promise.all(
      rows.map(async ({ b, harnessName }) => ({
        harnessId: b.harnessId,
        harnessName,
        connectorId: b.connectorId,
        label: await connectorLabel(b.harnessId, b.connectorId),
        openedAt: b.openedAt?.toISOString() ?? null,
        pinned: b.pinned,
      })),
    );
    res.json({ pinned: all.filter((b) => b.pinned), recent: all.filter((b) => b.openedAt).slice(0, 12) });
  });

  async function bookmark(req: Request, harnessId: string, connectorId: string, set: { pinned?: boolean; openedAt?: Date }) {
    await shopHarness(req, harnessId);
    const [c] = await db
      .select({ kind: components.kind })
      .from(components)
      .innerJoin(revisions, eq(revisions.id, components.revisionId))
      .where(and(eq(revisions.harnessId, harnessId), eq(components.key, connectorId)))
      .limit(1);
    if (c?.kind !== 'connector') {
      throw new HttpError(400, 'invalid_request', `This harness has no connector "${connectorId}".`, [{ path: '$.connectorId', message: 'Not a connector of this harness' }]);
    }
    await db
      .insert(connectorBookmarks)
      .values({ userId: req.auth.userId, shopId: req.auth.shopId, harnessId, connectorId, pinned: set.pinned ?? false, openedAt: set.openedAt ?? null })
      .onDuplicateKeyUpdate({ set });
  }

  router.post('/connector-bookmarks/opened', requireAuth, async (req, res) => {
    const body = parseBody(bookmarkOpenedSchema, req.body);
    await bookmark(req, body.harnessId, body.connectorId, { openedAt: new Date() });
    res.status(204).end();
  });

  router.put('/connector-bookmarks/pinned', requireAuth, async (req, res) => {
    const body = parseBody(bookmarkPinnedSchema, req.body);
    await bookmark(req, body.harnessId, body.connectorId, { pinned: body.pinned });
    res.status(204).end();
  });

  return router;
}

import { Router, type Request } from 'express';
import type { z } from 'zod';
import {
  clampCreateSchema,
  componentCreateSchema,
  documentPutSchema,
  faultsBodySchema,
  itemPatchSchema,
  ohmsQuerySchema,
  pinCreateSchema,
  positionsPutSchema,
  publishSchema,
  readingsQuerySchema,
  stateCreateSchema,
  suspectsBodySchema,
  versionQuerySchema,
  walkQuerySchema,
  wireCreateSchema,
} from '../../shared/api/harness';
import { diffDocuments } from '../../shared/harness/diff';
import type { AppDeps } from '../deps';
import { HttpError, parseBody, parseQuery } from '../errors';
import { requireAuth, requireRole } from '../auth/middleware';
import { addItem, addPin, removeItem, removePin, updateItem, updatePin, type Section } from '../harness/edits';
import { engineFor } from '../harness/engine';
import { discardDraft, publishDraft, readDocument, saveDraft, toSummary, validOrThrow, visibleRevision, visibleRevisionKey } from '../harness/revisions';
import { documentJson, idParam } from './harnesses';

const writers = requireRole('lead', 'owner');

/** The version a DELETE carries: `?version=N` or `{ version }` in the body. */
function deleteVersion(req: Request): number {
  return parseQuery(versionQuerySchema, { version: req.query.version ?? (req.body as { version?: unknown } | undefined)?.version }).version;
}

/** Component, wire, clamp and state ids as the document writes them; anything else is not there. */
function itemParam(req: Request, name: string, what: string): string {
  const v = req.params[name];
  if (typeof v !== 'string' || !/^[A-Za-z0-9_+-]{1,32}$/.test(v)) throw new HttpError(404, 'not_found', `The ${what} ${String(v)} is not in this revision.`);
  return v;
}

export function revisionsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  const revId = (req: Request) => idParam(req, 'id', 'The revision');

  // ------------------------------------------------------------ reading

  /** `GET /api/revisions/:id` → `{ revision, document, positions }` */
  router.get('/:id', requireAuth, async (req, res) => {
    const row = await visibleRevision(db, req.auth, revId(req));
    const { document, positions } = await readDocument(db, row.id);
    res.json({ revision: toSummary(row), document, positions });
  });

  /** `GET /api/revisions/:id/export` → the document (harness-format.md) */
  router.get('/:id/export', requireAuth, async (req, res) => {
    const row = await visibleRevision(db, req.auth, revId(req));
    const { document } = await readDocument(db, row.id);
    if (req.query.download !== undefined) {
      const file = String(document.name || 'harness').replace(/[^A-Za-z0-9_-]+/g, '-').slice(0, 80) || 'harness';
      res.attachment(`${file}-rev${row.number}.json`);
    }
    res.json(document);
  });

  /** `GET /api/revisions/:a/diff/:b` → `{ from, to, diff }` (what changed from a to b) */
  router.get('/:id/diff/:other', requireAuth, async (req, res) => {
    const a = await visibleRevision(db, req.auth, revId(req));
    const b = await visibleRevision(db, req.auth, idParam(req, 'other', 'The revision'));
    const [da, dbDoc] = await Promise.all([readDocument(db, a.id), readDocument(db, b.id)]);
    res.json({ from: toSummary(a), to: toSummary(b), diff: diffDocuments(da.document, dbDoc.document) });
  });

  // ------------------------------------------------------------ whole-draft writes

  /** `PUT /api/revisions/:id/document` `{ version, document, positions? }` → `{ version, revision }` */
  router.put('/:id/document', writers, documentJson, async (req, res) => {
    const id = revId(req);
    const body = parseBody(documentPutSchema, req.body);
    const document = validOrThrow(body.document);
    const revision = await saveDraft(db, req.auth, id, body.version, async () => ({ document, positions: body.positions }));
    res.json({ version: revision.version, revision });
  });

  /** `PUT /api/revisions/:id/positions` `{ version, positions }` → `{ version, revision }` */
  router.put('/:id/positions', writers, async (req, res) => {
    const body = parseBody(positionsPutSchema, req.body);
    const revision = await saveDraft(db, req.auth, revId(req), body.version, async () => ({ positions: body.positions, positionsOnly: true }));
    res.json({ version: revision.version, revision });
  });

  /** `POST /api/revisions/:id/publish` `{ note?, version? }` → `{ revision }` */
  router.post('/:id/publish', writers, async (req, res) => {
    const body = parseBody(publishSchema, req.body);
    const revision = await publishDraft(db, req.auth, revId(req), body.note, body.version);
    res.json({ revision });
  });

  /** `DELETE /api/revisions/:id` → 204: discards a draft (a harness's only revision cannot go) */
  router.delete('/:id', writers, async (req, res) => {
    await discardDraft(db, req.auth, revId(req));
    res.status(204).end();
  });

  // ------------------------------------------------------------ granular edits

  type Doc = Record<string, unknown>;
  const edit = async (req: Request, version: number, change: (doc: Doc, positions: Record<string, { x: number; y: number }>) => { document: Doc; positions?: Record<string, { x: number; y: number }> }) => {
    const revision = await saveDraft(db, req.auth, revId(req), version, async (current) => {
      const { document, positions } = await current();
      const next = change(document, positions);
      return { document: next.document, positions: next.positions ?? positions };
    });
    return { version: revision.version, revision };
  };

  const sections: Array<{ path: string; section: Exclude<Section, 'components'>; what: string; schema: z.ZodType<{ version: number } & Record<string, unknown>>; key: string }> = [
    { path: 'wires', section: 'wires', what: 'wire', schema: wireCreateSchema, key: 'wire' },
    { path: 'clamps', section: 'clamps', what: 'clamp', schema: clampCreateSchema, key: 'clamp' },
    { path: 'states', section: 'states', what: 'state', schema: stateCreateSchema, key: 'state' },
  ];

  /** `POST /api/revisions/:id/components` `{ version, component, position? }` → 201 `{ version, revision }` */
  router.post('/:id/components', writers, async (req, res) => {
    const body = parseBody(componentCreateSchema, req.body);
    const out = await edit(req, body.version, (doc, positions) => ({
      document: addItem(doc, 'components', body.component),
      positions: body.position && typeof body.component.id === 'string' ? { ...positions, [body.component.id]: body.position } : positions,
    }));
    res.status(201).json(out);
  });
  /** `PATCH /api/revisions/:id/components/:componentId` `{ version, changes }` (null removes a field) → `{ version, revision }` */
  router.patch('/:id/components/:componentId', writers, async (req, res) => {
    const body = parseBody(itemPatchSchema, req.body);
    const cid = itemParam(req, 'componentId', 'component');
    res.json(await edit(req, body.version, (doc) => ({ document: updateItem(doc, 'components', cid, body.changes) })));
  });
  /** `DELETE /api/revisions/:id/components/:componentId?version=N` → `{ version, revision }` (its wires go too) */
  router.delete('/:id/components/:componentId', writers, async (req, res) => {
    const version = deleteVersion(req);
    const cid = itemParam(req, 'componentId', 'component');
    res.json(
      await edit(req, version, (doc, positions) => {
        const { [cid]: _gone, ...rest } = positions;
        return { document: removeItem(doc, 'components', cid), positions: rest };
      }),
    );
  });

  /** `POST /api/revisions/:id/components/:componentId/pins` `{ version, pin }` (a cavity id, or `{ id, … }`) → 201 */
  router.post('/:id/components/:componentId/pins', writers, async (req, res) => {
    const body = parseBody(pinCreateSchema, req.body);
    const cid = itemParam(req, 'componentId', 'component');
    res.status(201).json(await edit(req, body.version, (doc) => ({ document: addPin(doc, cid, body.pin) })));
  });
  /** `PATCH /api/revisions/:id/components/:componentId/pins/:pinId` `{ version, changes }` */
  router.patch('/:id/components/:componentId/pins/:pinId', writers, async (req, res) => {
    const body = parseBody(itemPatchSchema, req.body);
    const cid = itemParam(req, 'componentId', 'component');
    const pid = itemParam(req, 'pinId', 'pin');
    res.json(await edit(req, body.version, (doc) => ({ document: updatePin(doc, cid, pid, body.changes) })));
  });
  /** `DELETE /api/revisions/:id/components/:componentId/pins/:pinId?version=N` (its wires go too) */
  router.delete('/:id/components/:componentId/pins/:pinId', writers, async (req, res) => {
    const version = deleteVersion(req);
    const cid = itemParam(req, 'componentId', 'component');
    const pid = itemParam(req, 'pinId', 'pin');
    res.json(await edit(req, version, (doc) => ({ document: removePin(doc, cid, pid) })));
  });

  for (const s of sections) {
    /** `POST /api/revisions/:id/<wires|clamps|states>` `{ version, <wire|clamp|state> }` → 201 `{ version, revision }` */
    router.post(`/:id/${s.path}`, writers, async (req, res) => {
      const body = parseBody(s.schema, req.body);
      const item = body[s.key] as Record<string, unknown>;
      res.status(201).json(await edit(req, body.version, (doc) => ({ document: addItem(doc, s.section, item) })));
    });
    /** `PATCH /api/revisions/:id/<section>/:itemId` `{ version, changes }` */
    router.patch(`/:id/${s.path}/:itemId`, writers, async (req, res) => {
      const body = parseBody(itemPatchSchema, req.body);
      const itemId = itemParam(req, 'itemId', s.what);
      res.json(await edit(req, body.version, (doc) => ({ document: updateItem(doc, s.section, itemId, body.changes) })));
    });
    /** `DELETE /api/revisions/:id/<section>/:itemId?version=N` */
    router.delete(`/:id/${s.path}/:itemId`, writers, async (req, res) => {
      const version = deleteVersion(req);
      const itemId = itemParam(req, 'itemId', s.what);
      res.json(await edit(req, version, (doc) => ({ document: removeItem(doc, s.section, itemId) })));
    });
  }

  // ------------------------------------------------------------ engine (harness-format.md)

  const engine = async (req: Request) => {
    const row = await visibleRevisionKey(db, req.auth, revId(req));
    return engineFor(db, row);
  };

  /** `GET /api/revisions/:id/readings?state=S` → `{ state, pins: [{ ref, volts }] }` */
  router.get('/:id/readings', requireAuth, async (req, res) => {
    const q = parseQuery(readingsQuerySchema, req.query);
    // The bytes are kept per revision (and version) and state, so is their ETag: nothing to hash per request.
    const { body, etag } = (await engine(req)).readingsJson(q.state);
    // A browser may keep them but asks every time (the session and the revision are checked
    // above); an If-None-Match with this ETag answers 304 without the body (res.send does that).
    res.set({ ETag: etag, 'Cache-Control': 'private, no-cache' }).type('application/json').send(body);
  });

  /** `GET /api/revisions/:id/ohms?a=P&b=Q&state=S` → `{ ohms }` */
  router.get('/:id/ohms', requireAuth, async (req, res) => {
    const q = parseQuery(ohmsQuerySchema, req.query);
    res.json((await engine(req)).ohms(q.a, q.b, q.state));
  });

  /** `GET /api/revisions/:id/walk?from=P&to=Q[&state=S]` → `{ paths: [{ steps }] }` */
  router.get('/:id/walk', requireAuth, async (req, res) => {
    const q = parseQuery(walkQuerySchema, req.query);
    res.json((await engine(req)).walk(q.from, q.to, q.state));
  });

  /** `POST /api/revisions/:id/suspects` `{ observations }` → `{ suspects: [{ fault, score, … }], nextUnplug }` */
  router.post('/:id/suspects', requireAuth, async (req, res) => {
    const body = parseBody(suspectsBodySchema, req.body);
    res.json((await engine(req)).suspects(body.observations));
  });

  /** `POST /api/revisions/:id/faults` `{ fault, state? }` → readings with the fault applied, and fuses that would blow */
  router.post('/:id/faults', requireAuth, async (req, res) => {
    const body = parseBody(faultsBodySchema, req.body);
    res.json((await engine(req)).fault(body.fault, body.state));
  });

  return router;
}

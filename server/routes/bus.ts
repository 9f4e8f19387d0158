/**
 * Bus messages: the catalogue of a revision, captures of a harness's bus, comparisons and
 * findings filed into a draft's catalogue.
 *
 *   GET    /api/revisions/:id/messages                 any role (techs: published only)
 *   POST   /api/revisions/:id/messages                 lead, owner  { version, message }
 *   PUT    /api/revisions/:id/messages/:key            lead, owner  { version, message }
 *   DELETE /api/revisions/:id/messages/:key?version=N  lead, owner
 *   POST   /api/revisions/:id/messages/:key/signals    lead, owner  { version, signal }
 *   POST   /api/revisions/:id/findings                 lead, owner  { version, rest, moved, key, index, name?, sender?, notes? }
 *   GET    /api/harnesses/:id/captures                 any role
 *   POST   /api/harnesses/:id/captures                 lead, owner, tech  multipart: file (candump -l log), name?
 *   GET    /api/captures/:id                           any role  { capture, summary }
 *   GET    /api/captures/:id/file                      any role  the log as uploaded
 *   DELETE /api/captures/:id                           lead, owner, or who uploaded it
 *   GET    /api/captures/:rest/compare/:moved[?revision=R]  any role
 */
import { readFile, rm } from 'node:fs/promises';
import { Router, type Request } from 'express';
import { and, eq } from 'drizzle-orm';
import {
  captureUploadFieldsSchema,
  compareQuerySchema,
  findingSchema,
  messageCreateSchema,
  messageKey,
  messageKeyPattern,
  messagePutSchema,
  signalBytes,
  signalCreateSchema,
  type CatalogueResponse,
  type CompareResponse,
} from '../../shared/api/bus';
import { versionQuerySchema } from '../../shared/api/harness';
import { compareCaptures } from '../../shared/can/compare';
import type { AppDeps } from '../deps';
import { HttpError, notFound, parseBody, parseQuery } from '../errors';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { captures } from '../db/schema/bus';
import { harnesses } from '../db/schema/harness';
import { readDocument, toSummary, visibleRevision } from '../harness/revisions';
import { editMessages, fileFinding, indexOfKey, listCaptures, loadCapture, messagesOf, modulesOf, views } from '../bus/catalogue';
import { captureUpload, type SummarisedFile } from '../bus/upload';
import { idParam } from './harnesses';

const writers = requireRole('lead', 'owner');

function keyParam(req: Request): string {
  const v = req.params.key;
  if (typeof v !== 'string' || !messageKeyPattern.test(v)) throw new HttpError(404, 'not_found', `The message ${String(v)} is not in this catalogue.`);
  return v.toUpperCase();
}

export function busRouter(deps: AppDeps): Router {
  const { db, storage } = deps;
  const router = Router();
  const revId = (req: Request) => idParam(req, 'id', 'The revision');
  const upload = captureUpload(deps.config.dataDir);

  // ------------------------------------------------------------ catalogue

  router.get('/revisions/:id/messages', requireAuth, async (req, res) => {
    const row = await visibleRevision(db, req.auth, revId(req));
    const { document } = await readDocument(db, row.id);
    const s = toSummary(row);
    const body: CatalogueResponse = {
      revision: { id: s.id, status: s.status, version: s.version, harnessId: s.harnessId, number: s.number },
      messages: views(document),
      modules: modulesOf(document),
    };
    res.json(body);
  });

  const answer = (document: Record<string, unknown>, version: number, key?: string) => {
    const all = views(document);
    return { version, messages: all, message: key ? all.find((v) => v.key === key) ?? null : null };
  };

  router.post('/revisions/:id/messages', writers, async (req, res) => {
    const body = parseBody(messageCreateSchema, req.body);
    const key = messageKey(body.message);
    const { revision, document } = await editMessages(db, req.auth, revId(req), body.version, (messages) => {
      if (indexOfKey(messages, key) >= 0) throw new HttpError(409, 'message_exists', `${key} is in the catalogue already. Edit it instead.`);
      return [...messages, body.message];
    });
    res.status(201).json(answer(document, revision.version, key));
  });

  router.put('/revisions/:id/messages/:key', writers, async (req, res) => {
    const key = keyParam(req);
    const body = parseBody(messagePutSchema, req.body);
    const newKey = messageKey(body.message);
    const { revision, document } = await editMessages(db, req.auth, revId(req), body.version, (messages) => {
      const at = indexOfKey(messages, key);
      if (at < 0) throw new HttpError(404, 'not_found', `The message ${key} is not in this catalogue.`);
      if (newKey !== key && indexOfKey(messages, newKey) >= 0) throw new HttpError(409, 'message_exists', `${newKey} is in the catalogue already.`);
      messages[at] = body.message;
      return messages;
    });
    res.json(answer(document, revision.version, newKey));
  });

  router.delete('/revisions/:id/messages/:key', writers, async (req, res) => {
    const key = keyParam(req);
    const { version } = parseQuery(versionQuerySchema, { version: req.query.version ?? (req.body as { version?: unknown } | undefined)?.version });
    const { revision, document } = await editMessages(db, req.auth, revId(req), version, (messages) => {
      const at = indexOfKey(messages, key);
      if (at < 0) throw new HttpError(404, 'not_found', `The message ${key} is not in this catalogue.`);
      messages.splice(at, 1);
      return messages;
    });
    res.json(answer(document, revision.version));
  });

  router.post('/revisions/:id/messages/:key/signals', writers, async (req, res) => {
    const key = keyParam(req);
    const body = parseBody(signalCreateSchema, req.body);
    const { revision, document } = await editMessages(db, req.auth, revId(req), body.version, (messages) => {
      const at = indexOfKey(messages, key);
      if (at < 0) throw new HttpError(404, 'not_found', `The message ${key} is not in this catalogue.`);
      const m = messages[at];
      if ((m.signals ?? []).some((s) => s.name === body.signal.name)) throw new HttpError(409, 'signal_exists', `${key} already has a signal named "${body.signal.name}".`);
      m.signals = [...(m.signals ?? []), body.signal];
      return messages;
    });
    res.status(201).json(answer(document, revision.version, key));
  });

  router.post('/revisions/:id/findings', writers, async (req, res) => {
    const body = parseBody(findingSchema, req.body);
    const id = revId(req);
    await visibleRevision(db, req.auth, id);
    res.status(201).json(await fileFinding(db, req.auth, id, body));
  });

  // ------------------------------------------------------------ captures

  const harnessInShop = async (req: Request) => {
    const hid = idParam(req, 'id', 'The harness');
    const [h] = await db.select({ id: harnesses.id }).from(harnesses).where(and(eq(harnesses.id, hid), eq(harnesses.shopId, req.auth.shopId))).limit(1);
    if (!h) throw notFound('The harness');
    return hid;
  };

  router.get('/harnesses/:id/captures', requireAuth, async (req, res) => {
    const hid = await harnessInShop(req);
    res.json({ captures: await listCaptures(db, req.auth.shopId, hid) });
  });

  router.post('/harnesses/:id/captures', requireRole('lead', 'owner', 'tech'), async (req, res) => {
    let file: SummarisedFile | undefined;
    try {
      const hid = await harnessInShop(req);
      await new Promise<void>((resolve, reject) => upload(req, res, (err?: unknown) => (err ? reject(err) : resolve())));
      file = req.file as SummarisedFile | undefined;
      if (!file) throw new HttpError(400, 'invalid_request', 'Attach one candump log as the field "file".');
      const fields = parseBody(captureUploadFieldsSchema, req.body);
      const summary = file.summary;
      if (summary.frames === 0) {
        const first = summary.badLines[0];
        throw new HttpError(
          422,
          'invalid_capture',
          first ? `No frame could be read. Line ${first.lineNo}: ${first.reason}. Record the log with candump -l.` : 'The file holds no frames. Record the log with candump -l.',
          summary.badLines.slice(0, 20).map((b) => ({ path: `line ${b.lineNo}`, message: b.reason })),
        );
      }
      const id = newId();
      const storageKey = `captures/${req.auth.shopId}/${id}.log`;
      if (storage.putFile) await storage.putFile(storageKey, file.path, 'text/plain');
      else await storage.put(storageKey, await readFile(file.path), 'text/plain');
      const fileName = (file.originalname || 'capture.log').slice(0, 255);
      const name = fields.name || fileName.replace(/\.[A-Za-z0-9]{1,5}$/, '') || 'Capture';
      const durationS = summary.firstTime !== null && summary.lastTime !== null ? summary.lastTime - summary.firstTime : null;
      const revisionId = typeof req.query.revision === 'string' && /^[a-z2-7]{26}$/.test(req.query.revision) ? req.query.revision : null;
      try {
        await db.insert(captures).values({
          id,
          shopId: req.auth.shopId,
          harnessId: hid,
          revisionId: revisionId ? (await visibleRevision(db, req.auth, revisionId)).id : null,
          name: name.slice(0, 200),
          fileName,
          sizeBytes: file.size,
          lines: summary.lines,
          frames: summary.frames,
          badLineCount: summary.badLineCount,
          identifierCount: summary.identifiers.length,
          durationS,
          summary,
          storageKey,
          uploadedBy: req.auth.userId,
          uploadedAt: new Date(),
        });
      } catch (err) {
        await storage.delete(storageKey).catch(() => undefined);
        throw err;
      }
      const { row } = await loadCapture(db, req.auth.shopId, id, false);
      res.status(201).json({ capture: row, badLines: summary.badLines, droppedFrames: summary.droppedFrames });
    } finally {
      if (file?.path) await rm(file.path, { force: true }).catch(() => undefined);
    }
  });

  router.get('/captures/:rest/compare/:moved', requireAuth, async (req, res) => {
    const restId = idParam(req, 'rest', 'The capture');
    const movedId = idParam(req, 'moved', 'The capture');
    const q = parseQuery(compareQuerySchema, req.query);
    const [rest, moved] = await Promise.all([loadCapture(db, req.auth.shopId, restId), loadCapture(db, req.auth.shopId, movedId)]);
    const comparison = compareCaptures(rest.summary!, moved.summary!);
    const catalogued: CompareResponse['catalogued'] = { messages: [], bytes: [] };
    if (q.revision) {
      const row = await visibleRevision(db, req.auth, q.revision);
      const { document } = await readDocument(db, row.id);
      for (const m of messagesOf(document)) {
        const key = messageKey(m);
        catalogued.messages.push(key);
        for (const s of m.signals ?? []) for (const b of signalBytes(s)) catalogued.bytes.push(`${key}:${b}`);
      }
    }
    const body: CompareResponse = { rest: rest.row, moved: moved.row, comparison, catalogued };
    res.json(body);
  });

  router.get('/captures/:id', requireAuth, async (req, res) => {
    const c = await loadCapture(db, req.auth.shopId, idParam(req, 'id', 'The capture'));
    res.json({ capture: c.row, summary: c.summary });
  });

  router.get('/captures/:id/file', requireAuth, async (req, res) => {
    const c = await loadCapture(db, req.auth.shopId, idParam(req, 'id', 'The capture'), false);
    const found = await storage.get(c.storageKey);
    if (!found) throw new HttpError(404, 'not_found', 'The capture file is missing from storage.');
    res.attachment(c.row.fileName.replace(/[^A-Za-z0-9_.-]+/g, '-') || 'capture.log');
    res.type('text/plain').send(found.data);
  });

  router.delete('/captures/:id', requireAuth, async (req, res) => {
    const c = await loadCapture(db, req.auth.shopId, idParam(req, 'id', 'The capture'), false);
    const mayDelete = req.auth.role === 'lead' || req.auth.role === 'owner' || c.row.uploadedBy?.id === req.auth.userId;
    if (!mayDelete) throw new HttpError(403, 'forbidden', 'Only a lead, an owner or the person who uploaded it can delete a capture.');
    await db.delete(captures).where(and(eq(captures.id, c.row.id), eq(captures.shopId, req.auth.shopId)));
    await storage.delete(c.storageKey).catch(() => undefined);
    res.status(204).end();
  });

  return router;
}

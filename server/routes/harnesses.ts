import express, { Router, type Request, type RequestHandler } from 'express';
import multer from 'multer';
import { harnessListQuerySchema, harnessUpdateSchema, importQuerySchema } from '../../shared/api/harness';
import { and, eq } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import { equipmentModels, harnesses } from '../db/schema/harness';
import { HttpError, notFound, parseBody, parseQuery } from '../errors';
import { requireAuth, requireRole } from '../auth/middleware';
import { deleteHarness, getHarness, listHarnesses } from '../harness/harnesses';
import { parseJsonUpload, refuseDeepJson } from '../harness/json-guard';
import { importHarness, revisionsOfHarness, startDraft } from '../harness/revisions';
import { harnessesChanged } from '../harness/shop-changes';

/** Largest harness document accepted, as a JSON body or an uploaded file. */
export const MAX_DOCUMENT_BYTES = 20 * 1024 * 1024;

const idPattern = /^[a-z2-7]{26}$/;
/** The `:id` of the address, or 404 when it cannot be one of ours. */
export function idParam(req: Request, name = 'id', what = 'The harness'): string {
  const value = req.params[name];
  if (typeof value !== 'string' || !idPattern.test(value)) throw notFound(what);
  return value;
}

/** JSON bodies up to 20 MB, nesting checked before parsing (mounted only on the routes that take documents). */
export const documentJson: RequestHandler = express.json({
  limit: MAX_DOCUMENT_BYTES,
  verify: (_req, _res, buf) => refuseDeepJson(buf),
});

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_DOCUMENT_BYTES, files: 1, fields: 5, parts: 6 },
  fileFilter: (_req, file, cb) => {
    const jsonType = /^application\/json\b/.test(file.mimetype) || file.mimetype === 'text/plain' || file.mimetype === 'application/octet-stream';
    if (file.fieldname !== 'file') return cb(new HttpError(400, 'invalid_upload', `Send the document in the form field "file", not "${file.fieldname}".`));
    if (!jsonType || !/\.json$/i.test(file.originalname || 'x.json')) {
      return cb(new HttpError(415, 'unsupported_type', 'Upload the harness document as a .json file (application/json).'));
    }
    cb(null, true);
  },
});

/** Multipart uploads through multer; JSON bodies through the large parser; anything else 415. */
const importBody: RequestHandler = (req, res, next) => {
  if (req.is('multipart/form-data')) {
    return upload.single('file')(req, res, (err?: unknown) => {
      if ((err as { code?: string } | undefined)?.code === 'LIMIT_UNEXPECTED_FILE') {
        const field = (err as { field?: string }).field;
        return next(new HttpError(400, 'invalid_upload', `Send one document in the form field "file"${field ? `, not "${field}"` : ''}.`));
      }
      next(err);
    });
  }
  if (req.is('application/json')) return documentJson(req, res, next);
  next(new HttpError(415, 'unsupported_type', 'Send the harness document as application/json, or as a multipart upload with one .json file in the field "file".'));
};

export function harnessesRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  /** `GET /api/harnesses?model=&q=` → `{ harnesses: HarnessSummary[] }` */
  router.get('/', requireAuth, async (req, res) => {
    const q = parseQuery(harnessListQuerySchema, req.query);
    res.json({ harnesses: await listHarnesses(db, req.auth, { modelId: q.model, q: q.q }) });
  });

  /** `POST /api/harnesses/import[?model=ID]` (the document) → 201 `{ harnessId, revisionId }` */
  router.post('/import', requireRole('lead', 'owner'), importBody, async (req, res) => {
    const q = parseQuery(importQuerySchema, req.query);
    let input: unknown;
    if (req.file) input = parseJsonUpload(req.file.buffer);
    else if (req.is('multipart/form-data')) throw new HttpError(400, 'invalid_upload', 'The upload has no file: send the document in the form field "file".');
    else input = req.body;
    if (input === undefined) throw new HttpError(400, 'invalid_request', 'Send the harness document as the JSON body.');
    const result = await importHarness(db, req.auth, input, { modelId: q.model });
    res.status(201).json(result);
  });

  /** `GET /api/harnesses/:id` → `{ harness, revisions }` */
  router.get('/:id', requireAuth, async (req, res) => {
    const id = idParam(req);
    const harness = await getHarness(db, req.auth, id);
    res.json({ harness, revisions: await revisionsOfHarness(db, req.auth, id) });
  });

  /** `PATCH /api/harnesses/:id` `{ name?, modelId? }` → `{ harness }` */
  router.patch('/:id', requireRole('lead', 'owner'), async (req, res) => {
    const id = idParam(req);
    const body = parseBody(harnessUpdateSchema, req.body);
    await getHarness(db, req.auth, id);
    if (body.modelId) {
      const [m] = await db
        .select({ id: equipmentModels.id })
        .from(equipmentModels)
        .where(and(eq(equipmentModels.id, body.modelId), eq(equipmentModels.shopId, req.auth.shopId)));
      if (!m) throw new HttpError(404, 'not_found', 'The machine or attachment model was not found.');
    }
    await db
      .update(harnesses)
      .set({ ...(body.name !== undefined ? { name: body.name } : {}), ...(body.modelId !== undefined ? { modelId: body.modelId } : {}), updatedAt: new Date() })
      .where(and(eq(harnesses.id, id), eq(harnesses.shopId, req.auth.shopId)));
    harnessesChanged(req.auth.shopId);
    res.json({ harness: await getHarness(db, req.auth, id) });
  });

  /** `DELETE /api/harnesses/:id` → 204 (every revision goes with it) */
  router.delete('/:id', requireRole('lead', 'owner'), async (req, res) => {
    await deleteHarness(db, req.auth, idParam(req));
    res.status(204).end();
  });

  /** `POST /api/harnesses/:id/draft` → 201 `{ revision }` (new) or 200 `{ revision }` (the existing draft) */
  router.post('/:id/draft', requireRole('lead', 'owner'), async (req, res) => {
    const { created, revision } = await startDraft(db, req.auth, idParam(req));
    res.status(created ? 201 : 200).json({ revision, created });
  });

  return router;
}

import { and, eq } from 'drizzle-orm';
import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import multer, { MulterError } from 'multer';
import sharp from 'sharp';
import { attachmentUpdateSchema, idParam } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth } from '../auth/middleware';
import { newId } from '../db/ids';
import { orderAttachments } from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams } from '../errors';
import { canWorkOn, isDesk, loadOrder, requireWorkOn } from '../orders/access';
import { attachmentView, orderDetail, peopleById } from '../orders/views';

export const UPLOAD_LIMITS = { fileBytes: 15 * 1024 * 1024, files: 10 } as const;
const MB = (n: number) => `${Math.round(n / 1024 / 1024)} MB`;

/** What may be uploaded, by the file's content (never its name or the browser's claim). */
const ACCEPTED: Record<string, { kind: 'photo' | 'file'; ext: string }> = {
  'image/jpeg': { kind: 'photo', ext: 'jpg' },
  'image/png': { kind: 'photo', ext: 'png' },
  'image/webp': { kind: 'photo', ext: 'webp' },
  'application/pdf': { kind: 'file', ext: 'pdf' },
};
export const ACCEPTED_WORDS = 'photos (JPEG, PNG, WebP) and PDF files';

/**
 * A file name as sent: refused when it carries a path (`/`, `\`, `..`), control characters,
 * is empty or too long. Answers the problem in words, or null when the name is fine.
 */
export function filenameProblem(name: string): string | null {
  if (!name || !name.trim()) return 'has no name';
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f-\u009f]/.test(name)) return 'has control characters in its name';
  if (/[/\\]/.test(name) || name.split(/[/\\]/).includes('..') || name === '.' || name === '..') return 'has a folder path in its name';
  if (/[\u202a-\u202e\u2066-\u2069]/.test(name)) return 'has text-direction characters in its name';
  if ([...name].length > 200) return 'has a name longer than 200 characters';
  return null;
}

// eslint-disable-next-line no-control-regex
const shown = (name: string) => JSON.stringify(name.replace(/[\u0000-\u001f\u007f-\u009f]/g, '?').slice(0, 80));

const upload = multer({
  storage: multer.memoryStorage(),
  // Keep the name exactly as sent, so a hostile one is refused rather than quietly trimmed.
  preservePath: true,
  defParamCharset: 'utf8',
  limits: { fileSize: UPLOAD_LIMITS.fileBytes, files: UPLOAD_LIMITS.files, fields: 10, parts: UPLOAD_LIMITS.files + 10 },
}).array('files', UPLOAD_LIMITS.files);

/** multer with our own words for its limits. */
const receive: RequestHandler = (req: Request, res: Response, next: NextFunction) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `${err.field === 'files' ? 'A file' : 'The upload'} is larger than ${MB(UPLOAD_LIMITS.fileBytes)}; nothing was stored.`));
      if (err.code === 'LIMIT_FILE_COUNT' || (err.code === 'LIMIT_UNEXPECTED_FILE' && err.field === 'files'))
        return next(new HttpError(400, 'too_many_files', `Send at most ${UPLOAD_LIMITS.files} files at once; nothing was stored.`));
      if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(new HttpError(400, 'invalid_upload', `Send the files in the form field "files" (got "${err.field}"); nothing was stored.`));
      return next(new HttpError(400, 'invalid_upload', `${err.message}; nothing was stored.`));
    }
    // busboy: a malformed multipart body (e.g. a line break inside a file name).
    const message = err instanceof Error ? err.message : String(err);
    next(new HttpError(400, 'invalid_upload', `The upload could not be read (${message}); check the file names and try again. Nothing was stored.`));
  });
};

interface Checked {
  id: string;
  filename: string;
  contentType: string;
  kind: 'photo' | 'file';
  data: Buffer;
  thumb: Buffer | null;
  width: number | null;
  height: number | null;
}

async function check(file: Express.Multer.File, index: number): Promise<Checked> {
  const name = file.originalname;
  const problem = filenameProblem(name);
  if (problem) throw new HttpError(400, 'invalid_filename', `File ${index + 1} (${shown(name)}) ${problem}; rename it and try again. Nothing was stored.`, [{ path: `$.files[${index}]`, message: problem }]);
  if (file.size === 0) throw new HttpError(400, 'empty_file', `${shown(name)} is empty; nothing was stored.`, [{ path: `$.files[${index}]`, message: 'Empty file' }]);
  const type = await fileTypeFromBuffer(file.buffer);
  const accepted = type ? ACCEPTED[type.mime] : undefined;
  if (!type || !accepted) {
    throw new HttpError(415, 'unsupported_type', `${shown(name)} is ${type ? `a ${type.mime} file` : 'not a file type Wirewalk recognises'}; upload ${ACCEPTED_WORDS}. Nothing was stored.`, [
      { path: `$.files[${index}]`, message: 'Unsupported type' },
    ]);
  }
  let thumb: Buffer | null = null;
  let width: number | null = null;
  let height: number | null = null;
  if (accepted.kind === 'photo') {
    try {
      // failOn 'warning': a truncated or damaged image is refused, not half-decoded.
      const image = sharp(file.buffer, { failOn: 'warning', limitInputPixels: 100_000_000 });
      const meta = await image.metadata();
      // Making the thumbnail decodes the whole image: a damaged body fails here.
      const rotated = sharp(file.buffer, { failOn: 'warning', limitInputPixels: 100_000_000 }).rotate();
      thumb = await rotated.clone().resize(480, 480, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 80 }).toBuffer();
      const swap = (meta.orientation ?? 1) >= 5;
      width = (swap ? meta.height : meta.width) ?? null;
      height = (swap ? meta.width : meta.height) ?? null;
    } catch {
      throw new HttpError(422, 'corrupt_image', `${shown(name)} looks like a ${type.mime.replace('image/', '').toUpperCase()} image but cannot be read (damaged or cut short); nothing was stored.`, [
        { path: `$.files[${index}]`, message: 'Damaged image' },
      ]);
    }
  }
  return { id: newId(), filename: name.normalize('NFC'), contentType: type.mime, kind: accepted.kind, data: file.buffer, thumb, width, height };
}

/** RFC 6266 Content-Disposition with an ASCII fallback and the UTF-8 name. */
export function contentDisposition(kind: 'inline' | 'attachment', filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}

export const storageKey = (shopId: string, orderId: string, id: string, suffix = '') => `orders/${shopId}/${orderId}/${id}${suffix}`;

/**
 * Photos and files on an order. `POST /api/repair-orders/:id/attachments` (multipart, field
 * `files`, up to 10 at 15 MB) → 201 { attachments, order }; `GET /api/attachments/:id/file`
 * and `/thumb` (signed-in members of the shop only); `PATCH /api/attachments/:id`
 * { caption?, inReport? }; `DELETE /api/attachments/:id`. Mounted on /api.
 */
export function attachmentsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, storage } = deps;

  router.post('/repair-orders/:id/attachments', requireAuth, async (req, res, next) => {
    try {
      const { id } = parseParams(idParam, req.params);
      const order = await loadOrder(db, req, id);
      requireWorkOn(req, order, 'add photos to');
      next();
    } catch (err) {
      next(err);
    }
  }, receive, async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const order = await loadOrder(db, req, id);
    const files = (req.files as Express.Multer.File[] | undefined) ?? [];
    if (!files.length) throw new HttpError(400, 'no_files', `Choose at least one photo or file (form field "files", with a file name); nothing was stored.`);
    // Every file is checked before any is stored: one bad file refuses the whole upload.
    const checked: Checked[] = [];
    for (const [i, f] of files.entries()) checked.push(await check(f, i));
    const stored: string[] = [];
    const shopId = req.auth.shopId;
    try {
      for (const c of checked) {
        const key = storageKey(shopId, order.id, c.id);
        await storage.put(key, c.data, c.contentType);
        stored.push(key);
        if (c.thumb) {
          await storage.put(`${key}-thumb`, c.thumb, 'image/jpeg');
          stored.push(`${key}-thumb`);
        }
      }
      await db.transaction(async (tx) => {
        await tx.insert(orderAttachments).values(
          checked.map((c) => ({
            id: c.id,
            shopId,
            orderId: order.id,
            kind: c.kind,
            filename: c.filename,
            contentType: c.contentType,
            size: c.data.length,
            storageKey: storageKey(shopId, order.id, c.id),
            thumbKey: c.thumb ? storageKey(shopId, order.id, c.id, '-thumb') : null,
            width: c.width,
            height: c.height,
            inReport: c.kind === 'photo',
            uploadedBy: req.auth.userId,
          })),
        );
      });
    } catch (err) {
      await Promise.allSettled(stored.map((k) => storage.delete(k)));
      throw err;
    }
    const rows = await db.select().from(orderAttachments).where(and(eq(orderAttachments.orderId, order.id), eq(orderAttachments.shopId, shopId)));
    const people = await peopleById(db, [req.auth.userId]);
    const ids = new Set(checked.map((c) => c.id));
    res.status(201).json({ attachments: rows.filter((r) => ids.has(r.id)).map((r) => attachmentView(r, people)), order: await orderDetail(db, req, order) });
  });

  const loadAttachment = async (req: Request) => {
    const { id } = parseParams(idParam, req.params);
    const [row] = await db.select().from(orderAttachments).where(and(eq(orderAttachments.id, id), eq(orderAttachments.shopId, req.auth.shopId))).limit(1);
    if (!row) throw notFound('The file');
    return row;
  };

  const serve = (which: 'file' | 'thumb'): RequestHandler => async (req, res) => {
    const row = await loadAttachment(req);
    const key = which === 'file' ? row.storageKey : row.thumbKey;
    if (!key) throw notFound('The thumbnail');
    const found = await storage.get(key);
    if (!found) throw new HttpError(404, 'not_found', 'The file is missing from storage.');
    res.set('Content-Type', which === 'file' ? row.contentType : 'image/jpeg');
    res.set('Content-Disposition', contentDisposition(req.query.download ? 'attachment' : 'inline', which === 'file' ? row.filename : `thumb-${row.filename}.jpg`));
    res.set('Cache-Control', 'private, max-age=3600');
    res.set('Content-Security-Policy', "default-src 'none'; sandbox");
    res.send(found.data);
  };
  router.get('/attachments/:id/file', requireAuth, serve('file'));
  router.get('/attachments/:id/thumb', requireAuth, serve('thumb'));

  router.patch('/attachments/:id', requireAuth, async (req, res) => {
    const row = await loadAttachment(req);
    const body = parseBody(attachmentUpdateSchema, req.body);
    const order = await loadOrder(db, req, row.orderId);
    if (!isDesk(req.auth.role) && !canWorkOn(req, order)) requireWorkOn(req, order, 'change photos on');
    if (body.inReport && row.kind !== 'photo') throw new HttpError(400, 'invalid_request', 'Only photos go into the report.', [{ path: '$.inReport', message: 'Only photos' }]);
    await db.update(orderAttachments).set(body).where(eq(orderAttachments.id, row.id));
    const [after] = await db.select().from(orderAttachments).where(eq(orderAttachments.id, row.id));
    res.json({ attachment: attachmentView(after, await peopleById(db, [after.uploadedBy])) });
  });

  router.delete('/attachments/:id', requireAuth, async (req, res) => {
    const row = await loadAttachment(req);
    const order = await loadOrder(db, req, row.orderId);
    if (!isDesk(req.auth.role) && !canWorkOn(req, order)) requireWorkOn(req, order, 'remove photos from');
    await db.delete(orderAttachments).where(eq(orderAttachments.id, row.id));
    await Promise.allSettled([storage.delete(row.storageKey), row.thumbKey ? storage.delete(row.thumbKey) : Promise.resolve()]);
    res.status(204).end();
  });

  return router;
}

import { Router } from 'express';
import { and, desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { AppDeps } from '../deps';
import { outboxMessages } from '../db/schema';
import { HttpError, parseParams } from '../errors';
import { requireRole } from '../auth/middleware';
import { parseMessage } from '../mail/mime';

const attachmentParams = z.object({ id: z.string().min(1).max(26), index: z.coerce.number().int().min(0).max(1000) });

/**
 * The local fake SMTP server's messages (owner only; 404 when real SMTP is in use):
 * the shop's own messages only. A message sent without `shopId` is kept but shown to no one.
 */
export function outboxRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;
  router.use((_req, _res, next) => next(deps.outbox ? undefined : new HttpError(404, 'not_found', 'There is no outbox: mail goes to a real SMTP server.')));
  router.use(requireRole('owner'));
  const visible = (shopId: string) => eq(outboxMessages.shopId, shopId);

  router.get('/', async (req, res) => {
    const rows = await db
      .select({
        id: outboxMessages.id,
        to: outboxMessages.to,
        from: outboxMessages.from,
        subject: outboxMessages.subject,
        date: outboxMessages.date,
        text: outboxMessages.text,
        html: outboxMessages.html,
        attachments: outboxMessages.attachments,
      })
      .from(outboxMessages)
      .where(visible(req.auth.shopId))
      .orderBy(desc(outboxMessages.receivedAt), desc(outboxMessages.id))
      .limit(200);
    res.json({ messages: rows });
  });

  router.get('/:id/attachments/:index', async (req, res) => {
    const { id, index } = parseParams(attachmentParams, req.params);
    const [row] = await db
      .select({ raw: outboxMessages.raw })
      .from(outboxMessages)
      .where(and(eq(outboxMessages.id, id), visible(req.auth.shopId)))
      .limit(1);
    const attachment = row ? parseMessage(row.raw).attachments[index] : undefined;
    if (!attachment) throw new HttpError(404, 'not_found', 'That attachment does not exist.');
    res.set('Content-Type', attachment.contentType);
    res.attachment(attachment.filename);
    res.send(attachment.content);
  });

  return router;
}

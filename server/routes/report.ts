import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import { Router } from 'express';
import { z } from 'zod';
import { idParam, linkCreateSchema, orderStatusLabels, reportSendSchema, type PublicReport } from '../../shared/api/orders';
import type { AppDeps } from '../deps';
import { requireAuth, requireRole } from '../auth/middleware';
import { newId } from '../db/ids';
import { customerLinks, customers, orderAttachments, orderDrawings, reportSends } from '../db/schema/orders';
import { HttpError, notFound, parseBody, parseParams } from '../errors';
import { deskRoles, loadOrder, type OrderRow } from '../orders/access';
import { parseLinkToken, signLink, verifyLink } from '../orders/links';
import { drawingPng } from '../orders/markups';
import { buildReportPdf } from '../orders/report-pdf';
import { loadOrderById, reportFilename, reportInput } from '../orders/report-data';
import { loadSettingsRow } from '../orders/settings';
import { orderDetail } from '../orders/views';
import { contentDisposition } from './attachments';

const twoIds = z.object({ id: idParam.shape.id, childId: idParam.shape.id });
const tokenParam = z.object({ token: z.string().max(200) });
const tokenAndId = z.object({ token: z.string().max(200), childId: idParam.shape.id });
const LINK_GONE = 'This report link is not valid, has expired or was withdrawn. Ask the shop for a new one.';

/**
 * The report and what reaches the customer. Mounted on /api.
 * - GET  /repair-orders/:id/report.pdf            any member of the shop (preview, inline)
 * - POST /repair-orders/:id/report/send           writers, leads, owners: e-mail with the PDF, logged
 * - POST /repair-orders/:id/links                 writers, leads, owners: a customer link (the URL is answered once)
 * - DELETE /repair-orders/:id/links/:childId      revoke it
 * - GET  /public/reports/:token (…/report.pdf, …/photos/:id, …/drawings/:id.png)  no account: the read-only view
 */
export function reportRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, config } = deps;

  const makeLink = async (order: OrderRow, days: number | undefined) => {
    const settings = await loadSettingsRow(db, order.shopId);
    const id = newId();
    const expiresAt = new Date(Date.now() + (days ?? settings.linkDays) * 86_400_000);
    expiresAt.setMilliseconds(0);
    const token = signLink(settings.linkKey, id, order.id, expiresAt);
    return { id, expiresAt, token, url: `${config.publicUrl}/r/${token}` };
  };

  router.get('/repair-orders/:id/report.pdf', requireAuth, async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const order = await loadOrder(db, req, id);
    const { input } = await reportInput(deps, order);
    const pdf = await buildReportPdf(input);
    res.type('application/pdf').set('Content-Disposition', contentDisposition(req.query.download ? 'attachment' : 'inline', reportFilename(order.number))).send(pdf);
  });

  router.post('/repair-orders/:id/report/send', requireRole(...deskRoles), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(reportSendSchema, req.body);
    const order = await loadOrder(db, req, id);
    const [customer] = await db.select().from(customers).where(and(eq(customers.id, order.customerId), eq(customers.shopId, req.auth.shopId))).limit(1);
    const to = body.to ?? customer?.email ?? null;
    if (!to) throw new HttpError(400, 'invalid_request', `${customer?.name ?? 'The customer'} has no e-mail address; enter one to send the report to.`, [{ path: '$.to', message: 'Enter an e-mail address' }]);
    const { input } = await reportInput(deps, order);
    const pdf = await buildReportPdf(input);
    const link = body.includeLink ? await makeLink(order, undefined) : null;
    const filename = reportFilename(order.number);
    const subject = `${input.shopName}: repair order ${order.number} report`;
    const lines = [
      `Hello ${customer?.contacts?.[0]?.name ?? customer?.name ?? ''},`.trim(),
      '',
      body.message ?? `The report for repair order ${order.number} (${input.units.map((u) => `${u.modelName ?? 'unit'} ${u.serialNumber}`).join(', ')}) is attached.`,
      '',
      `Status: ${orderStatusLabels[order.status]}`,
      `Complaint: ${order.complaint}`,
      order.cause ? `Cause: ${order.cause}` : null,
      order.correction ? `Correction: ${order.correction}` : null,
      '',
      link ? `You can also read it online until ${link.expiresAt.toISOString().slice(0, 10)}: ${link.url}` : null,
      '',
      `${input.shopName}`,
    ].filter((l) => l !== null);
    let messageId: string;
    try {
      ({ messageId } = await deps.mailer.send({
        to,
        subject,
        text: lines.join('\n'),
        attachments: [{ filename, content: pdf, contentType: 'application/pdf' }],
        shopId: req.auth.shopId,
        replyTo: req.auth.email,
      }));
    } catch (err) {
      const reason = err instanceof Error ? err.message.replace(/\s+/g, ' ').slice(0, 300) : 'unknown error';
      throw new HttpError(502, 'send_failed', `The report was not sent: the mail server answered "${reason}". Nothing was recorded on the order; check the address and try again.`);
    }
    await db.transaction(async (tx) => {
      if (link) await tx.insert(customerLinks).values({ id: link.id, shopId: req.auth.shopId, orderId: order.id, expiresAt: link.expiresAt, createdBy: req.auth.userId });
      await tx.insert(reportSends).values({ id: newId(), shopId: req.auth.shopId, orderId: order.id, sentBy: req.auth.userId, to, subject, filename, bytes: pdf.length, messageId, linkId: link?.id ?? null });
    });
    res.status(201).json({ sent: { to, subject, filename, bytes: pdf.length }, link: link ? { id: link.id, url: link.url, expiresAt: link.expiresAt.toISOString() } : null, order: await orderDetail(db, req, order) });
  });

  router.post('/repair-orders/:id/links', requireRole(...deskRoles), async (req, res) => {
    const { id } = parseParams(idParam, req.params);
    const body = parseBody(linkCreateSchema, req.body);
    const order = await loadOrder(db, req, id);
    const link = await makeLink(order, body.days);
    await db.insert(customerLinks).values({ id: link.id, shopId: req.auth.shopId, orderId: order.id, expiresAt: link.expiresAt, createdBy: req.auth.userId });
    res.status(201).json({ link: { id: link.id, url: link.url, expiresAt: link.expiresAt.toISOString() }, order: await orderDetail(db, req, order) });
  });

  router.delete('/repair-orders/:id/links/:childId', requireRole(...deskRoles), async (req, res) => {
    const { id, childId } = parseParams(twoIds, req.params);
    const order = await loadOrder(db, req, id);
    const [result] = await db
      .update(customerLinks)
      .set({ revokedAt: new Date(), revokedBy: req.auth.userId })
      .where(and(eq(customerLinks.id, childId), eq(customerLinks.orderId, id), eq(customerLinks.shopId, req.auth.shopId), isNull(customerLinks.revokedAt)));
    if (result.affectedRows === 0) throw notFound('An open link with that id');
    res.json({ order: await orderDetail(db, req, order) });
  });

  // ---- the customer's view, no account -------------------------------------------------------
  /** The link's order, or 404 with one message whatever was wrong (shows nothing of the order). */
  const orderOfToken = async (token: string) => {
    const parsed = parseLinkToken(token);
    if (!parsed) throw new HttpError(404, 'link_invalid', LINK_GONE);
    const [link] = await db
      .select()
      .from(customerLinks)
      .where(and(eq(customerLinks.id, parsed.linkId), isNull(customerLinks.revokedAt), gt(customerLinks.expiresAt, new Date())))
      .limit(1);
    if (!link) throw new HttpError(404, 'link_invalid', LINK_GONE);
    const settings = await loadSettingsRow(db, link.shopId);
    if (!verifyLink(settings.linkKey, parsed, link.orderId, link.expiresAt)) throw new HttpError(404, 'link_invalid', LINK_GONE);
    const order = await loadOrderById(deps, link.shopId, link.orderId);
    if (!order) throw new HttpError(404, 'link_invalid', LINK_GONE);
    return { link, order };
  };

  const publicNoStore = (res: import('express').Response) => {
    res.set('Cache-Control', 'no-store');
    res.set('Referrer-Policy', 'no-referrer');
    res.set('X-Robots-Tag', 'noindex');
  };

  router.get('/public/reports/:token', async (req, res) => {
    const { token } = parseParams(tokenParam, req.params);
    const { link, order } = await orderOfToken(token);
    await db.update(customerLinks).set({ lastOpenedAt: new Date() }).where(eq(customerLinks.id, link.id));
    const { input, readingSets } = await reportInput(deps, order);
    const [drawings, photos] = await Promise.all([
      db.select().from(orderDrawings).where(and(eq(orderDrawings.orderId, order.id), eq(orderDrawings.inReport, true))).orderBy(asc(orderDrawings.createdAt)),
      db
        .select()
        .from(orderAttachments)
        .where(and(eq(orderAttachments.orderId, order.id), eq(orderAttachments.inReport, true), eq(orderAttachments.kind, 'photo')))
        .orderBy(asc(orderAttachments.createdAt)),
    ]);
    const base = `/api/public/reports/${token}`;
    const view: PublicReport = {
      shopName: input.shopName,
      number: order.number,
      status: order.status,
      customer: input.customer,
      units: input.units,
      complaint: order.complaint,
      cause: order.cause,
      correction: order.correction,
      customerNotes: order.customerNotes,
      openedAt: order.openedAt.toISOString(),
      drawings: drawings.map((d) => ({ id: d.id, title: d.title, notes: d.notes, markers: d.markers, pngUrl: `${base}/drawings/${d.id}.png` })),
      photos: photos.map((p) => ({ id: p.id, caption: p.caption, url: `${base}/photos/${p.id}`, width: p.width, height: p.height })),
      readingSets,
      cautions: input.cautions,
      expiresAt: link.expiresAt.toISOString(),
      pdfUrl: `${base}/report.pdf`,
    };
    publicNoStore(res);
    res.json({ report: view });
  });

  router.get('/public/reports/:token/report.pdf', async (req, res) => {
    const { token } = parseParams(tokenParam, req.params);
    const { order } = await orderOfToken(token);
    const { input } = await reportInput(deps, order);
    const pdf = await buildReportPdf(input);
    publicNoStore(res);
    res.type('application/pdf').set('Content-Disposition', contentDisposition('inline', reportFilename(order.number))).send(pdf);
  });

  router.get('/public/reports/:token/photos/:childId', async (req, res) => {
    const { token, childId } = parseParams(tokenAndId, req.params);
    const { order } = await orderOfToken(token);
    const [row] = await db
      .select()
      .from(orderAttachments)
      .where(and(eq(orderAttachments.id, childId), eq(orderAttachments.orderId, order.id), eq(orderAttachments.shopId, order.shopId), eq(orderAttachments.inReport, true)))
      .limit(1);
    if (!row) throw notFound('The photo');
    const found = await deps.storage.get(row.storageKey);
    if (!found) throw notFound('The photo');
    publicNoStore(res);
    res.set('Content-Security-Policy', "default-src 'none'; sandbox");
    res.type(row.contentType).send(found.data);
  });

  router.get('/public/reports/:token/drawings/:file', async (req, res) => {
    const { token, file } = parseParams(z.object({ token: z.string().max(200), file: z.string().regex(/^[a-z2-7]{26}\.png$/) }), req.params);
    const { order } = await orderOfToken(token);
    const [row] = await db
      .select()
      .from(orderDrawings)
      .where(and(eq(orderDrawings.id, file.slice(0, 26)), eq(orderDrawings.orderId, order.id), eq(orderDrawings.shopId, order.shopId), eq(orderDrawings.inReport, true)))
      .limit(1);
    if (!row) throw notFound('The drawing');
    publicNoStore(res);
    res.type('image/png').send(await drawingPng(row));
  });

  return router;
}

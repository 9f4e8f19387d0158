import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { customerLinks, reportSends, repairOrders } from '../../server/db/schema/orders';
import { createTestContext, type TestContext } from '../support/server-context';
import { documentGeometry, fillPositions } from '../../shared/drawing/geometry';
import { pinPoint } from '../../shared/drawing/wires';
import { importHarness, jpeg, makeOrder, smallHarness } from './orders-fixtures';

let ctx: TestContext;
let revisionId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  revisionId = (await importHarness(ctx)).revisionId;
});
afterAll(async () => {
  await ctx?.close();
});

/** The PDF's text, extracted with poppler's pdftotext. */
function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-report-'));
  const file = join(dir, 'report.pdf');
  writeFileSync(file, pdf);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}
function pdfFonts(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'wirewalk-report-'));
  const file = join(dir, 'report.pdf');
  writeFileSync(file, pdf);
  return execFileSync('pdffonts', [file], { encoding: 'utf8' });
}
const binary = (res: supertest.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

const drawingBody = () => ({
  revisionId,
  title: 'Work light feed, cab to boom',
  viewport: null,
  highlight: { components: ['F3', 'X12', 'L1'], wires: ['W2', 'W3'], pins: ['X12.1'], from: 'F3.2', to: 'L1.1' },
  markers: [
    { kind: 'fault', x: 120, y: 80, text: 'Insulation worn through at the boom clamp', target: 'W2' },
    // No coordinates: placed on its target by the server.
    { kind: 'note', text: 'Green corrosion in cavity 1', target: 'X12.1' },
  ],
  notes: 'Walked from the fuse to the lamp with the key on.',
});

async function orderWithFindings() {
  const made = await makeOrder(ctx);
  const tech = await ctx.agent('tech');
  const saved = await tech.patch(`/api/repair-orders/${made.order.id}`).send({
    version: made.order.version,
    status: 'ready',
    cause: 'Wire W2 chafed through at the boom clamp and shorted to the frame.',
    correction: 'Replaced 0.4 m of W2, sleeved it and moved the clamp; fitted a new 10 A fuse.',
    internalNotes: 'SECRET-INTERNAL: customer argued about the last bill.',
  });
  expect(saved.status).toBe(200);
  const writer = await ctx.agent('writer');
  const w = await writer.patch(`/api/repair-orders/${made.order.id}`).send({ version: saved.body.order.version, customerNotes: 'Check the boom clamps at the next service.' });
  expect(w.status).toBe(200);
  return made;
}

describe('marked-up drawings', () => {
  it('the tech freezes a view of a revision; it re-opens as data and renders as SVG and PNG', async () => {
    const { order } = await makeOrder(ctx);
    const tech = await ctx.agent('tech');
    const res = await tech.post(`/api/repair-orders/${order.id}/drawings`).send(drawingBody());
    expect(res.status).toBe(201);
    const d = res.body.drawing;
    expect(d).toMatchObject({ revisionId, harnessName: expect.any(String), title: 'Work light feed, cab to boom' });
    expect(d.markers).toHaveLength(2);
    expect(d.markers[1]).toMatchObject({ kind: 'note', target: 'X12.1', x: expect.any(Number), y: expect.any(Number) });

    const reopened = await tech.get(`/api/repair-orders/${order.id}/drawings/${d.id}`);
    expect(reopened.status).toBe(200);
    expect(reopened.body.drawing.highlight.wires).toEqual(['W2', 'W3']);
    expect(reopened.body.document.components.map((c: { id: string }) => c.id)).toContain('X12');

    const svg = await tech.get(d.svgUrl);
    expect(svg.status).toBe(200);
    expect(svg.headers['content-type']).toMatch(/image\/svg\+xml/);
    const svgText = svg.text || String(svg.body);
    // The editor's drawing (shared/drawing): the walked wire labelled with id, colour, size and circuit.
    expect(svgText).toContain('W2 · RD/WH · 1 mm² · A12');
    // The fault and the note as their own shapes, numbered, their notes in the legend under the drawing.
    expect(svgText).toMatch(/<g data-marker="1" data-kind="fault"[^>]*><circle/);
    expect(svgText).toMatch(/<g data-marker="2" data-kind="note"[^>]*><rect/);
    expect(svgText).toContain('1. FAULT at W2:</tspan> Insulation worn through at the boom clamp');
    expect(svgText).toContain('2. NOTE at X12.1:</tspan> Green corrosion in cavity 1');
    // The note placed by the server sits beside cavity X12.1 as the drawing shows it.
    const drawnPositions = fillPositions(reopened.body.document, reopened.body.positions);
    const cavity = pinPoint('X12.1', documentGeometry(reopened.body.document), drawnPositions)!;
    expect(Math.hypot(d.markers[1].x - cavity.x, d.markers[1].y - cavity.y)).toBeLessThan(30);
    const pngRes = await tech.get(d.pngUrl).buffer(true).parse(binary);
    expect(pngRes.status).toBe(200);
    expect((pngRes.body as Buffer).subarray(1, 4).toString()).toBe('PNG');

    // A later edit of the draft does not change the frozen drawing, which still names its revision.
    const lead = await ctx.agent('lead');
    const rev = await lead.get(`/api/revisions/${revisionId}`);
    expect(rev.body.revision.status).toBe('draft'); // an import starts as a draft
    {
      const edited = structuredClone(smallHarness);
      edited.components = edited.components.filter((c) => c.id !== 'L1');
      edited.wires = edited.wires.filter((w) => w.id !== 'W3' && w.id !== 'W4');
      const put = await lead.put(`/api/revisions/${revisionId}/document`).send({ version: rev.body.revision.version, document: edited });
      expect(put.status).toBe(200);
      const after = await tech.get(`/api/repair-orders/${order.id}/drawings/${d.id}`);
      expect(after.body.drawing.revisionId).toBe(revisionId);
      expect(after.body.document.components.map((c: { id: string }) => c.id)).toContain('L1');
      const svgAfter = await tech.get(d.svgUrl);
      expect(svgAfter.text || String(svgAfter.body)).toBe(svgText);
      // Put it back for the other tests.
      const rev2 = await lead.get(`/api/revisions/${revisionId}`);
      await lead.put(`/api/revisions/${revisionId}/document`).send({ version: rev2.body.revision.version, document: smallHarness });
    }

    const patched = await tech.patch(`/api/repair-orders/${order.id}/drawings/${d.id}`).send({ version: d.version, markers: [{ kind: 'fault', x: 10, y: 10, text: 'Moved marker', target: 'W2' }], viewport: { x: 200, y: -40, width: 400, height: 300 } });
    expect(patched.status).toBe(200);
    // A saved viewport crops the picture to it; the marker is where it was put.
    const cropped = await tech.get(d.svgUrl);
    const croppedText = cropped.text || String(cropped.body);
    expect(/viewBox="([^"]+)"/.exec(croppedText)![1].split(' ').slice(0, 3)).toEqual(['200', '-40', '400']);
    expect(croppedText).toContain('<clipPath id="ww-view"><rect x="200" y="-40" width="400" height="300"/>');
    expect(croppedText).toContain('<g data-marker="1" data-kind="fault" transform="translate(10 10)">');
    expect(croppedText).not.toContain('Green corrosion');
    const stale = await tech.patch(`/api/repair-orders/${order.id}/drawings/${d.id}`).send({ version: d.version, title: 'late' });
    expect(stale.status).toBe(409);
  });

  it('refuses drawings that name what the revision does not have, or another shop’s revision, or from the wrong role', async () => {
    const { order } = await makeOrder(ctx);
    const tech = await ctx.agent('tech');
    const bad = await tech.post(`/api/repair-orders/${order.id}/drawings`).send({ ...drawingBody(), highlight: { wires: ['W99'] }, markers: [{ kind: 'fault', x: 1, y: 1, text: 'x', target: 'Q7' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(['$.highlight.wires[0]', '$.markers[0].target']);
    const noText = await tech.post(`/api/repair-orders/${order.id}/drawings`).send({ ...drawingBody(), markers: [{ kind: 'fault', x: 1, y: 1, text: '' }] });
    expect(noText.status).toBe(400);
    const infinite = await tech.post(`/api/repair-orders/${order.id}/drawings`).send({ ...drawingBody(), viewport: { x: 0, y: 0, width: -5, height: 10 } });
    expect(infinite.status).toBe(400);
    const otherLead = await ctx.otherShopAgent('lead');
    const theirs = await importHarness(ctx, otherLead);
    const foreign = await tech.post(`/api/repair-orders/${order.id}/drawings`).send({ ...drawingBody(), revisionId: theirs.revisionId });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.details[0].path).toBe('$.revisionId');
    const writer = await ctx.agent('writer');
    expect((await writer.post(`/api/repair-orders/${order.id}/drawings`).send(drawingBody())).status).toBe(403);
    expect((await otherLead.post(`/api/repair-orders/${order.id}/drawings`).send(drawingBody())).status).toBe(404);
  });
});

describe('the report', () => {
  it('is a PDF with the three Cs, drawings, chosen photos, procedures and cautions, in Roboto Condensed, and no internal notes', async () => {
    const { order } = await orderWithFindings();
    const tech = await ctx.agent('tech');
    await tech.post(`/api/repair-orders/${order.id}/drawings`).send(drawingBody());
    const up = await tech.post(`/api/repair-orders/${order.id}/attachments`).attach('files', await jpeg(640, 480), { filename: 'boom-clamp.jpg' }).attach('files', await jpeg(320, 240), { filename: 'not-for-report.jpg' });
    expect(up.status).toBe(201);
    const [chosen, left] = up.body.attachments;
    await tech.patch(`/api/attachments/${chosen.id}`).send({ caption: 'Chafe point under the boom clamp' });
    await tech.patch(`/api/attachments/${left.id}`).send({ inReport: false });
    const lead = await ctx.agent('lead');
    const proc = await lead.post('/api/procedures').send({ title: 'Hand and foot throttle recalibration', steps: ['Key on, engine off', 'Sweep the hand throttle end to end'] });
    const attached = await lead.post(`/api/repair-orders/${order.id}/procedures`).send({ procedureId: proc.body.procedure.id });
    const op = attached.body.order.procedures[0];
    await tech.put(`/api/repair-orders/${order.id}/procedures/${op.id}/steps/${op.steps[0].id}`).send({ done: true });

    // Readings on the job (the readings API), one of them out of range, on the published revision.
    const published = await lead.post(`/api/revisions/${revisionId}/publish`).send({ note: 'Checked on the loader' });
    expect(published.status, JSON.stringify(published.body)).toBe(200);
    const taken = await tech.post('/api/reading-sets').send({
      revisionId,
      repairOrderId: order.id,
      observations: [
        { kind: 'volts', pin: 'X12.1', state: 'key_on', volts: 0.0 },
        { kind: 'volts', pin: 'F3.1', state: 'key_on', volts: 12.6 },
      ],
    });
    expect(taken.status, JSON.stringify(taken.body)).toBe(201);
    expect(taken.body.readings.map((r: { inRange: boolean | null }) => r.inRange)).toEqual([false, true]);

    const res = await (await ctx.agent('writer')).get(`/api/repair-orders/${order.id}/report.pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(/^inline/);
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    mkdirSync(join(process.cwd(), 'tests', 'artifacts'), { recursive: true });
    writeFileSync(join(process.cwd(), 'tests', 'artifacts', 'report-sample.pdf'), pdf);
    const text = pdfText(pdf).replace(/\s+/g, ' ');
    expect(text).toContain(`Repair order ${order.number}`);
    expect(text).toContain('Complaint');
    expect(text).toContain('Work lights flicker');
    expect(text).toContain('Cause');
    expect(text).toContain('Wire W2 chafed through at the boom clamp');
    expect(text).toContain('Correction');
    expect(text).toContain('Replaced 0.4 m of W2');
    expect(text).toContain('Check the boom clamps at the next service.');
    expect(text).toContain('Drawing: Work light feed, cab to boom');
    expect(text).toContain('FAULT at W2: Insulation worn through at the boom clamp');
    expect(text).toContain('Chafe point under the boom clamp');
    expect(text).not.toContain('not-for-report.jpg');
    expect(text).toContain('Hand and foot throttle recalibration');
    expect(text).toMatch(/DONE 1\. Key on, engine off — Priya Okafor/);
    expect(text).toContain('CAUTION: Disconnect the battery first');
    expect(text).toContain('Readings here are expectations');
    expect(text).toMatch(/page 1 of \d/);
    expect(text).toContain('Readings');
    expect(text).toMatch(/X12\.1 key on 0 ?V .* OUT of range/);
    expect(text).toMatch(/F3\.1 key on 12\.6 V .* in range/);
    if (taken.body.suspects.length) expect(text).toContain('Suspects at the time');
    expect(text).not.toContain('SECRET-INTERNAL');
    const fonts = pdfFonts(pdf);
    expect(fonts).toMatch(/RobotoCondensed/);
    expect(fonts).not.toMatch(/Helvetica/);
    // Images are in it: the drawing and the one chosen photo.
    expect(pdf.toString('latin1').match(/\/Subtype \/Image/g)?.length).toBeGreaterThanOrEqual(2);

    expect((await ctx.request.get(`/api/repair-orders/${order.id}/report.pdf`)).status).toBe(401);
    expect((await (await ctx.otherShopAgent('owner')).get(`/api/repair-orders/${order.id}/report.pdf`)).status).toBe(404);
  });

  it('is e-mailed to the customer with the PDF attached, logged on the order, with a customer link that opens without an account', async () => {
    const { order, customer } = await orderWithFindings();
    const writer = await ctx.agent('writer');
    const tech = await ctx.agent('tech');
    expect((await tech.post(`/api/repair-orders/${order.id}/report/send`).send({})).status).toBe(403);
    const from = ctx.mail.messages.length;
    const sent = await writer.post(`/api/repair-orders/${order.id}/report/send`).send({ message: 'Your loader is ready for pick-up.' });
    expect(sent.status).toBe(201);
    expect(sent.body.sent.to).toBe(customer.email);
    const mail = await ctx.mail.waitFor((m) => m.subject.includes(`repair order ${order.number} report`), { from });
    expect(mail.text).toContain('Your loader is ready for pick-up.');
    expect(mail.text).toContain(sent.body.link.url);
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0].filename).toBe(`repair-order-${order.number}-report.pdf`);
    expect(pdfText(mail.attachments[0].content as Buffer)).toContain('Wire W2 chafed through');
    // The Outbox shows it to the owner.
    const outbox = await (await ctx.agent('owner')).get('/api/outbox');
    expect(JSON.stringify(outbox.body)).toContain(`repair order ${order.number} report`);

    const log = sent.body.order.sends;
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({ to: customer.email, sentBy: { id: ctx.demo.users.writer.id }, filename: `repair-order-${order.number}-report.pdf` });
    expect(sent.body.order.links).toHaveLength(1);

    // The customer link: no account, read-only, customer-visible fields only.
    const token = sent.body.link.url.split('/r/')[1];
    const view = await ctx.request.get(`/api/public/reports/${token}`);
    expect(view.status).toBe(200);
    expect(view.body.report).toMatchObject({ number: order.number, cause: expect.stringContaining('W2 chafed'), customerNotes: 'Check the boom clamps at the next service.' });
    expect(JSON.stringify(view.body)).not.toContain('SECRET-INTERNAL');
    expect(JSON.stringify(view.body)).not.toContain(ctx.demo.users.tech.email);
    const pdf = await ctx.request.get(view.body.report.pdfUrl).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    // Nothing state-changing is open on the public path.
    expect((await ctx.request.post(`/api/public/reports/${token}`).send({})).status).toBe(404);
  });

  it('a failed send leaves the order unchanged and says why', async () => {
    const { order } = await orderWithFindings();
    const failingDeps = { ...ctx.deps, mailer: { send: async () => Promise.reject(new Error('550 5.1.1 mailbox unavailable')), close: async () => {} } };
    const app = createApp(failingDeps);
    const agent = supertest.agent(app);
    const signIn = await agent.post('/api/auth/sign-in').send({ email: ctx.demo.users.writer.email, password: 'wirewalk-demo' });
    expect(signIn.status).toBe(200);
    const [before] = await ctx.db.select().from(repairOrders).where(eq(repairOrders.id, order.id));
    const res = await agent.post(`/api/repair-orders/${order.id}/report/send`).send({ to: 'someone@customer.example' });
    expect(res.status).toBe(502);
    expect(res.body.error.code).toBe('send_failed');
    expect(res.body.error.message).toContain('550 5.1.1 mailbox unavailable');
    expect(res.body.error.message).toMatch(/Nothing was recorded/);
    const [after] = await ctx.db.select().from(repairOrders).where(eq(repairOrders.id, order.id));
    expect(after).toEqual(before);
    expect(await ctx.db.select().from(reportSends).where(eq(reportSends.orderId, order.id))).toHaveLength(0);
    expect(await ctx.db.select().from(customerLinks).where(eq(customerLinks.orderId, order.id))).toHaveLength(0);

    const writer = await ctx.agent('writer');
    const noAddress = await writer.post('/api/customers').send({ name: 'No Mail Farm' });
    const unit = await writer.post('/api/units').send({ customerId: noAddress.body.customer.id, serialNumber: 'NM-1', description: 'Skid steer' });
    const o = await writer.post('/api/repair-orders').send({ customerId: noAddress.body.customer.id, unitIds: [unit.body.unit.id], complaint: 'Horn dead' });
    const missing = await writer.post(`/api/repair-orders/${o.body.order.id}/report/send`).send({});
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/No Mail Farm has no e-mail address/);
    const badTo = await writer.post(`/api/repair-orders/${o.body.order.id}/report/send`).send({ to: 'nope' });
    expect(badTo.status).toBe(400);
    expect(badTo.body.error.details[0].path).toBe('$.to');
  });
});

describe('customer links', () => {
  it('are signed, expire, can be revoked, and never show another order', async () => {
    const { order } = await orderWithFindings();
    const writer = await ctx.agent('writer');
    expect((await (await ctx.agent('tech')).post(`/api/repair-orders/${order.id}/links`).send({})).status).toBe(403);
    const made = await writer.post(`/api/repair-orders/${order.id}/links`).send({ days: 3 });
    expect(made.status).toBe(201);
    const token: string = made.body.link.url.split('/r/')[1];
    expect((await ctx.request.get(`/api/public/reports/${token}`)).status).toBe(200);

    // Tampered: another signature, another expiry, another link id.
    const [id, exp, sig] = token.split('.');
    const flipped = sig[0] === 'A' ? `B${sig.slice(1)}` : `A${sig.slice(1)}`;
    for (const bad of [`${id}.${exp}.${flipped}`, `${id}.${Number(exp) + 86400}.${sig}`, `${'a'.repeat(26)}.${exp}.${sig}`, 'garbage', `${id}.${exp}`]) {
      const res = await ctx.request.get(`/api/public/reports/${bad}`);
      expect(res.status).toBe(404);
      expect(res.body.error.message).toMatch(/not valid, has expired or was withdrawn/);
      expect(JSON.stringify(res.body)).not.toContain(String(order.number + 0) + ' ');
    }

    // A photo of another order (even of the same shop) is not reachable through this link.
    const other = await orderWithFindings();
    const up = await (await ctx.agent('tech')).post(`/api/repair-orders/${other.order.id}/attachments`).attach('files', await jpeg(), { filename: 'other.jpg' });
    const otherPhoto = up.body.attachments[0].id;
    expect((await ctx.request.get(`/api/public/reports/${token}/photos/${otherPhoto}`)).status).toBe(404);

    // A link of another shop's order answers nothing of ours and vice versa.
    const otherWriter = await ctx.otherShopAgent('writer');
    const c = await otherWriter.post('/api/customers').send({ name: 'Their customer', email: 'their@customer.example' });
    const u = await otherWriter.post('/api/units').send({ customerId: c.body.customer.id, serialNumber: 'T-1', description: 'Telehandler' });
    const o = await otherWriter.post('/api/repair-orders').send({ customerId: c.body.customer.id, unitIds: [u.body.unit.id], complaint: 'Boom creeps down' });
    const theirLink = await otherWriter.post(`/api/repair-orders/${o.body.order.id}/links`).send({});
    const theirToken: string = theirLink.body.link.url.split('/r/')[1];
    const theirView = await ctx.request.get(`/api/public/reports/${theirToken}`);
    expect(theirView.body.report.complaint).toBe('Boom creeps down');
    expect((await ctx.request.get(`/api/public/reports/${theirToken}/photos/${otherPhoto}`)).status).toBe(404);
    // Our link id with their shop's signature does not open.
    const [theirId, theirExp, theirSig] = theirToken.split('.');
    expect((await ctx.request.get(`/api/public/reports/${id}.${theirExp}.${theirSig}`)).status).toBe(404);
    expect((await ctx.request.get(`/api/public/reports/${theirId}.${exp}.${sig}`)).status).toBe(404);
    // They cannot revoke ours.
    expect((await otherWriter.delete(`/api/repair-orders/${order.id}/links/${made.body.link.id}`)).status).toBe(404);

    // Expired: move the expiry into the past (the signature covers it, so the row decides).
    const expiring = await writer.post(`/api/repair-orders/${order.id}/links`).send({ days: 1 });
    const expiringToken: string = expiring.body.link.url.split('/r/')[1];
    await ctx.db.update(customerLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(customerLinks.id, expiring.body.link.id));
    expect((await ctx.request.get(`/api/public/reports/${expiringToken}`)).status).toBe(404);
    expect((await ctx.request.get(`/api/public/reports/${expiringToken}/report.pdf`)).status).toBe(404);

    // Revoked.
    const revoked = await writer.delete(`/api/repair-orders/${order.id}/links/${made.body.link.id}`);
    expect(revoked.status).toBe(200);
    expect(revoked.body.order.links.find((l: { id: string }) => l.id === made.body.link.id).revokedAt).not.toBeNull();
    expect((await ctx.request.get(`/api/public/reports/${token}`)).status).toBe(404);
    expect((await writer.delete(`/api/repair-orders/${order.id}/links/${made.body.link.id}`)).status).toBe(404);
  });
});

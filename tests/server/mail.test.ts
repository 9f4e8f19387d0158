import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import nodemailer, { type SendMailOptions } from 'nodemailer';
import { outboxMessages } from '../../server/db/schema';
import { parseMessage } from '../../server/mail/mime';
import { smtpMailer } from '../../server/mail/mailer';
import { createTestContext, type TestContext } from '../support/server-context';

const png = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex');
const binary = Buffer.from(Array.from({ length: 3000 }, (_, i) => (i * 37) % 256));

/** What nodemailer itself writes for a message (the stream transport keeps the raw RFC 5322 text). */
async function compose(options: SendMailOptions): Promise<Buffer> {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
  const info = await transport.sendMail(options);
  return info.message as Buffer;
}

describe('the MIME reader', () => {
  it("reads nodemailer's output: encoded subject, text, html, and attachments byte for byte", async () => {
    const raw = await compose({
      from: 'Wirewalk <no-reply@wirewalk.invalid>',
      to: 'Zoë Brandt <zoe@example.com>, tech@example.com',
      subject: 'Über die Kabelbäume — ohm check ✓ and a rather long subject line that has to be folded over several header lines',
      text: 'Plain text with ünïcödé and a long line '.repeat(10),
      html: '<p>HTML with <b>bold</b> and ümlauts</p>',
      attachments: [
        { filename: 'photo.png', content: png, contentType: 'image/png' },
        { filename: 'Schaltplan für Gerät.bin', content: binary, contentType: 'application/octet-stream' },
        { filename: 'notes.txt', content: 'reading 12.6 V at cavity 3\n', contentType: 'text/plain' },
      ],
    });
    const parsed = parseMessage(raw);
    expect(parsed.subject).toBe('Über die Kabelbäume — ohm check ✓ and a rather long subject line that has to be folded over several header lines');
    expect(parsed.from).toBe('Wirewalk <no-reply@wirewalk.invalid>');
    expect(parsed.to).toContain('zoe@example.com');
    expect(parsed.to).toContain('tech@example.com');
    expect(parsed.text.trim()).toBe('Plain text with ünïcödé and a long line '.repeat(10).trim());
    expect(parsed.html).toBe('<p>HTML with <b>bold</b> and ümlauts</p>');
    expect(parsed.date).toBeInstanceOf(Date);
    expect(parsed.attachments.map((a) => [a.filename, a.contentType])).toEqual([
      ['photo.png', 'image/png'],
      ['Schaltplan für Gerät.bin', 'application/octet-stream'],
      ['notes.txt', 'text/plain'],
    ]);
    expect(parsed.attachments[0].content.equals(png)).toBe(true);
    expect(parsed.attachments[1].content.equals(binary)).toBe(true);
    expect(parsed.attachments[2].content.toString()).toBe('reading 12.6 V at cavity 3\n');
  });

  it('reads a plain single-part message with LF line ends', () => {
    const parsed = parseMessage(Buffer.from('Subject: =?UTF-8?Q?Caf=C3=A9_=E2=80=94_ok?=\nFrom: a@example.com\nTo: b@example.com\n\nHello\nthere\n'));
    expect(parsed.subject).toBe('Café — ok');
    expect(parsed.text).toBe('Hello\nthere\n');
    expect(parsed.html).toBeNull();
    expect(parsed.attachments).toEqual([]);
  });
});

describe('the fake SMTP outbox', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(async () => {
    await ctx?.close();
  });

  async function send(subject: string, shopId?: string) {
    return ctx.deps.mailer.send({
      to: 'customer@example.org',
      subject,
      text: `Body of ${subject}`,
      html: `<p>Body of ${subject}</p>`,
      attachments: [{ filename: 'report.pdf', content: binary, contentType: 'application/pdf' }],
      shopId,
    });
  }

  it('keeps every message in the database with its shop', async () => {
    const { messageId } = await send('Kept in the database', ctx.demo.shopId);
    const [row] = await ctx.db.select().from(outboxMessages).where(eq(outboxMessages.messageId, messageId));
    expect(row).toBeDefined();
    expect(row.shopId).toBe(ctx.demo.shopId);
    expect(row.subject).toBe('Kept in the database');
    expect(row.attachments).toEqual([{ index: 0, filename: 'report.pdf', contentType: 'application/pdf', size: binary.length }]);
    expect(ctx.mail.messages.at(-1)?.subject).toBe('Kept in the database');
  });

  it('sends through an SMTP_URL-style address too (nodemailer over plain SMTP)', async () => {
    const viaUrl = smtpMailer(`smtp://${ctx.mail.host}:${ctx.mail.port}?ignoreTLS=true`, 'Shop <shop@example.com>');
    try {
      await viaUrl.send({ to: 'someone@example.org', subject: 'Sent by URL', text: 'hello' });
    } finally {
      await viaUrl.close();
    }
    const last = ctx.mail.messages.at(-1)!;
    expect(last.subject).toBe('Sent by URL');
    expect(last.from).toBe('Shop <shop@example.com>');
    expect(last.shopId).toBeNull();
  });

  it('answers 401 without a session and 403 to every role but the owner', async () => {
    expect((await ctx.request.get('/api/outbox')).status).toBe(401);
    for (const role of ['lead', 'tech', 'writer'] as const) {
      const agent = await ctx.agent(role);
      expect((await agent.get('/api/outbox')).status, role).toBe(403);
    }
  });

  it("lists the owner's shop messages newest first, with bodies and attachments; not another shop's", async () => {
    await send('First for the demo shop', ctx.demo.shopId);
    await send('For the other shop', ctx.otherShop.shopId);
    await send('Second for the demo shop', ctx.demo.shopId);
    const owner = await ctx.agent('owner');
    const res = await owner.get('/api/outbox');
    expect(res.status).toBe(200);
    const subjects = res.body.messages.map((m: { subject: string }) => m.subject);
    expect(subjects.indexOf('Second for the demo shop')).toBeLessThan(subjects.indexOf('First for the demo shop'));
    expect(subjects).not.toContain('For the other shop');
    const message = res.body.messages[0];
    expect(message).toEqual({
      id: expect.any(String),
      to: 'customer@example.org',
      from: ctx.deps.config.mailFrom,
      subject: 'Second for the demo shop',
      date: expect.any(String),
      text: 'Body of Second for the demo shop',
      html: '<p>Body of Second for the demo shop</p>',
      attachments: [{ index: 0, filename: 'report.pdf', contentType: 'application/pdf', size: binary.length }],
    });
    const other = await ctx.otherShopAgent('owner');
    const theirs = await other.get('/api/outbox');
    expect(theirs.body.messages.map((m: { subject: string }) => m.subject)).toEqual(['For the other shop']);
  });

  it("downloads an attachment byte for byte; another shop's owner gets 404; a missing index is 404", async () => {
    const owner = await ctx.agent('owner');
    const [latest] = (await owner.get('/api/outbox')).body.messages;
    const file = await owner
      .get(`/api/outbox/${latest.id}/attachments/0`)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(file.headers['content-disposition']).toContain('report.pdf');
    expect((file.body as Buffer).equals(binary)).toBe(true);
    expect((await owner.get(`/api/outbox/${latest.id}/attachments/5`)).status).toBe(404);
    const other = await ctx.otherShopAgent('owner');
    expect((await other.get(`/api/outbox/${latest.id}/attachments/0`)).status).toBe(404);
    expect((await ctx.request.get(`/api/outbox/${latest.id}/attachments/0`)).status).toBe(401);
  });

  it('answers 404 when mail goes to a real SMTP server, and /api/meta says so', async () => {
    ctx.deps.outbox = false;
    try {
      const owner = await ctx.agent('owner');
      expect((await owner.get('/api/outbox')).status).toBe(404);
      expect((await ctx.request.get('/api/meta')).body.outbox).toBe(false);
    } finally {
      ctx.deps.outbox = true;
    }
  });
});

import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orderAttachments } from '../../server/db/schema/orders';
import { createTestContext, type TestContext } from '../support/server-context';
import { jpeg, makeOrder, png } from './orders-fixtures';

let ctx: TestContext;
let orderId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  orderId = (await makeOrder(ctx)).order.id;
});
afterAll(async () => {
  await ctx?.close();
});

const rowsOf = async (id: string) => ctx.db.select().from(orderAttachments).where(eq(orderAttachments.orderId, id));
/** Every key ever put into storage; `storedFiles()` counts those still there. */
const putKeys = new Set<string>();
async function storedFiles(): Promise<number> {
  let n = 0;
  for (const k of putKeys) if (await ctx.deps.storage.get(k)) n++;
  return n;
}
beforeAll(() => {
  const storage = ctx.deps.storage;
  const put = storage.put.bind(storage);
  storage.put = async (key, data, type) => {
    putKeys.add(key);
    return put(key, data, type);
  };
});

/** A multipart/form-data body with the names exactly as given. */
function multipart(files: { name: string; data: Buffer }[]): { body: Buffer; type: string } {
  const boundary = `----wirewalk-test-${Math.random().toString(16).slice(2)}`;
  const parts: Buffer[] = [];
  for (const f of files) {
    // eslint-disable-next-line no-control-regex
    parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="files"; ${/[\u0000-\u0008\u000b-\u001f]/.test(f.name) ? `filename*=UTF-8''${encodeURIComponent(f.name)}` : `filename="${f.name}"`}\r\nContent-Type: image/jpeg\r\n\r\n`, 'utf8'));
    parts.push(f.data, Buffer.from('\r\n'));
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), type: `multipart/form-data; boundary=${boundary}` };
}

describe('photos and files on an order', () => {
  it('takes several photos and a PDF at once, detects types by content, makes thumbnails, serves them to the shop only', async () => {
    const tech = await ctx.agent('tech');
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');
    const res = await tech
      .post(`/api/repair-orders/${orderId}/attachments`)
      .attach('files', await jpeg(800, 600), { filename: 'X12 connector.jpg', contentType: 'image/jpeg' })
      // A PNG with a misleading name and type: stored as what it is.
      .attach('files', await png(), { filename: 'boom clamp.jpg', contentType: 'image/jpeg' })
      .attach('files', pdf, { filename: 'Ölkühler Prüfbericht.pdf', contentType: 'application/pdf' });
    expect(res.status).toBe(201);
    const byName = (n: string) => res.body.attachments.find((a: { filename: string }) => a.filename === n);
    const [photo, second, file] = [byName('X12 connector.jpg'), byName('boom clamp.jpg'), byName('Ölkühler Prüfbericht.pdf')];
    expect(photo).toMatchObject({ kind: 'photo', contentType: 'image/jpeg', width: 800, height: 600, inReport: true });
    expect(second).toMatchObject({ kind: 'photo', contentType: 'image/png', filename: 'boom clamp.jpg' });
    expect(file).toMatchObject({ kind: 'file', contentType: 'application/pdf', filename: 'Ölkühler Prüfbericht.pdf', thumbUrl: null, inReport: false });

    const got = await tech.get(photo.url).buffer(true);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/jpeg');
    const thumb = await tech.get(photo.thumbUrl).buffer(true);
    expect(thumb.status).toBe(200);
    const sharp = (await import('sharp')).default;
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(meta.width ?? 0, meta.height ?? 0)).toBe(480);
    const pdfGet = await tech.get(file.url);
    expect(pdfGet.headers['content-disposition']).toContain("filename*=UTF-8''%C3%96lk%C3%BChler");

    expect((await ctx.request.get(photo.url)).status).toBe(401);
    expect((await (await ctx.otherShopAgent('owner')).get(photo.url)).status).toBe(404);
    // The writer (same shop) may look.
    expect((await (await ctx.agent('writer')).get(photo.url)).status).toBe(200);

    const caption = await tech.patch(`/api/attachments/${photo.id}`).send({ caption: 'X12 cavity 1, green corrosion', inReport: true });
    expect(caption.status).toBe(200);
    expect(caption.body.attachment.caption).toBe('X12 cavity 1, green corrosion');
    const pdfInReport = await tech.patch(`/api/attachments/${file.id}`).send({ inReport: true });
    expect(pdfInReport.status).toBe(400);
  });

  const refusals: [string, () => Promise<{ name: string; data: Buffer }[]>, number, string, RegExp][] = [
    ['a path in the name', async () => [{ name: '../../etc/passwd.jpg', data: await jpeg() }], 400, 'invalid_filename', /folder path/],
    ['a Windows path in the name', async () => [{ name: '..\\..\\boot.ini.jpg', data: await jpeg() }], 400, 'invalid_filename', /folder path/],
    ['a control character in the name', async () => [{ name: 'photo\u0007\u001b[31m.jpg', data: await jpeg() }], 400, 'invalid_filename', /control characters/],
    ['a line break in the name (header injection)', async () => [{ name: 'photo\r\nContent-Type: text/html.jpg', data: await jpeg() }], 400, 'invalid_filename', /control characters/],
    ['a right-to-left override in the name', async () => [{ name: 'photo\u202egpj.exe', data: await jpeg() }], 400, 'invalid_filename', /text-direction/],
    ['a program named like a photo', async () => [{ name: 'wiring.jpg', data: Buffer.concat([Buffer.from('MZ'), Buffer.alloc(200, 1)]) }], 415, 'unsupported_type', /upload photos/],
    ['plain text named like a photo', async () => [{ name: 'notes.png', data: Buffer.from('just some words, not a picture at all') }], 415, 'unsupported_type', /not a file type/],
    ['a JPEG cut short', async () => [{ name: 'half.jpg', data: (await jpeg(600, 400)).subarray(0, 400) }], 422, 'corrupt_image', /cannot be read/],
    ['a PNG with a damaged body', async () => {
      const good = await png(300, 200);
      const bad = Buffer.from(good);
      for (let i = 60; i < bad.length - 20; i++) bad[i] = bad[i] ^ 0x5a;
      return [{ name: 'damaged.png', data: bad }];
    }, 422, 'corrupt_image', /cannot be read/],
    ['an empty file', async () => [{ name: 'empty.jpg', data: Buffer.alloc(0) }], 400, 'empty_file', /empty/],
    ['a good photo with a bad one', async () => [{ name: 'good.jpg', data: await jpeg() }, { name: '../bad.jpg', data: await jpeg() }], 400, 'invalid_filename', /File 2/],
  ];

  for (const [what, files, status, code, message] of refusals) {
    it(`refuses ${what} with a clear message and stores nothing`, async () => {
      const tech = await ctx.agent('tech');
      const before = (await rowsOf(orderId)).length;
      const filesBefore = await storedFiles();
      // Built by hand: a form library would trim the path off the name before sending it.
      const { body, type } = multipart(await files());
      const res = await tech.post(`/api/repair-orders/${orderId}/attachments`).set('Content-Type', type).send(body);
      expect(res.status).toBe(status);
      expect(res.body.error.code).toBe(code);
      expect(res.body.error.message).toMatch(message);
      expect(res.body.error.message).toMatch(/nothing was stored/i);
      expect((await rowsOf(orderId)).length).toBe(before);
      expect(await storedFiles()).toBe(filesBefore);
    });
  }

  it('refuses too many files and too large a file', async () => {
    const tech = await ctx.agent('tech');
    const before = (await rowsOf(orderId)).length;
    const small = await jpeg(8, 8);
    let req = tech.post(`/api/repair-orders/${orderId}/attachments`);
    for (let i = 0; i < 11; i++) req = req.attach('files', small, { filename: `p${i}.jpg` });
    const many = await req;
    expect(many.status).toBe(400);
    expect(many.body.error.code).toBe('too_many_files');
    expect(many.body.error.message).toMatch(/at most 10/);
    const big = await tech.post(`/api/repair-orders/${orderId}/attachments`).attach('files', Buffer.concat([small, Buffer.alloc(16 * 1024 * 1024)]), { filename: 'huge.jpg' });
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/15 MB/);
    const none = await tech.post(`/api/repair-orders/${orderId}/attachments`).field('note', 'x');
    expect(none.status).toBe(400);
    expect(none.body.error.code).toBe('no_files');
    const wrongField = await tech.post(`/api/repair-orders/${orderId}/attachments`).attach('photo', small, { filename: 'a.jpg' });
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.message).toMatch(/"files"/);
    expect((await rowsOf(orderId)).length).toBe(before);
  });

  it('lets only the assigned tech, leads and owners upload; another shop gets 404', async () => {
    const small = await jpeg(8, 8);
    const { order: leadsOrder } = await makeOrder(ctx, { assignTo: ctx.demo.users.lead.id });
    const tech = await ctx.agent('tech');
    const notMine = await tech.post(`/api/repair-orders/${leadsOrder.id}/attachments`).attach('files', small, { filename: 'a.jpg' });
    expect(notMine.status).toBe(403);
    const writer = await ctx.agent('writer');
    expect((await writer.post(`/api/repair-orders/${leadsOrder.id}/attachments`).attach('files', small, { filename: 'a.jpg' })).status).toBe(403);
    const other = await ctx.otherShopAgent('owner');
    expect((await other.post(`/api/repair-orders/${leadsOrder.id}/attachments`).attach('files', small, { filename: 'a.jpg' })).status).toBe(404);
    const owner = await ctx.agent('owner');
    const ok = await owner.post(`/api/repair-orders/${leadsOrder.id}/attachments`).attach('files', small, { filename: 'a.jpg' });
    expect(ok.status).toBe(201);
    const removed = await owner.delete(`/api/attachments/${ok.body.attachments[0].id}`);
    expect(removed.status).toBe(204);
    expect((await owner.get(ok.body.attachments[0].url)).status).toBe(404);
  });
});

import { makeHarnessScript } from '../support/make-harness';
import { execFileSync } from 'node:child_process';
import { count } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { harnesses, pins, revisions, wires } from '../../server/db/schema';
import { demoHarnesses } from '../../seeds/harnesses/index';
import { layOutDocument } from '../../server/harness/layout';
import { LAYOUT_AT_IMPORT_MAX_COMPONENTS, layOutOffThread } from '../../server/harness/layout-thread';
import type { HarnessDocument } from '../../shared/harness';
import { createTestContext, type TestContext } from '../support/server-context';

const makeHarness = (circuits: number) =>
  JSON.parse(execFileSync('python3', [makeHarnessScript, String(circuits)], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 })) as Record<string, unknown>;

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(async () => {
  await ctx?.close();
});

async function harnessCount() {
  const [row] = await ctx.db.select({ n: count() }).from(harnesses);
  return Number(row.n);
}

describe('POST /api/harnesses/import', () => {
  it('imports make_harness.py 100 as a draft and exports exactly the same document', async () => {
    const doc = makeHarness(100);
    const lead = await ctx.agent('lead');
    const res = await lead.post('/api/harnesses/import').send(doc);
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ harnessId: expect.stringMatching(/^[a-z2-7]{26}$/), revisionId: expect.stringMatching(/^[a-z2-7]{26}$/) });

    const exported = await lead.get(`/api/revisions/${res.body.revisionId}/export`);
    expect(exported.status).toBe(200);
    expect(exported.body).toEqual(doc);
    // Key order of the top level survives too.
    expect(Object.keys(exported.body)).toEqual(Object.keys(doc));

    const view = await lead.get(`/api/revisions/${res.body.revisionId}`);
    expect(view.status).toBe(200);
    expect(view.body.revision).toMatchObject({ id: res.body.revisionId, harnessId: res.body.harnessId, status: 'draft', version: 1, number: 1 });
    expect(view.body.document).toEqual(doc);
    // Laid out on import (on the server's layout thread): the same places the shared layout gives in process.
    const expected = await layOutDocument(doc as unknown as HarnessDocument);
    const stored = view.body.positions as Record<string, { x: number; y: number }>;
    expect(Object.keys(stored).sort()).toEqual(Object.keys(expected).sort());
    for (const [id, p] of Object.entries(expected)) {
      expect(Math.abs(stored[id].x - p.x) + Math.abs(stored[id].y - p.y), id).toBeLessThan(0.01);
    }
  });

  it('stores a harness too big to lay out on import without positions (the editor lays it out)', async () => {
    const doc = makeHarness(1);
    const many = { components: Array.from({ length: LAYOUT_AT_IMPORT_MAX_COMPONENTS + 1 }, (_, i) => ({ ...(doc.components as object[])[0], id: `C${i}` })), wires: [] };
    expect(await layOutOffThread(many as unknown as HarnessDocument)).toBeUndefined();
  });

  it('stores wires as foreign keys to pins: every wire row points at two pin rows', async () => {
    const [w] = await ctx.db.select({ n: count() }).from(wires);
    const [p] = await ctx.db.select({ n: count() }).from(pins);
    expect(Number(w.n)).toBeGreaterThan(400);
    expect(Number(p.n)).toBeGreaterThan(Number(w.n));
    // The database itself refuses a wire to a pin that does not exist.
    const [one] = await ctx.db.select().from(wires).limit(1);
    await expect(ctx.db.insert(wires).values({ ...one, id: 'zzzzzzzzzzzzzzzzzzzzzzzzzz', key: 'WX', fromPinId: 'aaaaaaaaaaaaaaaaaaaaaaaaaa' })).rejects.toThrow();
  });

  it('imports every demo harness and exports each exactly', async () => {
    const owner = await ctx.agent('owner');
    for (const [key, doc] of Object.entries(demoHarnesses)) {
      const res = await owner.post('/api/harnesses/import').send(doc);
      expect(res.status, `${key}: ${JSON.stringify(res.body).slice(0, 400)}`).toBe(201);
      const exported = await owner.get(`/api/revisions/${res.body.revisionId}/export`);
      expect(exported.body, key).toEqual(JSON.parse(JSON.stringify(doc)));
    }
  });

  it('accepts a multipart upload of a .json file in the field "file"', async () => {
    const doc = makeHarness(3);
    const lead = await ctx.agent('lead');
    const res = await lead.post('/api/harnesses/import').attach('file', Buffer.from(JSON.stringify(doc)), { filename: 'small.json', contentType: 'application/json' });
    expect(res.status).toBe(201);
    const exported = await lead.get(`/api/revisions/${res.body.revisionId}/export`);
    expect(exported.body).toEqual(doc);
  });

  it('refuses uploads that are not JSON, in another field, or not parseable', async () => {
    const lead = await ctx.agent('lead');
    const png = await lead.post('/api/harnesses/import').attach('file', Buffer.from([0x89, 0x50, 0x4e, 0x47]), { filename: 'photo.png', contentType: 'image/png' });
    expect(png.status).toBe(415);
    expect(png.body.error.code).toBe('unsupported_type');
    const field = await lead.post('/api/harnesses/import').attach('document', Buffer.from('{}'), { filename: 'a.json', contentType: 'application/json' });
    expect(field.status).toBe(400);
    expect(field.body.error.message).toContain('"file"');
    const broken = await lead.post('/api/harnesses/import').attach('file', Buffer.from('{"format": '), { filename: 'a.json', contentType: 'application/json' });
    expect(broken.status).toBe(400);
    expect(broken.body.error.code).toBe('invalid_json');
    const text = await lead.post('/api/harnesses/import').set('Content-Type', 'text/csv').send('a,b');
    expect(text.status).toBe(415);
  });

  it('answers 422 with every problem and its JSON path, and stores nothing', async () => {
    const before = await harnessCount();
    const doc = makeHarness(3) as { wires: Array<Record<string, unknown>>; components: Array<Record<string, unknown>> };
    doc.wires[4].color = 'purple';
    doc.components[0].bogus = 1;
    const lead = await ctx.agent('lead');
    const res = await lead.post('/api/harnesses/import').send(doc);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_document');
    const paths = (res.body.error.details as Array<{ path: string }>).map((d) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['$.wires[4].color', '$.components[0].bogus']));
    // A reference to a pin that does not exist.
    const dangling = makeHarness(3) as { wires: Array<Record<string, unknown>> };
    dangling.wires[2].to = 'NOPE.1';
    const res2 = await lead.post('/api/harnesses/import').send(dangling);
    expect(res2.status).toBe(422);
    expect((res2.body.error.details as Array<{ path: string }>).some((d) => d.path.startsWith('$.wires[2].to'))).toBe(true);
    expect(await harnessCount()).toBe(before);
  });

  it('refuses a hostile document quickly and keeps answering', async () => {
    const lead = await ctx.agent('lead');
    const before = await harnessCount();
    const deep = '['.repeat(200_000) + ']'.repeat(200_000);
    const t0 = Date.now();
    const r1 = await lead.post('/api/harnesses/import').set('Content-Type', 'application/json').send(deep);
    expect(r1.status).toBe(422);
    expect(r1.body.error.details[0].message).toMatch(/deeper/);
    const longString = { ...makeHarness(1), name: 'x'.repeat(3_000_000) };
    const r2 = await lead.post('/api/harnesses/import').send(longString);
    expect(r2.status).toBe(422);
    const hugeArray = { ...makeHarness(1), states: new Array(300_000).fill({ id: 's', switches: {} }) };
    const r3 = await lead.post('/api/harnesses/import').send(hugeArray);
    expect(r3.status).toBe(422);
    const tooBig = await lead.post('/api/harnesses/import').set('Content-Type', 'application/json').send(`{"name":"${'y'.repeat(21 * 1024 * 1024)}"}`);
    expect(tooBig.status).toBe(413);
    const notAnObject = await lead.post('/api/harnesses/import').send([1, 2, 3]);
    expect(notAnObject.status).toBe(422);
    // Refusals are quick (generous bound: this is not a timing test, it guards against a hang).
    expect(Date.now() - t0).toBeLessThan(20_000);
    expect((await ctx.request.get('/api/health')).status).toBe(200);
    expect(await harnessCount()).toBe(before);
  });

  it('is for leads and owners only; others 401/403', async () => {
    const doc = makeHarness(1);
    expect((await ctx.request.post('/api/harnesses/import').send(doc)).status).toBe(401);
    for (const role of ['tech', 'writer'] as const) {
      const res = await (await ctx.agent(role)).post('/api/harnesses/import').send(doc);
      expect(res.status, role).toBe(403);
    }
  });

  it('files the harness under a model of the shop; a model of another shop is 404', async () => {
    const lead = await ctx.agent('lead');
    const model = await lead.post('/api/models').send({ kind: 'attachment', maker: 'Test Works', model: 'TW-1' });
    expect(model.status).toBe(201);
    const res = await lead.post(`/api/harnesses/import?model=${model.body.model.id}`).send(makeHarness(1));
    expect(res.status).toBe(201);
    const h = await lead.get(`/api/harnesses/${res.body.harnessId}`);
    expect(h.body.harness).toMatchObject({ modelId: model.body.model.id, modelName: 'Test Works TW-1', draftRevisionId: res.body.revisionId, publishedRevisionId: null });

    const other = await ctx.otherShopAgent('lead');
    const before = await harnessCount();
    const refused = await other.post(`/api/harnesses/import?model=${model.body.model.id}`).send(makeHarness(1));
    expect(refused.status).toBe(404);
    expect(await harnessCount()).toBe(before);
    // Nor does the other shop see the harness or its revision.
    expect((await other.get(`/api/harnesses/${res.body.harnessId}`)).status).toBe(404);
    expect((await other.get(`/api/revisions/${res.body.revisionId}/export`)).status).toBe(404);
    const [revs] = await ctx.db.select({ n: count() }).from(revisions);
    expect(Number(revs.n)).toBeGreaterThan(0);
  });
});

/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { harnessesChanged, ShopCache, shopGeneration } from '../../server/harness/shop-changes';
import { makeHarnessScript } from '../support/make-harness';
import { createTestContext, type TestAgent, type TestContext } from '../support/server-context';

const harnessJson = (circuits: number) => execFileSync('python3', [makeHarnessScript, String(circuits)], { encoding: 'utf8' });

let ctx: TestContext;
let lead: TestAgent;
let tech: TestAgent;

/** A new harness from the generator, published; the pin XA1.1 is in it. */
async function publishedHarness(): Promise<{ harnessId: string; revisionId: string }> {
  const res = await lead.post('/api/harnesses/import').set('Content-Type', 'application/json').send(harnessJson(3));
  expect(res.status).toBe(201);
  expect((await lead.post(`/api/revisions/${res.body.revisionId}/publish`).send({ note: 'cache tests' })).status).toBe(200);
  return res.body;
}

beforeAll(async () => {
  ctx = await createTestContext();
  lead = await ctx.agent('lead');
  tech = await ctx.agent('tech');
});
afterAll(async () => {
  await ctx?.close();
});

describe('ShopCache (a hand-driven clock)', () => {
  it('keeps an entry for ttlMs, until a change in its shop, at most `capacity` of them', () => {
    let now = 0;
    const cache = new ShopCache<string>(2, 2000, () => now);
    const shop = `shop-${Math.random()}`;
    const other = `shop-${Math.random()}`;
    cache.set('a', shop, 'A', shopGeneration(shop));
    cache.set('b', other, 'B', shopGeneration(other));
    expect(cache.get('a')).toBe('A');
    harnessesChanged(shop);
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('b')).toBe('B');
    now += 2000;
    expect(cache.get('b')).toBeUndefined();
    for (const k of ['c', 'd', 'e']) cache.set(k, shop, k, shopGeneration(shop));
    expect(cache.size).toBe(2);
    expect(cache.get('c')).toBeUndefined();
  });

  it('does not store what was read before a change in the shop', () => {
    const cache = new ShopCache<string>(10, 2000, () => 0);
    const shop = `shop-${Math.random()}`;
    const before = shopGeneration(shop);
    harnessesChanged(shop);
    cache.set('a', shop, 'A', before);
    expect(cache.get('a')).toBeUndefined();
  });
});

describe('GET /api/revisions/:id/readings: ETag and 304', () => {
  it('answers 304 with no body to the ETag it gave; another state has another ETag', async () => {
    const { revisionId } = await publishedHarness();
    const first = await tech.get(`/api/revisions/${revisionId}/readings?state=key_on`);
    expect(first.status).toBe(200);
    const etag = first.headers.etag;
    expect(etag).toMatch(/^".+"$/);
    expect(first.headers['cache-control']).toBe('private, no-cache');
    const again = await tech.get(`/api/revisions/${revisionId}/readings?state=key_on`).set('If-None-Match', etag);
    expect(again.status).toBe(304);
    expect(again.text ?? '').toBe('');
    const off = await tech.get(`/api/revisions/${revisionId}/readings?state=key_off`).set('If-None-Match', etag);
    expect(off.status).toBe(200);
    expect(off.headers.etag).not.toBe(etag);
    expect(off.body.state).toBe('key_off');
  });

  it('the ETag opens nothing: another shop gets 404, no session 401, an unknown state 400', async () => {
    const { revisionId } = await publishedHarness();
    const etag = (await tech.get(`/api/revisions/${revisionId}/readings?state=key_on`)).headers.etag;
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get(`/api/revisions/${revisionId}/readings?state=key_on`).set('If-None-Match', etag)).status).toBe(404);
    expect((await ctx.request.get(`/api/revisions/${revisionId}/readings?state=key_on`).set('If-None-Match', etag)).status).toBe(401);
    expect((await tech.get(`/api/revisions/${revisionId}/readings?state=nope`).set('If-None-Match', etag)).status).toBe(400);
  });

  it('a draft gets a new ETag with every save, and the old one is answered with the new readings', async () => {
    const { harnessId, revisionId } = await publishedHarness();
    const draft = (await lead.post(`/api/harnesses/${harnessId}/draft`)).body.revision;
    const before = await lead.get(`/api/revisions/${draft.id}/readings?state=key_off`);
    expect(before.status).toBe(200);
    expect((await tech.get(`/api/revisions/${draft.id}/readings?state=key_off`).set('If-None-Match', before.headers.etag)).status).toBe(404);
    const saved = await lead.patch(`/api/revisions/${draft.id}/components/BATT`).send({ version: draft.version, changes: { volts: 11.8 } });
    expect(saved.status).toBe(200);
    const after = await lead.get(`/api/revisions/${draft.id}/readings?state=key_off`).set('If-None-Match', before.headers.etag);
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    expect(after.body.pins.find((p: any) => p.ref === 'BATT.+').volts).toBeLessThan(11.81);
    // The published revision keeps its readings and its ETag.
    const pub = await lead.get(`/api/revisions/${revisionId}/readings?state=key_off`);
    expect(pub.body.pins.find((p: any) => p.ref === 'BATT.+').volts).toBe(before.body.pins.find((p: any) => p.ref === 'BATT.+').volts);
  });
});

describe('what this instance keeps for a shop ends with the change', () => {
  it('a deleted harness: its published readings answer 404 at once, and search no longer finds it', async () => {
    const { harnessId, revisionId } = await publishedHarness();
    expect((await tech.get(`/api/revisions/${revisionId}/readings?state=key_on`)).status).toBe(200);
    const found = (await tech.get('/api/search').query({ q: 'XA1.1' })).body.results;
    expect(found.some((r: any) => r.harnessId === harnessId)).toBe(true);
    expect((await lead.delete(`/api/harnesses/${harnessId}`)).status).toBe(204);
    expect((await tech.get(`/api/revisions/${revisionId}/readings?state=key_on`)).status).toBe(404);
    const after = (await tech.get('/api/search').query({ q: 'XA1.1' })).body.results;
    expect(after.some((r: any) => r.harnessId === harnessId)).toBe(false);
  });

  it('a publish: a tech’s search covers the new revision at once', async () => {
    const res = await lead.post('/api/harnesses/import').set('Content-Type', 'application/json').send(harnessJson(2));
    const { harnessId, revisionId } = res.body;
    expect((await tech.get('/api/search').query({ q: 'XA1.1' })).body.results.some((r: any) => r.harnessId === harnessId)).toBe(false);
    expect((await lead.post(`/api/revisions/${revisionId}/publish`).send({ note: 'now' })).status).toBe(200);
    expect((await tech.get('/api/search').query({ q: 'XA1.1' })).body.results.some((r: any) => r.harnessId === harnessId)).toBe(true);
  });

  it('a model renamed: search shows the new name at once', async () => {
    const { harnessId } = await publishedHarness();
    const model = (await lead.post('/api/models').send({ kind: 'machine', maker: 'Oakridge', model: 'T-1' })).body.model;
    expect((await lead.patch(`/api/harnesses/${harnessId}`).send({ modelId: model.id })).status).toBe(200);
    const named = async () => (await tech.get('/api/search').query({ q: 'XA1.1' })).body.results.find((r: any) => r.harnessId === harnessId)?.modelName;
    expect(await named()).toContain('T-1');
    expect((await lead.patch(`/api/models/${model.id}`).send({ model: 'T-2' })).status).toBe(200);
    expect(await named()).toContain('T-2');
  });

  it('another shop searching the same words finds none of ours', async () => {
    await publishedHarness();
    expect((await tech.get('/api/search').query({ q: 'XA1.1' })).body.results.length).toBeGreaterThan(0);
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get('/api/search').query({ q: 'XA1.1' })).body.results).toEqual([]);
  });
});

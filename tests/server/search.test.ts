/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { krT78MainHarness } from '../../seeds/harnesses/index';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext({ demo: 'full' });
});
afterAll(async () => {
  await ctx?.close();
});

const doc = krT78MainHarness;
const search = async (role: 'owner' | 'lead' | 'tech' | 'writer', q: string) => {
  const res = await (await ctx.agent(role)).get('/api/search').query({ q });
  expect(res.status).toBe(200);
  return res.body.results as any[];
};

describe('GET /api/search', () => {
  it('finds a wire by circuit number and links it to its first pin', async () => {
    const wire = doc.wires.find((w) => w.circuit)!;
    const results = await search('tech', wire.circuit!);
    const [component, pin] = wire.from.split('.');
    // The same wire is in the loader harness and in both fitted-attachment harnesses.
    const hits = results.filter((r) => r.kind === 'wire' && r.componentId === component && r.pinId === pin && r.circuit === wire.circuit);
    expect(hits.map((h) => h.harnessName).sort()).toEqual(['Main harness and front attachment circuit', 'With FW-G72 grapple fitted', 'With FW-M60 mulcher fitted']);
    const hit = hits.find((h) => h.harnessName === 'Main harness and front attachment circuit');
    expect(hit, JSON.stringify(results.slice(0, 5))).toMatchObject({
      revisionStatus: 'published',
      modelName: 'Kestrel Ridge Machinery KR-T78 (K)',
      matched: 'circuit',
    });
    expect(hit.revisionId).toMatch(/^[a-z2-7]{26}$/);
  });

  it('finds wires by IEC 60757 colour code, base colour matching striped wires too', async () => {
    const striped = doc.wires.find((w) => w.color?.includes('/'))!;
    const base = striped.color!.split('/')[0];
    const results = await search('tech', base);
    expect(results.some((r) => r.kind === 'wire' && r.color === striped.color)).toBe(true);
    expect(results.filter((r) => r.kind === 'wire').every((r) => r.color === base || r.color.startsWith(`${base}/`))).toBe(true);
  });

  it('finds components by id and label, pins by COMPONENT.PIN and by cavity function', async () => {
    const connector = doc.components.find((c) => c.kind === 'connector' && c.label)!;
    const byId = await search('tech', connector.id);
    expect(byId.some((r) => r.kind === 'component' && r.componentId === connector.id)).toBe(true);
    const word = connector.label!.split(/\s+/).find((w) => w.length > 4)!;
    const byLabel = await search('tech', word);
    expect(byLabel.some((r) => r.kind === 'component' && r.label.includes(word))).toBe(true);

    const withFunction = doc.components.flatMap((c) => (c.kind === 'connector' ? c.cavities.filter((cv) => typeof cv !== 'string' && cv.function).map((cv) => ({ c, cv: cv as { id: string; function: string } })) : []))[0];
    const ref = `${withFunction.c.id}.${withFunction.cv.id}`;
    const byRef = await search('tech', ref);
    expect(byRef[0]).toMatchObject({ kind: 'pin', componentId: withFunction.c.id, pinId: withFunction.cv.id, matched: 'pin' });
    const byFunction = await search('tech', withFunction.cv.function);
    expect(byFunction.some((r) => r.kind === 'pin' && r.componentId === withFunction.c.id && r.pinId === withFunction.cv.id && r.function === withFunction.cv.function)).toBe(true);
  });

  it('techs and writers search published revisions only; leads find the draft too', async () => {
    // W128 exists only in the draft in progress (the backup alarm feed).
    const techHits = await search('tech', 'W128');
    expect(techHits.some((r) => r.revisionStatus === 'draft')).toBe(false);
    expect((await search('writer', 'W128')).some((r) => r.revisionStatus === 'draft')).toBe(false);
    const leadHits = await search('lead', 'W128');
    expect(leadHits.some((r) => r.revisionStatus === 'draft' && r.kind === 'wire' && r.componentId === 'MCU' && r.pinId === '23')).toBe(true);
  });

  it('sees a draft edit at once (results are never stale)', async () => {
    const lead = await ctx.agent('lead');
    expect(await search('lead', 'Z777')).toEqual([]);
    const draft = (await lead.get('/api/harnesses')).body.harnesses.find((h: any) => h.draftRevisionId);
    const rev = (await lead.get(`/api/revisions/${draft.draftRevisionId}`)).body.revision;
    const res = await lead.patch(`/api/revisions/${rev.id}/wires/W128`).send({ version: rev.version, changes: { circuit: 'Z777' } });
    expect(res.status).toBe(200);
    const hits = await search('lead', 'Z777');
    expect(hits.map((h) => [h.kind, h.componentId, h.pinId, h.circuit])).toEqual([['wire', 'MCU', '23', 'Z777']]);
    await lead.patch(`/api/harnesses/${draft.id}`).send({ name: 'Main harness (renamed)' });
    expect((await search('lead', 'Z777'))[0].harnessName).toBe('Main harness (renamed)');
  });

  it('stays inside the shop, needs a session and a query', async () => {
    const other = await ctx.otherShopAgent('owner');
    const res = await other.get('/api/search').query({ q: doc.wires[0].id });
    expect(res.status).toBe(200);
    expect(res.body.results).toEqual([]);
    expect((await ctx.request.get('/api/search?q=W1')).status).toBe(401);
    const empty = await (await ctx.agent('tech')).get('/api/search').query({ q: '  ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.details[0].path).toBe('$.q');
    // LIKE wildcards are taken literally.
    expect(await search('tech', '%')).toEqual([]);
  });
});

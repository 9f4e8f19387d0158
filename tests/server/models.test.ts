/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MATE_GAP, documentGeometry, matePairs, type Positions } from '../../shared/drawing/geometry';
import type { HarnessDocument } from '../../shared/harness';
import { harnessDocument, harnessDraft, harnessLinks, models } from '../../seeds/library';
import { createTestContext, type TestContext } from '../support/server-context';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext({ demo: 'full' });
});
afterAll(async () => {
  await ctx?.close();
});

describe('the demo library after the full seed', () => {
  it('has every library model with its harnesses, published, and one draft in progress', async () => {
    const lead = await ctx.agent('lead');
    const res = await lead.get('/api/models');
    expect(res.status).toBe(200);
    expect(res.body.models.map((m: any) => m.model).sort()).toEqual(models.map((m) => m.model).sort());
    const loader = res.body.models.find((m: any) => m.model === 'KR-T78');
    expect(loader).toMatchObject({ kind: 'machine', maker: 'Kestrel Ridge Machinery', harnessCount: 3 });

    const list = (await lead.get('/api/harnesses')).body.harnesses;
    expect(list).toHaveLength(harnessLinks.length);
    expect(list.every((h: any) => h.publishedRevisionId && h.modelId)).toBe(true);
    const withDraft = list.filter((h: any) => h.draftRevisionId);
    expect(withDraft.map((h: any) => h.name)).toEqual(['Main harness and front attachment circuit']);

    // The published documents are exactly the demo ones; the draft is the draft in progress.
    for (const link of harnessLinks) {
      const h = list.find((x: any) => x.name === link.title);
      const exported = await lead.get(`/api/revisions/${h.publishedRevisionId}/export`);
      expect(exported.body, link.key).toEqual(JSON.parse(JSON.stringify(harnessDocument(link.key))));
      const draft = harnessDraft(link.key);
      if (draft) expect((await lead.get(`/api/revisions/${h.draftRevisionId}/export`)).body).toEqual(JSON.parse(JSON.stringify(draft)));
    }

    const tech = await ctx.agent('tech');
    const techList = (await tech.get('/api/harnesses')).body.harnesses;
    expect(techList).toHaveLength(harnessLinks.length);
    expect(techList.every((h: any) => h.draftRevisionId === null)).toBe(true);
    const one = await tech.get(`/api/models/${loader.id}`);
    expect(one.status).toBe(200);
    expect(one.body.harnesses).toHaveLength(3);
  });

  it('stores every revision laid out: a position for each component, no two boxes on each other', async () => {
    const lead = await ctx.agent('lead');
    const list = (await lead.get('/api/harnesses')).body.harnesses;
    const revisionIds = list.flatMap((h: any) => [h.publishedRevisionId, h.draftRevisionId].filter(Boolean));
    expect(revisionIds).toHaveLength(harnessLinks.length + 1);
    for (const id of revisionIds) {
      const { document, positions } = (await lead.get(`/api/revisions/${id}`)).body as { document: HarnessDocument; positions: Positions };
      const name = `${document.name} (${id})`;
      expect(Object.keys(positions).sort(), name).toEqual(document.components.map((c) => c.id).sort());
      const geom = documentGeometry(document);
      const boxes = document.components.map((c) => ({ id: c.id, ...positions[c.id], w: geom.get(c.id)!.width, h: geom.get(c.id)!.height }));
      for (const [i, a] of boxes.entries()) {
        for (const b of boxes.slice(i + 1)) {
          const overlap = a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
          expect(overlap, `${name}: ${a.id} on ${b.id}`).toBe(false);
        }
      }
      // A mated pair sits side by side, mating faces together, as the layout keeps it.
      for (const [a, b] of matePairs(document)) {
        expect(positions[b].x - positions[a].x, `${name}: ${a}–${b}`).toBe(geom.get(a)!.width + MATE_GAP);
        expect(positions[b].y, `${name}: ${a}–${b}`).toBe(positions[a].y);
      }
    }
  });

  it('another shop sees none of it', async () => {
    const other = await ctx.otherShopAgent('owner');
    expect((await other.get('/api/models')).body.models).toEqual([]);
    expect((await other.get('/api/harnesses')).body.harnesses).toEqual([]);
  });
});

describe('/api/models', () => {
  it('leads and owners create, change and delete models; harnesses stay, unfiled', async () => {
    const owner = await ctx.agent('owner');
    const created = await owner.post('/api/models').send({ kind: 'attachment', maker: 'Ferrowood Attachments', model: 'FW-T40', series: '1', notes: 'Trencher (test)' });
    expect(created.status).toBe(201);
    expect(created.body.model).toMatchObject({ kind: 'attachment', model: 'FW-T40', series: '1', displayName: 'Ferrowood Attachments FW-T40 (1)', harnessCount: 0 });
    const id = created.body.model.id;

    const dup = await owner.post('/api/models').send({ kind: 'attachment', maker: 'Ferrowood Attachments', model: 'FW-T40' });
    expect(dup.status).toBe(409);
    const bad = await owner.post('/api/models').send({ kind: 'boat', maker: '', model: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: any) => d.path)).toEqual(expect.arrayContaining(['$.kind', '$.maker']));

    const lead = await ctx.agent('lead');
    const patched = await lead.patch(`/api/models/${id}`).send({ notes: 'Chain trencher', series: null });
    expect(patched.status).toBe(200);
    expect(patched.body.model).toMatchObject({ notes: 'Chain trencher', series: null });

    const filtered = await lead.get('/api/models?kind=attachment&q=T40');
    expect(filtered.body.models.map((m: any) => m.id)).toEqual([id]);

    const imp = await lead.post(`/api/harnesses/import?model=${id}`).send(harnessDocument('fw-g72-grapple'));
    expect(imp.status).toBe(201);
    expect((await lead.get(`/api/models/${id}`)).body.harnesses).toHaveLength(1);
    expect((await lead.delete(`/api/models/${id}`)).status).toBe(204);
    expect((await lead.get(`/api/models/${id}`)).status).toBe(404);
    const h = await lead.get(`/api/harnesses/${imp.body.harnessId}`);
    expect(h.status).toBe(200);
    expect(h.body.harness.modelId).toBeNull();
  });

  it('techs and writers read only; other shops get 404; no session 401', async () => {
    const lead = await ctx.agent('lead');
    const id = (await lead.post('/api/models').send({ kind: 'machine', maker: 'Kestrel Ridge Machinery', model: 'KR-S50' })).body.model.id;
    for (const role of ['tech', 'writer'] as const) {
      const agent = await ctx.agent(role);
      expect((await agent.get('/api/models')).status).toBe(200);
      expect((await agent.get(`/api/models/${id}`)).status).toBe(200);
      expect((await agent.post('/api/models').send({ kind: 'machine', maker: 'A', model: 'B' })).status).toBe(403);
      expect((await agent.patch(`/api/models/${id}`).send({ notes: 'x' })).status).toBe(403);
      expect((await agent.delete(`/api/models/${id}`)).status).toBe(403);
    }
    const other = await ctx.otherShopAgent('owner');
    expect((await other.get(`/api/models/${id}`)).status).toBe(404);
    expect((await other.patch(`/api/models/${id}`).send({ notes: 'x' })).status).toBe(404);
    expect((await other.delete(`/api/models/${id}`)).status).toBe(404);
    expect((await ctx.request.get('/api/models')).status).toBe(401);
    expect((await lead.get(`/api/models/${id}`)).status).toBe(200);
  });
});

/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { makeHarnessScript } from '../support/make-harness';
import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent, type TestContext } from '../support/server-context';

type Doc = Record<string, any>;
const makeHarness = (circuits: number): Doc => JSON.parse(execFileSync('python3', [makeHarnessScript, String(circuits)], { encoding: 'utf8' }));

let ctx: TestContext;
let lead: TestAgent;
beforeAll(async () => {
  ctx = await createTestContext();
  lead = await ctx.agent('lead');
});
afterAll(async () => {
  await ctx?.close();
});

async function importDraft(doc: Doc = makeHarness(4)) {
  const res = await lead.post('/api/harnesses/import').send(doc);
  expect(res.status).toBe(201);
  return res.body as { harnessId: string; revisionId: string };
}
const getRev = async (id: string, agent: TestAgent = lead) => (await agent.get(`/api/revisions/${id}`)).body as { revision: any; document: Doc; positions: any };

describe('whole-document saves', () => {
  it('replaces the draft, bumps the version, keeps positions; a stale version is 409 and changes nothing', async () => {
    const { revisionId } = await importDraft();
    const doc = (await getRev(revisionId)).document;
    const changed = structuredClone(doc);
    changed.name = 'Renamed harness';
    changed.wires[0].color = 'RD/WH';
    const ok = await lead.put(`/api/revisions/${revisionId}/document`).send({ version: 1, document: changed, positions: { BATT: { x: 10, y: 20.5 } } });
    expect(ok.status).toBe(200);
    expect(ok.body.version).toBe(2);
    expect(ok.body.revision).toMatchObject({ id: revisionId, version: 2, status: 'draft' });
    const after = await getRev(revisionId);
    expect(after.document).toEqual(changed);
    expect(after.positions).toEqual({ BATT: { x: 10, y: 20.5 } });

    const stale = structuredClone(doc);
    stale.name = 'Stale';
    const conflict = await lead.put(`/api/revisions/${revisionId}/document`).send({ version: 1, document: stale });
    expect(conflict.status).toBe(409);
    expect(conflict.body.error.code).toBe('version_conflict');
    expect(conflict.body.error.details.current).toMatchObject({ version: 2, updatedBy: { name: expect.any(String) }, updatedAt: expect.any(String) });
    expect((await getRev(revisionId)).document).toEqual(changed);
  });

  it('answers 422 with every problem for an invalid document and keeps the draft', async () => {
    const { revisionId } = await importDraft();
    const before = await getRev(revisionId);
    const bad = structuredClone(before.document);
    bad.wires[1].lengthM = -1;
    bad.components[1].kind = 'capacitor';
    const res = await lead.put(`/api/revisions/${revisionId}/document`).send({ version: 1, document: bad });
    expect(res.status).toBe(422);
    const paths = res.body.error.details.map((d: any) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['$.wires[1].lengthM']));
    expect(paths.some((p: string) => p.startsWith('$.components[1]'))).toBe(true);
    const after = await getRev(revisionId);
    expect(after.document).toEqual(before.document);
    expect(after.revision.version).toBe(1);
  });

  it('50 concurrent saves of the same version: exactly one wins, 49 get 409, the stored draft is the winner', async () => {
    const { revisionId } = await importDraft(makeHarness(6));
    const base = (await getRev(revisionId)).document;
    const variants = Array.from({ length: 50 }, (_, i) => {
      const d = structuredClone(base);
      d.name = `Variant ${i}`;
      d.wires[i % d.wires.length].lengthM = 1 + i / 100;
      return d;
    });
    const results = await Promise.all(variants.map((document) => lead.put(`/api/revisions/${revisionId}/document`).send({ version: 1, document })));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(49);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('version_conflict');
    const winner = results.findIndex((r) => r.status === 200);
    const stored = await getRev(revisionId);
    expect(stored.revision.version).toBe(2);
    expect(stored.document).toEqual(variants[winner]);
  });
});

describe('granular edits', () => {
  it('adds, changes and removes a component, a pin, a wire, a clamp and a state, each bumping the version', async () => {
    const { revisionId } = await importDraft();
    let v = 1;
    const step = async (res: { status: number; body: any }, status = 200) => {
      expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(status);
      expect(res.body.version).toBe(v + 1);
      v = res.body.version;
    };
    await step(await lead.post(`/api/revisions/${revisionId}/components`).send({ version: v, component: { id: 'X99', kind: 'connector', label: 'Test plug', cavities: ['1', '2'] }, position: { x: 5, y: 6 } }), 201);
    await step(await lead.post(`/api/revisions/${revisionId}/components/X99/pins`).send({ version: v, pin: { id: '3', function: 'Work lamp feed' } }), 201);
    await step(await lead.patch(`/api/revisions/${revisionId}/components/X99/pins/1`).send({ version: v, changes: { function: 'Spare' } }));
    await step(await lead.patch(`/api/revisions/${revisionId}/components/X99`).send({ version: v, changes: { label: 'Test plug, rear', notes: 'Behind the seat' } }));
    await step(await lead.post(`/api/revisions/${revisionId}/wires`).send({ version: v, wire: { id: 'W900', from: 'BUS.S', to: 'X99.3', color: 'RD', size: { mm2: 1 }, lengthM: 2, circuit: 'C900' } }), 201);
    await step(await lead.patch(`/api/revisions/${revisionId}/wires/W900`).send({ version: v, changes: { color: 'RD/BK', circuit: null } }));
    await step(await lead.post(`/api/revisions/${revisionId}/clamps`).send({ version: v, clamp: { id: 'CL900', label: 'Seat bracket', wires: ['W900'] } }), 201);
    await step(await lead.post(`/api/revisions/${revisionId}/states`).send({ version: v, state: { id: 'x99_apart', label: 'X99 apart', switches: { K1: 'on' }, unplugged: [] } }), 201);
    await step(await lead.patch(`/api/revisions/${revisionId}/states/x99_apart`).send({ version: v, changes: { label: 'Key on, X99 apart' } }));

    let { document, positions } = await getRev(revisionId);
    const x99 = document.components.find((c: any) => c.id === 'X99');
    expect(x99).toEqual({ id: 'X99', kind: 'connector', label: 'Test plug, rear', notes: 'Behind the seat', cavities: [{ id: '1', function: 'Spare' }, '2', { id: '3', function: 'Work lamp feed' }] });
    expect(positions.X99).toEqual({ x: 5, y: 6 });
    expect(document.wires.find((w: any) => w.id === 'W900')).toEqual({ id: 'W900', from: 'BUS.S', to: 'X99.3', color: 'RD/BK', size: { mm2: 1 }, lengthM: 2 });
    expect(document.clamps.find((c: any) => c.id === 'CL900')).toEqual({ id: 'CL900', label: 'Seat bracket', wires: ['W900'] });
    expect(document.states.find((s: any) => s.id === 'x99_apart').label).toBe('Key on, X99 apart');

    // Removing the component takes its wire, and the clamp left without wires.
    await step(await lead.delete(`/api/revisions/${revisionId}/states/x99_apart?version=${v}`));
    await step(await lead.delete(`/api/revisions/${revisionId}/components/X99?version=${v}`));
    ({ document, positions } = await getRev(revisionId));
    expect(document.components.some((c: any) => c.id === 'X99')).toBe(false);
    expect(document.wires.some((w: any) => w.id === 'W900')).toBe(false);
    expect(document.clamps.some((c: any) => c.id === 'CL900')).toBe(false);
    expect(positions.X99).toBeUndefined();
  });

  it('validates the whole result: an edit that breaks the document is 422 and changes nothing', async () => {
    const { revisionId } = await importDraft();
    const before = await getRev(revisionId);
    const res = await lead.post(`/api/revisions/${revisionId}/wires`).send({ version: 1, wire: { id: 'W901', from: 'BUS.S', to: 'NOWHERE.1', size: { mm2: 1 }, lengthM: 1 } });
    expect(res.status).toBe(422);
    expect(res.body.error.details.some((d: any) => d.path.includes('wires['))).toBe(true);
    const dup = await lead.post(`/api/revisions/${revisionId}/components`).send({ version: 1, component: { id: 'BATT', kind: 'splice' } });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('already_exists');
    const fixed = await lead.post(`/api/revisions/${revisionId}/components/BATT/pins`).send({ version: 1, pin: 'x' });
    expect(fixed.status).toBe(400);
    const missing = await lead.patch(`/api/revisions/${revisionId}/wires/NOPE`).send({ version: 1, changes: { color: 'RD' } });
    expect(missing.status).toBe(404);
    const rename = await lead.patch(`/api/revisions/${revisionId}/components/BATT`).send({ version: 1, changes: { id: 'BAT2' } });
    expect(rename.status).toBe(400);
    const stale = await lead.patch(`/api/revisions/${revisionId}/components/BATT`).send({ version: 7, changes: { label: 'x' } });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    const noVersion = await lead.delete(`/api/revisions/${revisionId}/wires/W1`);
    expect(noVersion.status).toBe(400);
    const after = await getRev(revisionId);
    expect(after.document).toEqual(before.document);
    expect(after.revision.version).toBe(1);
  });

  it('saves positions on their own; unknown ids are ignored, bad values 400', async () => {
    const { revisionId } = await importDraft();
    // The import laid every component out; the save moves the two named and leaves the rest.
    const before = (await getRev(revisionId)).positions;
    const res = await lead.put(`/api/revisions/${revisionId}/positions`).send({ version: 1, positions: { BATT: { x: 1, y: 2 }, FM: { x: -3.5, y: 4 }, NOPE: { x: 9, y: 9 } } });
    expect(res.status).toBe(200);
    expect(res.body.version).toBe(2);
    expect((await getRev(revisionId)).positions).toEqual({ ...before, BATT: { x: 1, y: 2 }, FM: { x: -3.5, y: 4 } });
    const bad = await lead.put(`/api/revisions/${revisionId}/positions`).send({ version: 2, positions: { BATT: { x: 'left', y: 2 } } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('$.positions.BATT.x');
  });
});

describe('publish and drafts', () => {
  it('publish freezes a revision: every write answers 409 revision_published', async () => {
    const { harnessId, revisionId } = await importDraft();
    const doc = (await getRev(revisionId)).document;
    const pub = await lead.post(`/api/revisions/${revisionId}/publish`).send({ note: 'Checked on KRT78K10214' });
    expect(pub.status).toBe(200);
    expect(pub.body.revision).toMatchObject({ status: 'published', publishNote: 'Checked on KRT78K10214', publishedBy: { name: expect.any(String) }, publishedAt: expect.any(String) });
    const v = pub.body.revision.version;
    const writes = [
      lead.put(`/api/revisions/${revisionId}/document`).send({ version: v, document: doc }),
      lead.put(`/api/revisions/${revisionId}/positions`).send({ version: v, positions: { BATT: { x: 1, y: 1 } } }),
      lead.post(`/api/revisions/${revisionId}/components`).send({ version: v, component: { id: 'S999', kind: 'splice' } }),
      lead.patch(`/api/revisions/${revisionId}/components/BATT`).send({ version: v, changes: { label: 'x' } }),
      lead.delete(`/api/revisions/${revisionId}/components/BATT?version=${v}`),
      lead.post(`/api/revisions/${revisionId}/wires`).send({ version: v, wire: { id: 'W999', from: 'BUS.S', to: 'SBUS.S', size: { mm2: 1 }, lengthM: 1 } }),
      lead.delete(`/api/revisions/${revisionId}/wires/W1?version=${v}`),
      lead.post(`/api/revisions/${revisionId}/states`).send({ version: v, state: { id: 'z', switches: {} } }),
      lead.post(`/api/revisions/${revisionId}/publish`).send({}),
      lead.delete(`/api/revisions/${revisionId}`),
    ];
    for (const res of await Promise.all(writes)) {
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('revision_published');
    }
    expect((await getRev(revisionId)).document).toEqual(doc);

    // A new draft starts from it; asking again gives the same draft.
    const d1 = await lead.post(`/api/harnesses/${harnessId}/draft`);
    expect(d1.status).toBe(201);
    expect(d1.body.revision).toMatchObject({ status: 'draft', number: 2, parentRevisionId: revisionId, version: 1 });
    const d2 = await lead.post(`/api/harnesses/${harnessId}/draft`);
    expect(d2.status).toBe(200);
    expect(d2.body.revision.id).toBe(d1.body.revision.id);
    expect((await getRev(d1.body.revision.id)).document).toEqual(doc);

    const h = await lead.get(`/api/harnesses/${harnessId}`);
    expect(h.body.harness).toMatchObject({ publishedRevisionId: revisionId, publishedNumber: 1, draftRevisionId: d1.body.revision.id });
    expect(h.body.revisions.map((r: any) => r.number)).toEqual([2, 1]);
  });

  it('concurrent draft requests make one draft', async () => {
    const { harnessId, revisionId } = await importDraft();
    await lead.post(`/api/revisions/${revisionId}/publish`).send({});
    const results = await Promise.all(Array.from({ length: 8 }, () => lead.post(`/api/harnesses/${harnessId}/draft`)));
    expect(new Set(results.map((r) => r.body.revision.id)).size).toBe(1);
    expect(results.filter((r) => r.status === 201)).toHaveLength(1);
  });

  it('techs and writers see published revisions only; drafts answer 404; they cannot edit or publish', async () => {
    const { harnessId, revisionId } = await importDraft();
    const tech = await ctx.agent('tech');
    const writer = await ctx.agent('writer');
    for (const agent of [tech, writer]) {
      expect((await agent.get(`/api/revisions/${revisionId}`)).status).toBe(404);
      expect((await agent.get(`/api/revisions/${revisionId}/export`)).status).toBe(404);
      expect((await agent.get(`/api/harnesses/${harnessId}`)).status).toBe(404);
      expect((await agent.get('/api/harnesses')).body.harnesses.some((h: any) => h.id === harnessId)).toBe(false);
      expect((await agent.post(`/api/revisions/${revisionId}/publish`).send({})).status).toBe(403);
      expect((await agent.put(`/api/revisions/${revisionId}/positions`).send({ version: 1, positions: {} })).status).toBe(403);
      expect((await agent.post(`/api/harnesses/${harnessId}/draft`)).status).toBe(403);
    }
    await lead.post(`/api/revisions/${revisionId}/publish`).send({ note: 'ok' });
    const draft = await lead.post(`/api/harnesses/${harnessId}/draft`);
    for (const agent of [tech, writer]) {
      expect((await agent.get(`/api/revisions/${revisionId}`)).status).toBe(200);
      const h = await agent.get(`/api/harnesses/${harnessId}`);
      expect(h.status).toBe(200);
      expect(h.body.harness.draftRevisionId).toBeNull();
      expect(h.body.revisions.map((r: any) => r.id)).toEqual([revisionId]);
      expect((await agent.get(`/api/revisions/${draft.body.revision.id}`)).status).toBe(404);
      expect((await agent.delete(`/api/revisions/${draft.body.revision.id}/wires/W1?version=1`)).status).toBe(403);
    }
    // Another shop sees nothing of it, whatever the role.
    const other = await ctx.otherShopAgent('owner');
    expect((await other.get(`/api/revisions/${revisionId}`)).status).toBe(404);
    expect((await other.put(`/api/revisions/${draft.body.revision.id}/positions`).send({ version: 1, positions: {} })).status).toBe(404);
    expect((await other.post(`/api/harnesses/${harnessId}/draft`)).status).toBe(404);
    expect((await other.delete(`/api/harnesses/${harnessId}`)).status).toBe(404);
    expect((await ctx.request.get(`/api/revisions/${revisionId}`)).status).toBe(401);
  });

  it('a draft can be discarded unless it is the only revision; a harness can be renamed and deleted', async () => {
    const { harnessId, revisionId } = await importDraft();
    const only = await lead.delete(`/api/revisions/${revisionId}`);
    expect(only.status).toBe(409);
    await lead.post(`/api/revisions/${revisionId}/publish`).send({});
    const draft = await lead.post(`/api/harnesses/${harnessId}/draft`);
    expect((await lead.delete(`/api/revisions/${draft.body.revision.id}`)).status).toBe(204);
    expect((await lead.get(`/api/revisions/${draft.body.revision.id}`)).status).toBe(404);
    const renamed = await lead.patch(`/api/harnesses/${harnessId}`).send({ name: 'Cab harness' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.harness.name).toBe('Cab harness');
    expect((await (await ctx.agent('tech')).delete(`/api/harnesses/${harnessId}`)).status).toBe(403);
    expect((await lead.delete(`/api/harnesses/${harnessId}`)).status).toBe(204);
    expect((await lead.get(`/api/harnesses/${harnessId}`)).status).toBe(404);
    expect((await lead.get(`/api/revisions/${revisionId}`)).status).toBe(404);
  });
});

describe('GET /api/revisions/:a/diff/:b', () => {
  it('lists what changed between a published revision and its draft, field by field', async () => {
    const { harnessId, revisionId } = await importDraft();
    await lead.post(`/api/revisions/${revisionId}/publish`).send({});
    const draft = (await lead.post(`/api/harnesses/${harnessId}/draft`)).body.revision;
    const doc = (await getRev(draft.id)).document;
    doc.wires[0].color = 'OG';
    doc.components = doc.components.filter((c: any) => c.id !== 'TB');
    doc.wires = doc.wires.filter((w: any) => !w.from.startsWith('TB.') && !w.to.startsWith('TB.'));
    doc.states.push({ id: 'crank', label: 'Cranking', switches: { K1: 'on' }, sources: { BATT: 10.5 } });
    const saved = await lead.put(`/api/revisions/${draft.id}/document`).send({ version: 1, document: doc });
    expect(saved.status).toBe(200);
    const res = await lead.get(`/api/revisions/${revisionId}/diff/${draft.id}`);
    expect(res.status).toBe(200);
    const { diff } = res.body;
    expect(diff.components.removed.map((r: any) => r.id)).toEqual(['TB']);
    expect(diff.wires.changed).toEqual([{ id: 'W1', changes: [{ field: 'color', before: 'RD', after: 'OG' }] }]);
    expect(diff.wires.removed).toHaveLength(2);
    expect(diff.states.added.map((a: any) => a.id)).toEqual(['crank']);
    expect(diff.same).toBe(false);
    const same = await lead.get(`/api/revisions/${revisionId}/diff/${revisionId}`);
    expect(same.body.diff.same).toBe(true);
    // Techs cannot diff against a draft they cannot see.
    expect((await (await ctx.agent('tech')).get(`/api/revisions/${revisionId}/diff/${draft.id}`)).status).toBe(404);
  });
});

/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { makeHarnessScript } from '../support/make-harness';
import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoHarnesses } from '../../seeds/harnesses/index';
import { createTestContext, type TestAgent, type TestContext } from '../support/server-context';

type Doc = Record<string, any>;
const makeHarness = (circuits: number): Doc => JSON.parse(execFileSync('python3', [makeHarnessScript, String(circuits)], { encoding: 'utf8' }));

let ctx: TestContext;
let lead: TestAgent;
let tech: TestAgent;
let doc: Doc;
let published: { harnessId: string; revisionId: string };

beforeAll(async () => {
  ctx = await createTestContext();
  lead = await ctx.agent('lead');
  tech = await ctx.agent('tech');
  doc = makeHarness(100);
  const res = await lead.post('/api/harnesses/import').send(doc);
  expect(res.status).toBe(201);
  published = res.body;
  expect((await lead.post(`/api/revisions/${published.revisionId}/publish`).send({ note: 'engine tests' })).status).toBe(200);
});
afterAll(async () => {
  await ctx?.close();
});

const pinCount = (d: Doc) =>
  d.components.reduce((n: number, c: any) => {
    if (c.kind === 'connector') return n + c.cavities.length;
    if (c.kind === 'switch' || c.kind === 'module') return n + c.pins.length;
    return n + ({ battery: 2, ground: 1, fuse: 2, resistor: 2, load: 2, splice: 1, relay: c.normallyClosed ? 5 : 4 } as Record<string, number>)[c.kind];
  }, 0);

describe('GET /api/revisions/:id/readings', () => {
  it('gives every pin its volts in a state; techs read published revisions', async () => {
    const res = await tech.get(`/api/revisions/${published.revisionId}/readings`).query({ state: 'key_on' });
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('key_on');
    expect(res.body.pins).toHaveLength(pinCount(doc));
    const volts = new Map(res.body.pins.map((p: any) => [p.ref, p.volts]));
    // 12.6 V battery through 5 mΩ internal resistance: the + post sits a little under 12.6 V with the loads on.
    expect(volts.get('BATT.+')).toBeGreaterThan(11.5);
    expect(volts.get('BATT.+')).toBeLessThanOrEqual(12.6);
    expect(volts.get('GND0.G')).toBeCloseTo(0, 2);
    // The key switch feeds the relay coil: the switched bus is live with the key on, dead with it off.
    expect(volts.get('SBUS.S')).toBeGreaterThan(11);
    const off = await tech.get(`/api/revisions/${published.revisionId}/readings?state=key_off`);
    expect(new Map(off.body.pins.map((p: any) => [p.ref, p.volts])).get('SBUS.S')).toBeCloseTo(0, 1);
    // Running: the 14.2 V charging source.
    const run = await tech.get(`/api/revisions/${published.revisionId}/readings?state=running`);
    expect(new Map(run.body.pins.map((p: any) => [p.ref, p.volts])).get('BATT.+')).toBeGreaterThan(13.5);
  });

  it('an unknown state is 400 naming it; a missing one 400; unknown revision 404', async () => {
    const res = await tech.get(`/api/revisions/${published.revisionId}/readings?state=engine_on`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('unknown_state');
    expect(res.body.error.message).toContain('"engine_on"');
    expect(res.body.error.message).toContain('"key_on"');
    expect((await tech.get(`/api/revisions/${published.revisionId}/readings`)).status).toBe(400);
    expect((await tech.get('/api/revisions/aaaaaaaaaaaaaaaaaaaaaaaaaa/readings?state=key_on')).status).toBe(404);
  });

  it('round trip: import of the export gives the same readings in every state', async () => {
    const exported = (await lead.get(`/api/revisions/${published.revisionId}/export`)).body;
    const again = await lead.post('/api/harnesses/import').send(exported);
    expect(again.status).toBe(201);
    for (const state of doc.states.map((s: any) => s.id)) {
      const a = await lead.get(`/api/revisions/${published.revisionId}/readings?state=${state}`);
      const b = await lead.get(`/api/revisions/${again.body.revisionId}/readings?state=${state}`);
      expect(b.body, state).toEqual(a.body);
    }
  });

  it('round trip of every demo harness gives the same readings', async () => {
    for (const [key, demo] of Object.entries(demoHarnesses)) {
      const first = await lead.post('/api/harnesses/import').send(demo);
      expect(first.status, key).toBe(201);
      const exported = (await lead.get(`/api/revisions/${first.body.revisionId}/export`)).body;
      const second = await lead.post('/api/harnesses/import').send(exported);
      for (const state of demo.states.map((s) => s.id)) {
        const a = await lead.get(`/api/revisions/${first.body.revisionId}/readings?state=${state}`);
        const b = await lead.get(`/api/revisions/${second.body.revisionId}/readings?state=${state}`);
        expect(a.status).toBe(200);
        expect(b.body, `${key} ${state}`).toEqual(a.body);
      }
    }
  });

  it('drafts recompute after every save; techs cannot read a draft', async () => {
    const draft = (await lead.post(`/api/harnesses/${published.harnessId}/draft`)).body.revision;
    const before = await lead.get(`/api/revisions/${draft.id}/readings?state=key_off`);
    expect(before.status).toBe(200);
    const battBefore = before.body.pins.find((p: any) => p.ref === 'BATT.+').volts;
    const saved = await lead.patch(`/api/revisions/${draft.id}/components/BATT`).send({ version: draft.version, changes: { volts: 11.8 } });
    expect(saved.status).toBe(200);
    const after = await lead.get(`/api/revisions/${draft.id}/readings?state=key_off`);
    const battAfter = after.body.pins.find((p: any) => p.ref === 'BATT.+').volts;
    expect(battBefore).toBeGreaterThan(12.4);
    expect(battAfter).toBeLessThan(11.81);
    expect((await tech.get(`/api/revisions/${draft.id}/readings?state=key_off`)).status).toBe(404);
    // The published revision is unchanged.
    const pub = await lead.get(`/api/revisions/${published.revisionId}/readings?state=key_off`);
    expect(pub.body.pins.find((p: any) => p.ref === 'BATT.+').volts).toBe(battBefore);
  });
});

describe('ohms, walk, faults and suspects', () => {
  it('ohms: two 120 Ω terminators read about 60 Ω across the bus with power off; open is null', async () => {
    const res = await tech.get(`/api/revisions/${published.revisionId}/ohms`).query({ a: 'CANH.S', b: 'CANL.S', state: 'key_off' });
    expect(res.status).toBe(200);
    // Two 120 Ω in parallel = 60 Ω (common practice for a terminated two-wire bus), plus a little wire.
    expect(res.body.ohms).toBeGreaterThan(59.9);
    expect(res.body.ohms).toBeLessThan(61);
    const open = await tech.get(`/api/revisions/${published.revisionId}/ohms`).query({ a: 'XB0.3', b: 'GND0.G', state: 'key_off' });
    expect(open.status).toBe(200);
    expect(open.body.ohms).toBeNull();
    const bad = await tech.get(`/api/revisions/${published.revisionId}/ohms`).query({ a: 'NOPE.1', b: 'ALSO.2', state: 'key_off' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('unknown_pin');
    expect(bad.body.error.message).toContain('"NOPE.1"');
    expect(bad.body.error.message).toContain('"ALSO.2"');
  });

  it('walk: paths from the battery to a fuse, every step in order, unknown pins 400', async () => {
    const res = await tech.get(`/api/revisions/${published.revisionId}/walk`).query({ from: 'BATT.+', to: 'F0.1' });
    expect(res.status).toBe(200);
    expect(res.body.paths.length).toBeGreaterThan(0);
    const steps = res.body.paths[0].steps;
    expect(steps[0]).toMatchObject({ type: 'pin', ref: 'BATT.+' });
    expect(steps[steps.length - 1]).toMatchObject({ type: 'pin', ref: 'F0.1' });
    expect(steps.some((s: any) => s.type === 'fuse' && s.id === 'FM' && s.amps === 150)).toBe(true);
    const withState = await tech.get(`/api/revisions/${published.revisionId}/walk`).query({ from: 'BATT.+', to: 'F0.1', state: 'key_on' });
    expect(withState.status).toBe(200);
    expect((await tech.get(`/api/revisions/${published.revisionId}/walk`).query({ from: 'BATT.+', to: 'X.9' })).status).toBe(400);
    expect((await tech.get(`/api/revisions/${published.revisionId}/walk`).query({ from: 'BATT.+', to: 'F0.1', state: 'nope' })).status).toBe(400);
  });

  it('faults: an open feed wire drops its load side to no reading; suspects find that wire from those readings', async () => {
    const feed = doc.wires.find((w: any) => w.from === 'F0.2' && w.to === 'XA0.1');
    const res = await tech.post(`/api/revisions/${published.revisionId}/faults`).send({ fault: { kind: 'open', ref: feed.id }, state: 'key_on' });
    expect(res.status).toBe(200);
    expect(res.body.fault).toEqual({ kind: 'open', ref: feed.id });
    expect(res.body.description).toContain(feed.id);
    const volts = new Map(res.body.pins.map((p: any) => [p.ref, p.volts]));
    expect(volts.get('F0.2')).toBeGreaterThan(11);
    // Past the open the loads pull the line to ground: about 0 V.
    expect(Math.abs(volts.get('S0.S') as number)).toBeLessThan(0.5);
    expect(res.body.changed.some((c: any) => c.ref === 'S0.S')).toBe(true);

    const observations = ['XA0.1', 'S0.S', 'F0.2'].map((pin) => ({ pin, state: 'key_on', volts: volts.get(pin) }));
    const sus = await tech.post(`/api/revisions/${published.revisionId}/suspects`).send({ observations });
    expect(sus.status).toBe(200);
    expect(sus.body.suspects.length).toBeGreaterThan(0);
    const top = sus.body.suspects.filter((s: any) => s.score === sus.body.suspects[0].score);
    expect(top.some((s: any) => s.fault.kind === 'open' && s.fault.ref === feed.id)).toBe(true);
    expect(sus.body.suspects[0]).toEqual(expect.objectContaining({ fault: expect.any(Object), score: expect.any(Number), description: expect.any(String) }));
    expect('nextUnplug' in sus.body).toBe(true);
  });

  it('a short at a clamp blows the fuse on insert', async () => {
    const clamp = doc.clamps[0];
    const res = await tech.post(`/api/revisions/${published.revisionId}/faults`).send({ fault: { kind: 'short', ref: clamp.id }, state: 'key_on' });
    expect(res.status).toBe(200);
    expect(res.body.blowsOnInsert.length).toBeGreaterThan(0);
    expect(res.body.description).toContain(clamp.id);
  });

  it('names what it does not know: fault references, observation pins, states and fuses', async () => {
    const f = await tech.post(`/api/revisions/${published.revisionId}/faults`).send({ fault: { kind: 'blown', ref: 'W1' } });
    expect(f.status).toBe(400);
    expect(f.body.error.details[0].path).toBe('$.fault.ref');
    const badKind = await tech.post(`/api/revisions/${published.revisionId}/faults`).send({ fault: { kind: 'melted', ref: 'W1' } });
    expect(badKind.status).toBe(400);
    const s = await tech.post(`/api/revisions/${published.revisionId}/suspects`).send({
      observations: [
        { pin: 'Q9.1', state: 'key_on', volts: 12 },
        { a: 'BATT.+', b: 'Z.2', state: 'nope', ohms: 1 },
        { fuse: 'W1', blowsOnInsert: true },
      ],
    });
    expect(s.status).toBe(400);
    expect(s.body.error.details.map((d: any) => d.path)).toEqual(['$.observations[0].pin', '$.observations[1].state', '$.observations[1].b', '$.observations[2].fuse']);
    expect((await tech.post(`/api/revisions/${published.revisionId}/suspects`).send({ observations: [] })).status).toBe(400);
  });

  it('another shop and no session get 404 and 401', async () => {
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get(`/api/revisions/${published.revisionId}/readings?state=key_on`)).status).toBe(404);
    expect((await other.post(`/api/revisions/${published.revisionId}/suspects`).send({ observations: [{ fuse: 'F0', blowsOnInsert: true }] })).status).toBe(404);
    expect((await ctx.request.get(`/api/revisions/${published.revisionId}/readings?state=key_on`)).status).toBe(401);
    expect((await ctx.request.get(`/api/revisions/${published.revisionId}/walk?from=BATT.%2B&to=F0.1`)).status).toBe(401);
  });
});

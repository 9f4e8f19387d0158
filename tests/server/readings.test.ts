import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { krT78MainHarness, walkThroughFault } from '../../seeds/harnesses/index';
import { createTestContext, type TestAgent, type TestContext } from '../support/server-context';

let ctx: TestContext;
let lead: TestAgent;
let tech: TestAgent;
let writer: TestAgent;
let harnessId: string;
let revisionId: string;

// The walk-through observations as the readings API takes them (a `kind` on each).
const walkThrough = walkThroughFault.observations.map((o) =>
  'fuse' in o ? { kind: 'fuse' as const, ...o } : 'a' in o ? { kind: 'ohms' as const, ...o } : { kind: 'volts' as const, ...o },
);

beforeAll(async () => {
  ctx = await createTestContext();
  [lead, tech, writer] = await Promise.all([ctx.agent('lead'), ctx.agent('tech'), ctx.agent('writer')]);
  const imported = await lead.post('/api/harnesses/import').send(krT78MainHarness);
  expect(imported.status).toBe(201);
  ({ harnessId, revisionId } = imported.body);
  expect((await lead.post(`/api/revisions/${revisionId}/publish`).send({ note: 'readings tests' })).status).toBe(200);
});
afterAll(async () => {
  await ctx?.close();
});

async function expectedVolts(pin: string, state: string): Promise<number> {
  const res = await tech.get(`/api/revisions/${revisionId}/readings`).query({ state });
  const found = res.body.pins.find((p: { ref: string }) => p.ref === pin);
  expect(found, pin).toBeTruthy();
  return found.volts;
}

describe('marking readings', () => {
  it('a battery reading within the feed-drop band is in range, a flat one is out (feed-drop rule, from memory)', async () => {
    const atRest = await expectedVolts('BATT.+', 'key_off');
    // Common practice: a 12 V battery at rest reads about 12.4–12.7 V.
    expect(atRest).toBeGreaterThan(12.3);
    expect(atRest).toBeLessThan(12.8);
    const res = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({
      observations: [
        { kind: 'volts', pin: 'BATT.+', state: 'key_off', volts: atRest - 0.3 },
        { kind: 'volts', pin: 'BATT.+', state: 'key_off', volts: 11.2 },
      ],
    });
    expect(res.status).toBe(200);
    expect(res.body.readings.map((r: { inRange: boolean }) => r.inRange)).toEqual([true, false]);
    expect(res.body.readings[1].verdict).toMatch(/^OUT: 11\.2 V, expected /);
  });

  it('the walk-through readings put clip CL7 first, with a fuse that blows marked out of range', async () => {
    const res = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({ observations: walkThrough });
    expect(res.status).toBe(200);
    expect(res.body.readings[0]).toMatchObject({ kind: 'fuse', fuse: 'F2', inRange: false });
    // Ohms to ground on a powered feed cavity with its fuse out: a short reads far below the healthy value.
    expect(res.body.readings.slice(1).every((r: { inRange: boolean }) => r.inRange === false)).toBe(true);
    expect(res.body.suspects[0].fault).toMatchObject({ kind: 'short', ref: 'CL7' });
    expect(res.body.suspects[0].description).toMatch(/CL7/);
  });

  it('names unknown pins and states (400) and refuses malformed readings', async () => {
    const unknown = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({ observations: [{ kind: 'volts', pin: 'NOPE.1', state: 'key_off', volts: 1 }] });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error.details)).toMatch(/NOPE\.1/);
    const bad = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({ observations: [{ kind: 'volts', pin: 'BATT+', state: 'key_off', volts: 'twelve' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['$.observations[0].pin', '$.observations[0].volts']));
  });

  it("a lead's tolerance for a pin replaces the default band; a tech may not set one", async () => {
    const expected = await expectedVolts('BATT.+', 'key_off');
    const observations = [{ kind: 'volts', pin: 'BATT.+', state: 'key_off', volts: expected - 0.3 }];
    expect((await tech.put(`/api/harnesses/${harnessId}/tolerances/BATT.+`).send({ below: 0.1, above: 0.1 })).status).toBe(403);
    expect((await lead.put(`/api/harnesses/${harnessId}/tolerances/BATT.+`).send({ below: 0.1, above: 0.1 })).status).toBe(200);
    const tight = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({ observations });
    expect(tight.body.readings[0].inRange).toBe(false);
    const list = await tech.get(`/api/revisions/${revisionId}/tolerances`);
    expect(list.body.tolerances).toEqual([{ pin: 'BATT.+', below: 0.1, above: 0.1 }]);
    expect((await lead.delete(`/api/harnesses/${harnessId}/tolerances/BATT.+`)).status).toBe(204);
    const loose = await tech.post(`/api/revisions/${revisionId}/evaluate`).send({ observations });
    expect(loose.body.readings[0].inRange).toBe(true);
  });
});

describe('reading sets', () => {
  it('a tech saves a set; anyone in the shop reads it; a writer may not take readings', async () => {
    const created = await tech.post('/api/reading-sets').send({ revisionId, title: 'Attachment power', observations: walkThrough.slice(0, 2) });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ revisionId, harnessId, title: 'Attachment power', version: 1, takenBy: { name: expect.any(String) } });
    expect(created.body.readings).toHaveLength(2);
    const listed = await writer.get('/api/reading-sets').query({ revisionId });
    expect(listed.status).toBe(200);
    expect(listed.body.readingSets.map((s: { id: string }) => s.id)).toContain(created.body.id);
    expect((await writer.post('/api/reading-sets').send({ revisionId, observations: [] })).status).toBe(403);
  });

  it('two people updating the same set: the stale save gets 409 and changes nothing', async () => {
    const created = await tech.post('/api/reading-sets').send({ revisionId, observations: walkThrough.slice(0, 1) });
    const id = created.body.id;
    const first = await tech.put(`/api/reading-sets/${id}`).send({ version: 1, observations: walkThrough });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(2);
    expect(first.body.suspects[0].fault.ref).toBe('CL7');
    const stale = await lead.put(`/api/reading-sets/${id}`).send({ version: 1, observations: [] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.version).toBe(2);
    const now = await tech.get(`/api/reading-sets/${id}`);
    expect(now.body.readings).toHaveLength(walkThrough.length);
  });

  it("another shop sees none of it (404), and a set cannot name another shop's revision", async () => {
    const created = await tech.post('/api/reading-sets').send({ revisionId, observations: [] });
    const other = await ctx.otherShopAgent('tech');
    expect((await other.get(`/api/reading-sets/${created.body.id}`)).status).toBe(404);
    expect((await other.post('/api/reading-sets').send({ revisionId, observations: [] })).status).toBe(404);
    expect((await other.post(`/api/revisions/${revisionId}/evaluate`).send({ observations: [] })).status).toBe(404);
    expect((await other.get('/api/reading-sets').query({ revisionId })).body.readingSets).toEqual([]);
  });

  it('only the taker or a lead may change or delete a set', async () => {
    const created = await tech.post('/api/reading-sets').send({ revisionId, observations: [] });
    const other = await ctx.signIn('lead@example.com');
    expect((await writer.delete(`/api/reading-sets/${created.body.id}`)).status).toBe(403);
    expect((await other.delete(`/api/reading-sets/${created.body.id}`)).status).toBe(204);
    expect((await tech.get(`/api/reading-sets/${created.body.id}`)).status).toBe(404);
  });

  it('needs a session (401)', async () => {
    expect((await ctx.request.get('/api/reading-sets')).status).toBe(401);
    expect((await ctx.request.post(`/api/revisions/${revisionId}/evaluate`).send({ observations: [] })).status).toBe(401);
  });
});

describe('recent and pinned connectors', () => {
  it('keeps what each person opened and pinned, newest first, with the connector label', async () => {
    expect((await tech.post('/api/connector-bookmarks/opened').send({ harnessId, connectorId: 'X40' })).status).toBe(204);
    expect((await tech.put('/api/connector-bookmarks/pinned').send({ harnessId, connectorId: 'X20A', pinned: true })).status).toBe(204);
    const mine = await tech.get('/api/connector-bookmarks');
    expect(mine.body.recent[0]).toMatchObject({ harnessId, connectorId: 'X40', label: expect.any(String) });
    expect(mine.body.pinned.map((b: { connectorId: string }) => b.connectorId)).toEqual(['X20A']);
    const missing = await tech.post('/api/connector-bookmarks/opened').send({ harnessId, connectorId: 'X99' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/X99/);
    // Another person's list is their own.
    expect((await lead.get('/api/connector-bookmarks')).body.recent).toEqual([]);
    const other = await ctx.otherShopAgent('tech');
    expect((await other.post('/api/connector-bookmarks/opened').send({ harnessId, connectorId: 'X40' })).status).toBe(404);
  });
});

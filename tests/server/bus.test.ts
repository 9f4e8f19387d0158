/* eslint-disable @typescript-eslint/no-explicit-any -- API response bodies are read as loose JSON here */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestAgent, type TestContext } from '../support/server-context';
import { harnessDocument } from '../../seeds/library';
import { auxiliaryControlSignal } from '../../seeds/catalogue/index';

const REST_LOG = readFileSync('seeds/captures/aux-rest.log');
const MOVED_LOG = readFileSync('seeds/captures/aux-moved.log');

let ctx: TestContext;
let lead: TestAgent;
let tech: TestAgent;
let harnessId: string;
let draftId: string;
let publishedId: string;
let restId: string;
let movedId: string;

const version = async (rev: string, agent: TestAgent = lead) => (await agent.get(`/api/revisions/${rev}/messages`)).body.revision.version as number;
const upload = (agent: TestAgent, hid: string, body: Buffer | string, fileName: string, name?: string) => {
  const req = agent.post(`/api/harnesses/${hid}/captures`).attach('file', Buffer.from(body), { filename: fileName, contentType: 'text/plain' });
  return name ? req.field('name', name) : req;
};

beforeAll(async () => {
  ctx = await createTestContext();
  lead = await ctx.agent('lead');
  tech = await ctx.agent('tech');
  // The demo loader harness with its catalogue: published once, then a draft on top.
  const imp = await lead.post('/api/harnesses/import').send(harnessDocument('kr-t78-main'));
  expect(imp.status).toBe(201);
  harnessId = imp.body.harnessId;
  publishedId = imp.body.revisionId;
  expect((await lead.post(`/api/revisions/${publishedId}/publish`).send({ note: 'first' })).status).toBe(200);
  const draft = await lead.post(`/api/harnesses/${harnessId}/draft`);
  expect([200, 201]).toContain(draft.status);
  draftId = draft.body.revision.id;
});
afterAll(async () => {
  await ctx?.close();
});

describe('catalogue', () => {
  it('answers each 29-bit identifier split per SAE J1939-21', async () => {
    const res = await tech.get(`/api/revisions/${publishedId}/messages`);
    expect(res.status).toBe(200);
    // Worked identifier 0x0CF00400 → priority 3, PGN 61444 (0xF004), source 0x00 (SAE J1939-21 and J1939-71, from memory).
    const eec1 = res.body.messages.find((m: any) => m.key === '0CF00400');
    expect(eec1.j1939).toMatchObject({ priority: 3, pgn: 61444, source: 0, destination: null });
    expect(eec1.label).toBe('priority 3, PGN 61444 (0xF004), source 0x00');
    expect(eec1.senderLabel).toBeTruthy();
    expect(res.body.modules.map((m: any) => m.id)).toEqual(expect.arrayContaining(['ECU', 'MCU']));
  });

  it('adds, edits and deletes messages on the draft with the version check', async () => {
    let v = await version(draftId);
    // Worked identifier 0x18FEF100 → priority 6, PGN 65265 (0xFEF1), source 0x00 (SAE J1939-21, from memory).
    const add = await lead.post(`/api/revisions/${draftId}/messages`).send({ version: v, message: { id: '18FEF100', extended: true, sender: 'ECU', name: 'Vehicle speed' } });
    expect(add.status).toBe(201);
    expect(add.body.version).toBe(v + 1);
    expect(add.body.message.j1939).toMatchObject({ priority: 6, pgn: 65265, source: 0x00, pduFormat: 2 });
    v = add.body.version;
    // Worked identifier 0x18EA00FE → priority 6, PGN 59904 (0xEA00), destination 0x00, source 0xFE (SAE J1939-21, from memory).
    const req = await lead.post(`/api/revisions/${draftId}/messages`).send({ version: v, message: { id: '18EA00FE', extended: true, name: 'Request' } });
    expect(req.status).toBe(201);
    expect(req.body.message.j1939).toMatchObject({ priority: 6, pgn: 59904, destination: 0x00, source: 0xfe, pduFormat: 1 });
    v = req.body.version;
    // 11-bit identifiers are not split.
    const base = await lead.post(`/api/revisions/${draftId}/messages`).send({ version: v, message: { id: '1A0', extended: false, name: 'Service tool' } });
    expect(base.status).toBe(201);
    expect(base.body.message).toMatchObject({ key: '1A0', j1939: null, label: null });
    v = base.body.version;

    const dup = await lead.post(`/api/revisions/${draftId}/messages`).send({ version: v, message: { id: '18fef100', extended: true } });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('message_exists');

    const stale = await lead.put(`/api/revisions/${draftId}/messages/18FEF100`).send({ version: v - 1, message: { id: '18FEF100', extended: true, name: 'Stale' } });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');

    const bad = await lead.put(`/api/revisions/${draftId}/messages/18FEF100`).send({ version: v, message: { id: '18FEF100', extended: true, sender: 'NOPE' } });
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body.error.details)).toContain('sender');

    const sig = await lead.post(`/api/revisions/${draftId}/messages/18FEF100/signals`).send({ version: v, signal: { name: 'Wheel speed', startBit: 8, length: 16, scale: 1 / 256, unit: 'km/h' } });
    expect(sig.status).toBe(201);
    expect(sig.body.message.message.signals).toHaveLength(1);
    v = sig.body.version;

    for (const key of ['18FEF100', '18EA00FE', '1A0']) {
      const del = await lead.delete(`/api/revisions/${draftId}/messages/${key}?version=${v}`);
      expect(del.status).toBe(200);
      v = del.body.version;
    }
    const after = await lead.get(`/api/revisions/${draftId}/messages`);
    expect(after.body.messages.map((m: any) => m.key)).not.toContain('18FEF100');
    expect((await lead.delete(`/api/revisions/${draftId}/messages/18FEF100?version=${v}`)).status).toBe(404);
  });

  it('is published with the revision and in the export; a published catalogue cannot change', async () => {
    const exp = await tech.get(`/api/revisions/${publishedId}/export`);
    expect(exp.body.messages.map((m: any) => m.id)).toContain(auxiliaryControlSignal.id);
    const res = await lead.post(`/api/revisions/${publishedId}/messages`).send({ version: 1, message: { id: '123', extended: false } });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('revision_published');
  });

  it('roles: a tech reads but cannot edit, and does not see the draft; another shop gets 404', async () => {
    expect((await tech.post(`/api/revisions/${draftId}/messages`).send({ version: 1, message: { id: '123', extended: false } })).status).toBe(403);
    expect((await tech.get(`/api/revisions/${draftId}/messages`)).status).toBe(404);
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get(`/api/revisions/${publishedId}/messages`)).status).toBe(404);
    expect((await other.post(`/api/revisions/${draftId}/messages`).send({ version: 1, message: { id: '123', extended: false } })).status).toBe(404);
    expect((await other.get(`/api/harnesses/${harnessId}/captures`)).status).toBe(404);
  });
});

describe('captures', () => {
  it('stores the summary of an upload and reports bad lines by number', async () => {
    const log = [
      '(1700000000.000000) can0 18FEF100#FFFFFF3C00FFFFFF',
      'garbage here',
      '',
      '(1700000000.100000) can0 18FEF100#FFFFFF3D00FFFFFF',
      '(1700000000.200000) can0 123#DEAD',
      '(1700000000.300000) can0 18FEF100#GG',
      '# a note',
      '(1700000000.400000) can0 18FEF100#FFFFFF3E00FFFFFF',
    ].join('\n');
    const res = await upload(tech, harnessId, log, 'short.log', 'Short test');
    expect(res.status).toBe(201);
    expect(res.body.capture).toMatchObject({ name: 'Short test', fileName: 'short.log', lines: 8, frames: 4, badLineCount: 2, identifierCount: 2 });
    expect(res.body.badLines.map((b: any) => b.lineNo)).toEqual([2, 6]);
    const detail = await lead.get(`/api/captures/${res.body.capture.id}`);
    expect(detail.status).toBe(200);
    const id = detail.body.summary.identifiers.find((x: any) => x.key === '18FEF100');
    expect(id.count).toBe(3);
    expect(id.rateHz).toBeCloseTo(2 / 0.4, 4);
    expect(id.j1939).toMatchObject({ priority: 6, pgn: 65265, source: 0 });
    expect(id.bytes[3].distinct.map((d: any) => d.value)).toEqual([0x3c, 0x3d, 0x3e]);
    const file = await lead.get(`/api/captures/${res.body.capture.id}/file`);
    expect(file.status).toBe(200);
    expect(file.text).toBe(log);
    // The uploader (a tech) may delete their own capture.
    expect((await tech.delete(`/api/captures/${res.body.capture.id}`)).status).toBe(204);
    expect((await lead.get(`/api/captures/${res.body.capture.id}`)).status).toBe(404);
  });

  it('refuses a file with no frame, naming the first bad line', async () => {
    const res = await upload(lead, harnessId, 'hello\nworld\n', 'notes.txt');
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_capture');
    expect(res.body.error.message).toContain('Line 1');
    expect(res.body.error.details.map((d: any) => d.path)).toEqual(['line 1', 'line 2']);
    expect((await lead.post(`/api/harnesses/${harnessId}/captures`).send({})).status).toBe(400);
  });

  it('a writer cannot upload; another shop cannot see a capture', async () => {
    const writer = await ctx.agent('writer');
    expect((await upload(writer, harnessId, REST_LOG, 'aux-rest.log')).status).toBe(403);
    const r = await upload(lead, harnessId, REST_LOG, 'aux-rest.log', 'Roller at rest');
    expect(r.status).toBe(201);
    restId = r.body.capture.id;
    const m = await upload(lead, harnessId, MOVED_LOG, 'aux-moved.log', 'Roller moved');
    expect(m.status).toBe(201);
    movedId = m.body.capture.id;
    const other = await ctx.otherShopAgent('lead');
    expect((await other.get(`/api/captures/${restId}`)).status).toBe(404);
    expect((await other.get(`/api/captures/${restId}/compare/${movedId}`)).status).toBe(404);
    expect((await other.delete(`/api/captures/${restId}`)).status).toBe(404);
    const list = await tech.get(`/api/harnesses/${harnessId}/captures`);
    expect(list.body.captures.map((c: any) => c.name)).toEqual(['Roller moved', 'Roller at rest']);
    expect(list.body.captures[0]).toMatchObject({ lines: 2820, badLineCount: 0 });
  });

  it('compare of the demo captures ranks byte 1 (1-based) of 0CFF1021 first', async () => {
    const res = await tech.get(`/api/captures/${restId}/compare/${movedId}?revision=${publishedId}`);
    expect(res.status).toBe(200);
    const top = res.body.comparison.changedBytes[0];
    expect(top).toMatchObject({ key: auxiliaryControlSignal.id, index: auxiliaryControlSignal.byte, position: 1 });
    expect(top.sentence).toMatch(/^byte 1: 0x7D at rest/);
    expect(res.body.comparison.changed.map((c: any) => c.key)).toEqual([auxiliaryControlSignal.id]);
    expect(res.body.catalogued.bytes).toContain('0CFF1021:0');
  });
});

describe('findings', () => {
  it('files the changed byte as a signal on the draft message; stale version 409 changes nothing', async () => {
    const v = await version(draftId);
    const before = (await lead.get(`/api/revisions/${draftId}/messages`)).body.messages.find((m: any) => m.key === '0CFF1021');
    const stale = await lead.post(`/api/revisions/${draftId}/findings`).send({ version: v - 1, rest: restId, moved: movedId, key: '0CFF1021', index: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.version).toBe(v);
    expect(await version(draftId)).toBe(v);

    const res = await lead.post(`/api/revisions/${draftId}/findings`).send({ version: v, rest: restId, moved: movedId, key: '0CFF1021', index: 0, name: 'Roller (found)' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: v + 1, created: 'signal' });
    const sig = res.body.message.message.signals.at(-1);
    expect(sig).toMatchObject({ name: 'Roller (found)', byte: 0 });
    expect(sig.values['125']).toBe('Rest');
    expect(sig.notes).toContain('"Roller at rest" (rest)');
    const after = (await lead.get(`/api/revisions/${draftId}/messages`)).body.messages.find((m: any) => m.key === '0CFF1021');
    expect(after.message.signals).toHaveLength(before.message.signals.length + 1);

    const again = await lead.post(`/api/revisions/${draftId}/findings`).send({ version: v + 1, rest: restId, moved: movedId, key: '0CFF1021', index: 0, name: 'Roller (found)' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('signal_exists');
    const unchanged = await lead.post(`/api/revisions/${draftId}/findings`).send({ version: v + 1, rest: restId, moved: movedId, key: '0CF00400', index: 7 });
    expect(unchanged.status).toBe(404);
    expect(unchanged.body.error.code).toBe('change_not_found');
    expect((await tech.post(`/api/revisions/${draftId}/findings`).send({ version: v + 1, rest: restId, moved: movedId, key: '0CFF1021', index: 0 })).status).toBe(403);

    // The draft differs from the published revision in its messages.
    const diff = await lead.get(`/api/revisions/${publishedId}/diff/${draftId}`);
    expect(diff.body.diff.document.map((f: any) => f.field)).toContain('messages');
  });

  it('files a new message when the identifier is not catalogued, naming the sender by its source address', async () => {
    let v = await version(draftId);
    const del = await lead.delete(`/api/revisions/${draftId}/messages/0CFF1021?version=${v}`);
    expect(del.status).toBe(200);
    v = del.body.version;
    const res = await lead.post(`/api/revisions/${draftId}/findings`).send({ version: v, rest: restId, moved: movedId, key: '0CFF1021', index: 0 });
    expect(res.status).toBe(201);
    expect(res.body.created).toBe('message');
    // Source 0x21 is the machine control unit's other messages' source in the demo catalogue.
    expect(res.body.message.message).toMatchObject({ id: '0CFF1021', extended: true, sender: 'MCU' });
    expect(res.body.message.j1939).toMatchObject({ priority: 3, pgn: 65296, source: 0x21 });
    expect(res.body.message.message.signals[0]).toMatchObject({ name: 'Byte 1 (found on the bus)', byte: 0 });
  });
});

describe('message seen / not seen readings', () => {
  it('marks a message not seen with the checks it implies on the sender, and leaves the engine suspects alone', async () => {
    const res = await tech.post(`/api/revisions/${publishedId}/evaluate`).send({
      observations: [
        { kind: 'message', messageId: '0CFF1021', seen: false },
        { kind: 'message', messageId: '0CF00400', seen: true },
        { kind: 'message', messageId: '18FEF1AA', seen: false },
      ],
    });
    expect(res.status).toBe(200);
    const [missing, seen, unknown] = res.body.readings;
    expect(missing).toMatchObject({ kind: 'message', inRange: false });
    expect(missing.verdict).toContain('0CFF1021 not seen');
    expect(missing.advice).toContain('A module that should talk and does not points at its power, ground or bus wires');
    // MCU's supply pins 2 and 3, grounds 4, 5, 9, and bus pins 6 and 7 (demo harness kr-t78-main).
    expect(missing.checks.map((c: any) => c.pin)).toEqual(['MCU.2', 'MCU.3', 'MCU.4', 'MCU.5', 'MCU.9', 'MCU.6', 'MCU.7']);
    // ISO 11898-2: each bus line about 2.5 V to ground with the bus idle.
    expect(missing.checks.find((c: any) => c.pin === 'MCU.6').expect).toContain('2.5 V');
    expect(seen).toMatchObject({ inRange: true });
    expect(unknown.inRange).toBeNull();
    expect(res.body.suspects).toEqual([]);
    const bad = await tech.post(`/api/revisions/${publishedId}/evaluate`).send({ observations: [{ kind: 'message', messageId: 'zz', seen: false }] });
    expect(bad.status).toBe(400);
  });
});

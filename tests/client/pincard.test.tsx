/**
 * Pin cards, walks, readings and suspects in jsdom, against a fake API whose engine answers
 * come from the real engine (shared/engine) on a small two-module harness with a mated pair.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Role } from '@shared/api/auth';
import { prepareHarness } from '@shared/engine';
import { validateDocument, type HarnessDocument } from '@shared/harness';
import { markObservations, toEngineObservation, type Observation } from '@shared/readings';
import { busLines, matedPair, probeText, wireEnds } from '@/features/pincards/model';
import { parseMeter } from '@/features/pincards/components/ReadingEntry';
import { fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

const H = 'hhhhhhhhhhhhhhhhhhhhhhhhhh';
const R = 'rrrrrrrrrrrrrrrrrrrrrrrrrr';

const mm = (mm2: number) => ({ mm2 });
const doc = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'Test bench harness',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', label: 'Battery', volts: 12.6 },
    { id: 'G1', kind: 'ground', label: 'Frame ground' },
    { id: 'S1', kind: 'switch', label: 'Key switch', pins: ['B', 'IGN'], positions: { off: [], on: [['B', 'IGN']] } },
    { id: 'F1', kind: 'fuse', label: 'F1 Module feed', amps: 10 },
    {
      id: 'M1',
      kind: 'module',
      label: 'Cab controller',
      pins: [
        { id: '1', role: 'supply', ohms: 200, function: 'Supply' },
        { id: '2', role: 'ground', function: 'Ground' },
        { id: '3', role: 'can_h', function: 'CAN_H' },
        { id: '4', role: 'can_l', function: 'CAN_L' },
      ],
    },
    {
      id: 'M2',
      kind: 'module',
      label: 'Arm controller',
      pins: [
        { id: '1', role: 'supply', ohms: 200, function: 'Supply' },
        { id: '2', role: 'ground', function: 'Ground' },
        { id: '3', role: 'can_h', function: 'CAN_H' },
        { id: '4', role: 'can_l', function: 'CAN_L' },
      ],
    },
    {
      id: 'X1A',
      kind: 'connector',
      label: 'X1 Arm connector, cab side',
      matesWith: 'X1B',
      cavities: [
        { id: '1', function: 'Arm controller supply' },
        { id: '2', function: 'Bus CAN_H' },
        { id: '3', function: 'Bus CAN_L' },
        { id: '4', function: 'Arm controller ground' },
      ],
    },
    { id: 'X1B', kind: 'connector', label: 'X1 Arm connector, arm side', cavities: ['1', '2', '3', '4'] },
    { id: 'TR1', kind: 'resistor', label: 'Terminator, cab', ohms: 120 },
    { id: 'TR2', kind: 'resistor', label: 'Terminator, arm', ohms: 120 },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'S1.B', color: 'RD', size: mm(2.5), lengthM: 1, circuit: '100' },
    { id: 'W2', from: 'S1.IGN', to: 'F1.1', color: 'RD', size: mm(1.5), lengthM: 0.5, circuit: '100' },
    { id: 'W3', from: 'F1.2', to: 'X1A.1', color: 'RD/WH', size: mm(1), lengthM: 2, circuit: '101' },
    { id: 'W4', from: 'F1.2', to: 'M1.1', color: 'RD/WH', size: mm(1), lengthM: 0.5, circuit: '101' },
    { id: 'W5', from: 'X1B.1', to: 'M2.1', color: 'RD/WH', size: mm(1), lengthM: 2, circuit: '101' },
    { id: 'W6', from: 'M1.3', to: 'X1A.2', color: 'YE', size: mm(0.5), lengthM: 2, circuit: '601' },
    { id: 'W7', from: 'M1.4', to: 'X1A.3', color: 'GN', size: mm(0.5), lengthM: 2, circuit: '602' },
    { id: 'W8', from: 'X1B.2', to: 'M2.3', color: 'YE', size: mm(0.5), lengthM: 2, circuit: '601' },
    { id: 'W9', from: 'X1B.3', to: 'M2.4', color: 'GN', size: mm(0.5), lengthM: 2, circuit: '602' },
    { id: 'W10', from: 'M1.3', to: 'TR1.1', color: 'YE', size: mm(0.5), lengthM: 0.1 },
    { id: 'W11', from: 'TR1.2', to: 'M1.4', color: 'GN', size: mm(0.5), lengthM: 0.1 },
    { id: 'W12', from: 'M2.3', to: 'TR2.1', color: 'YE', size: mm(0.5), lengthM: 0.1 },
    { id: 'W13', from: 'TR2.2', to: 'M2.4', color: 'GN', size: mm(0.5), lengthM: 0.1 },
    { id: 'W14', from: 'M1.2', to: 'G1.G', color: 'BK', size: mm(1), lengthM: 0.5, circuit: '900' },
    { id: 'W15', from: 'G1.G', to: 'X1A.4', color: 'BK', size: mm(1), lengthM: 2, circuit: '900' },
    { id: 'W16', from: 'X1B.4', to: 'M2.2', color: 'BK', size: mm(1), lengthM: 2, circuit: '900' },
    { id: 'W17', from: 'BATT.-', to: 'G1.G', color: 'BK', size: mm(2.5), lengthM: 1, circuit: '900' },
  ],
  clamps: [{ id: 'CL1', label: 'Arm pivot clip', wires: ['W5'], at: 0.5 }],
  states: [
    { id: 'key_off', label: 'Key off', switches: { S1: 'off' } },
    { id: 'key_on', label: 'Key on', switches: { S1: 'on' } },
    { id: 'key_off_x1_apart', label: 'Key off, X1 apart', switches: { S1: 'off' }, unplugged: ['X1B'] },
  ],
};

function setup(role: Role = 'tech') {
  const checked = validateDocument(doc);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  const d = checked.doc as HarnessDocument;
  const prep = prepareHarness(d);
  const state = { sets: [] as unknown[], tolerancePuts: [] as unknown[], pinned: false };
  const revision = { id: R, harnessId: H, number: 2, status: 'published', version: 1, name: 'Test bench harness' };
  const api = installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe(role) }),
    'GET /api/meta': () => ({ body: { outbox: false, demo: false, version: 'test' } }),
    'GET /api/harnesses/:id': () => ({
      body: { harness: { id: H, name: 'Test bench harness', publishedRevisionId: R, publishedNumber: 2, draftRevisionId: null, modelName: 'Bench' }, revisions: [revision] },
    }),
    'GET /api/revisions/:id': () => ({ body: { revision, document: d, positions: {} } }),
    'GET /api/revisions/:id/readings': ({ query }) => ({ body: prep.readings(query.get('state')!) }),
    'GET /api/revisions/:id/ohms': ({ query }) => ({ body: { ohms: prep.ohms(query.get('a')!, query.get('b')!, query.get('state')!) } }),
    'GET /api/revisions/:id/walk': ({ query }) => ({ body: { from: query.get('from'), to: query.get('to'), state: null, ...prep.walk(query.get('from')!, query.get('to')!) } }),
    'GET /api/revisions/:id/tolerances': () => ({ body: { tolerances: [{ pin: 'X1B.1', below: 1.5, above: 0.5 }] } }),
    'PUT /api/harnesses/:hid/tolerances/:pin': ({ params, body }) => {
      state.tolerancePuts.push({ pin: params.pin, ...(body as object) });
      return { body: { pin: params.pin, ...(body as object) } };
    },
    'POST /api/revisions/:id/evaluate': ({ body }) => {
      const obs = (body as { observations: Observation[] }).observations;
      const r = prep.suspects(obs.map(toEngineObservation));
      return {
        body: {
          readings: markObservations(prep, obs),
          suspects: r.suspects.map((s) => ({ ...s, description: `${s.fault.kind} at ${s.fault.ref}` })),
          nextUnplug: r.nextUnplug,
        },
      };
    },
    'POST /api/reading-sets': ({ body }) => {
      state.sets.push(body);
      return { status: 201, body: { id: 'set-1', version: 1, takenAt: '2026-12-02T02:00:00Z', updatedAt: '2026-12-02T02:00:00Z', ...(body as object) } };
    },
    'GET /api/connector-bookmarks': () => ({
      body: { pinned: state.pinned ? [{ harnessId: H, harnessName: 'Test bench harness', connectorId: 'X1B', label: 'X1 Arm connector', openedAt: null, pinned: true }] : [], recent: [] },
    }),
    'POST /api/connector-bookmarks/opened': () => ({ status: 204 }),
    'PUT /api/connector-bookmarks/pinned': ({ body }) => {
      state.pinned = (body as { pinned: boolean }).pinned;
      return { status: 204 };
    },
    'GET /api/search': () => ({
      body: {
        results: [
          { kind: 'wire', harnessId: H, harnessName: 'Test bench harness', revisionId: R, revisionStatus: 'published', componentId: 'X1B', pinId: '1', label: 'Arm feed', circuit: '101', color: 'RD/WH', matched: 'circuit' },
        ],
      },
    }),
  });
  return { ...api, state, prep, doc: d };
}

beforeEach(() => sessionStorage.clear());

describe('pin card model', () => {
  it('pairs mated halves from either side, follows wires and splices, finds bus lines', () => {
    const d = validateDocument(doc);
    if (!d.ok) throw new Error('fixture invalid');
    expect(matedPair(d.doc, 'X1B')!.halves.map((h) => h.id)).toEqual(['X1B', 'X1A']);
    expect(matedPair(d.doc, 'X1A')!.halves.map((h) => h.id)).toEqual(['X1A', 'X1B']);
    expect(wireEnds(d.doc, 'X1B.1').map((e) => e.to)).toEqual(['M2.1']);
    const lines = busLines(d.doc);
    expect(lines.get('X1A.2')).toBe('can_h');
    expect(lines.get('X1B.3')).toBe('can_l');
    expect(lines.get('X1A.1')).toBeUndefined();
    expect(probeText(d.doc, 'X1B.1', 'key_on')).toBe('Cavity 1 of X1B (red probe) to chassis ground (black probe), DC volts, key on');
  });

  it('reads what a tech types on a meter', () => {
    expect(parseMeter('12,6')).toBe(12.6);
    expect(parseMeter(' 0.09 ')).toBe(0.09);
    expect(parseMeter('OL')).toBeNull();
    expect(parseMeter('twelve')).toBe('bad');
  });
});

describe('pin card page', () => {
  it('shows both halves of the pair, wire colours spelled out, expected volts with the lead’s tolerance, probes, bus checks and cautions', async () => {
    const { calls } = setup();
    renderApp(`/pin-cards/${H}/${R}/X1B?state=key_on`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1B / X1A' });
    const cav1 = screen.getByRole('listitem', { name: /^Cavity 1: Arm controller supply/ });
    expect(within(cav1).getByText('X1B.1')).toBeTruthy();
    expect(within(cav1).getByText('X1A.1')).toBeTruthy();
    expect(within(cav1).getAllByText('red with white stripe').length).toBeGreaterThanOrEqual(2);
    expect(within(cav1).getByText(/Cavity 1 of X1B \(red probe\) to chassis ground \(black probe\), DC volts, key on/)).toBeTruthy();
    // Lead's band on X1B.1: 1.5 V below, 0.5 V above.
    const v = await within(cav1).findAllByText(/allow 1[01]\.\d+–1[23]\.\d+ V/);
    expect(v.length).toBeGreaterThan(0);
    expect(within(cav1).getByText('Tolerance set by a lead.')).toBeTruthy();
    // Bus checks: both lines and the two lines' resistance, about 60 Ω with both terminators.
    const bus = screen.getByRole('heading', { name: 'Bus checks' }).closest('section')!;
    expect(within(bus).getAllByText(/CAN_H/).length).toBeGreaterThan(0);
    await within(bus).findAllByText(/This harness: 60\.\d Ω/);
    expect(screen.getByRole('note', { name: /Disconnect the battery first/ })).toBeTruthy();
    expect(screen.getByRole('note', { name: /Never fit a larger fuse/ })).toBeTruthy();
    expect(screen.getByRole('note', { name: /A fuse that blows with an arc/ })).toBeTruthy();
    expect(screen.getByRole('note', { name: /Lower or block attachments/ })).toBeTruthy();
    expect(screen.getByRole('note', { name: /Readings here are expectations/ })).toBeTruthy();
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.path === '/api/connector-bookmarks/opened')).toBe(true));
  });

  it('marks a reading in or out of range at once, ranks suspects, and saves the set against the repair order', async () => {
    const user = userEvent.setup();
    const { state } = setup();
    renderApp(`/pin-cards/${H}/${R}/X1B?state=key_on&order=ord-7`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1B / X1A' });
    await user.click(screen.getByRole('button', { name: 'Take a reading at X1B.1' }));
    const form = screen.getByRole('form', { name: 'Enter a reading' });
    await user.type(within(form).getByLabelText('Meter showed (V)'), '0');
    await user.click(within(form).getByRole('button', { name: 'Add reading' }));
    const taken = await screen.findByRole('list', { name: 'Readings taken' });
    const out = await within(taken).findByText(/^OUT: 0\.0 V, expected/);
    expect(out.closest('[data-verdict]')!.getAttribute('data-verdict')).toBe('out');
    expect(out.parentElement!.textContent).toContain('✗');
    // Suspects from the engine, with the next connector to unplug.
    const suspects = await screen.findByRole('list', { name: 'Suspects' });
    expect(within(suspects).getAllByRole('listitem').length).toBeGreaterThan(0);
    await user.click(screen.getByRole('button', { name: 'Save readings to the order' }));
    await screen.findByText(/Saved 1 reading to the repair order/);
    expect(state.sets[0]).toMatchObject({ revisionId: R, repairOrderId: 'ord-7', observations: [{ kind: 'volts', pin: 'X1B.1', state: 'key_on', volts: 0 }] });
  });

  it('marks an in-range reading with a tick', async () => {
    const user = userEvent.setup();
    const { prep } = setup();
    const expected = prep.readings('key_on')!.pins.find((p) => p.ref === 'X1A.1')!.volts!;
    renderApp(`/pin-cards/${H}/${R}/X1A?state=key_on`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1A / X1B' });
    await user.click(screen.getByRole('button', { name: 'Take a reading at X1A.1' }));
    const form = screen.getByRole('form', { name: 'Enter a reading' });
    await user.type(within(form).getByLabelText('Meter showed (V)'), expected.toFixed(2));
    await user.click(within(form).getByRole('button', { name: 'Add reading' }));
    const ok = await screen.findByText(/^OK: /);
    expect(ok.closest('[data-verdict]')!.getAttribute('data-verdict')).toBe('in');
  });

  it('lets a lead set a cavity’s tolerance', async () => {
    const user = userEvent.setup();
    const { state } = setup('lead');
    renderApp(`/pin-cards/${H}/${R}/X1A`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1A / X1B' });
    const tol = screen.getByRole('form', { name: 'Tolerance for X1A.1' });
    await user.type(within(tol).getByLabelText('V below'), '0.8');
    await user.type(within(tol).getByLabelText('V above'), '0.4');
    await user.click(within(tol).getByRole('button', { name: 'Set tolerance' }));
    await waitFor(() => expect(state.tolerancePuts).toEqual([{ pin: 'X1A.1', below: 0.8, above: 0.4 }]));
  });

  it('has no tolerance form for a tech', async () => {
    setup('tech');
    renderApp(`/pin-cards/${H}/${R}/X1A`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1A / X1B' });
    expect(screen.queryByRole('form', { name: /Tolerance for/ })).toBeNull();
  });

  it('searches from the card’s header and opens the hit on its cavity', async () => {
    const user = userEvent.setup();
    setup();
    const { router } = renderApp(`/pin-cards/${H}/${R}/X1A`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1A / X1B' });
    await user.type(screen.getByRole('searchbox'), '101');
    const results = await screen.findByRole('list', { name: 'Search results for 101' });
    await user.click(within(results).getByRole('link', { name: /X1B\.1/ }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/pin-cards/${H}/${R}/X1B`));
    expect(router.state.location.search).toContain('pin=1');
  });

  it('pins the connector for the person', async () => {
    const user = userEvent.setup();
    const { state } = setup();
    renderApp(`/pin-cards/${H}/${R}/X1B`);
    await screen.findByRole('heading', { level: 1, name: 'Pin card X1B / X1A' });
    await user.click(screen.getByRole('button', { name: 'Pin' }));
    await waitFor(() => expect(state.pinned).toBe(true));
    await screen.findByRole('button', { name: 'Unpin' });
  });
});

describe('walk page', () => {
  it('lists every step in order with fuse rating and colour, volts and series resistance; a fuse reading is marked at once', async () => {
    const user = userEvent.setup();
    setup();
    renderApp(`/walk?revision=${R}&from=BATT.%2B&to=M2.1&state=key_on`);
    const steps = await screen.findByRole('list', { name: 'Walk steps' });
    const kinds = [...steps.querySelectorAll('[data-step]')].map((e) => e.getAttribute('data-step'));
    expect(kinds[0]).toBe('pin');
    expect(kinds).toContain('fuse');
    expect(kinds).toContain('mate');
    expect(within(steps).getByText(/Fuse F1: 10 A, red/)).toBeTruthy();
    expect(within(steps).getAllByText(/from the start/).length).toBeGreaterThan(3);
    await user.click(within(steps).getByRole('button', { name: 'Fuse F1 blows on insert' }));
    const taken = await screen.findByRole('list', { name: 'Readings taken' });
    expect(within(taken).getByText(/OUT: fuse blows on insert/)).toBeTruthy();
    expect(screen.getAllByRole('note', { name: /A fuse that blows with an arc/ }).length).toBeGreaterThan(0);
  });
});

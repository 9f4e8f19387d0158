/**
 * Bus messages page and the pin-card panel in jsdom, against a fake API whose captures are the
 * real summaries of the demo logs and whose comparison is the real compareCaptures.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { messageView, type CaptureRow } from '@shared/api/bus';
import { summariseCandump } from '@shared/can/candump';
import { compareCaptures } from '@shared/can/compare';
import { createQueryClient } from '@/app/query-client';
import { BusMessagesForPin } from '@/features/bus';
import { harnessDocument } from '../../seeds/library';
import { fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

const H = 'hhhhhhhhhhhhhhhhhhhhhhhhhh';
const D = 'dddddddddddddddddddddddddd';
const doc = harnessDocument('kr-t78-main');
const rest = summariseCandump(readFileSync('seeds/captures/aux-rest.log', 'utf8'));
const moved = summariseCandump(readFileSync('seeds/captures/aux-moved.log', 'utf8'));
const row = (id: string, name: string, s: typeof rest): CaptureRow => ({
  id, harnessId: H, revisionId: null, name, fileName: `${name}.log`, sizeBytes: 1, lines: s.lines, frames: s.frames,
  badLineCount: s.badLineCount, identifierCount: s.identifiers.length, durationS: 15, uploadedBy: { id: 'u', name: 'Lead' }, uploadedAt: '2026-12-01T10:00:00.000Z',
});
const R1 = 'r'.repeat(26);
const M1 = 'm'.repeat(26);

function fakeBusApi() {
  return installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('lead') }),
    'GET /api/meta': () => ({ body: { outbox: false, demo: true } }),
    'GET /api/harnesses/:id': () => ({ body: { harness: { id: H, name: 'Main harness', modelId: null, modelName: null, modelKind: null, publishedRevisionId: 'p'.repeat(26), publishedNumber: 1, publishedAt: null, draftRevisionId: D, createdAt: '', updatedAt: '' }, revisions: [] } }),
    'GET /api/revisions/:id/messages': () => ({ body: { revision: { id: D, status: 'draft', version: 7, harnessId: H, number: 2 }, messages: (doc.messages ?? []).map((m) => messageView(m, m.sender ?? null)), modules: [] } }),
    'GET /api/harnesses/:id/captures': () => ({ body: { captures: [row(M1, 'Roller moved', moved), row(R1, 'Roller at rest', rest)] } }),
    'GET /api/captures/:a/compare/:b': () => ({ body: { rest: row(R1, 'Roller at rest', rest), moved: row(M1, 'Roller moved', moved), comparison: compareCaptures(rest, moved), catalogued: { messages: ['0CFF1021'], bytes: [] } } }),
    'POST /api/revisions/:id/findings': ({ body }) => ({ status: 201, body: { version: 8, created: 'signal', message: messageView(doc.messages!.find((m) => m.id === '0CFF1021')!), echo: body } }),
    'POST /api/revisions/:id/messages': () => ({ status: 409, body: { error: { code: 'version_conflict', message: 'The draft was saved by Ana since you opened it (version 8, yours 7). Reload it and make your change again.' } } }),
    'POST /api/revisions/:id/evaluate': () => ({ body: { readings: [{ kind: 'message', messageId: '0CFF1021', seen: false, inRange: false, verdict: 'OUT: 0CFF1021 not seen, expected from MCU', advice: 'A module that should talk and does not points at its power, ground or bus wires. Check MCU.2 powered.' }], suspects: [], nextUnplug: null } }),
  });
}

describe('bus messages page', () => {
  it('shows the catalogue split per SAE J1939-21 and files the top change of the compare with the draft version', async () => {
    const { calls } = fakeBusApi();
    renderApp(`/bus/${H}`);
    const table = await screen.findByRole('table', { name: 'Message catalogue' });
    // 0x0CF00400 → priority 3, PGN 61444, source 0x00 (SAE J1939-21 and J1939-71, from memory).
    const eec1 = within(table).getAllByTestId('j1939-split').find((e) => e.textContent?.includes('PGN 61444'));
    expect(eec1?.textContent).toContain('priority 3');
    const user = userEvent.setup();
    await user.click(within(screen.getByRole('table', { name: 'Captures' })).getAllByRole('button', { name: 'At rest' })[1]);
    await user.click(within(screen.getByRole('table', { name: 'Captures' })).getAllByRole('button', { name: 'Moved' })[0]);
    const ranked = await screen.findByRole('list', { name: 'Ranked changes' });
    const top = within(ranked).getAllByRole('listitem')[0];
    expect(top.getAttribute('data-change')).toBe('0CFF1021:1');
    expect(top.textContent).toContain('Message known, byte not');
    await user.click(within(top).getByRole('button', { name: 'File this' }));
    const name = within(top).getByLabelText('Signal name');
    await user.clear(name);
    await user.type(name, 'Roller');
    await user.click(within(top).getByRole('button', { name: 'File in the draft' }));
    await within(top).findByText(/Filed as signal “Roller” on 0CFF1021/);
    const post = calls.find((c) => c.method === 'POST' && c.path.endsWith('/findings'));
    expect(post?.path).toBe(`/api/revisions/${D}/findings`);
    expect(post?.body).toEqual({ version: 7, rest: R1, moved: M1, key: '0CFF1021', index: 0, name: 'Roller' });
  });
});

describe('adding a message by hand', () => {
  it('sends the identifier with the draft version and shows the conflict in words', async () => {
    const { calls } = fakeBusApi();
    renderApp(`/bus/${H}`);
    const form = await screen.findByRole('form', { name: 'Add a message' });
    const user = userEvent.setup();
    await user.type(within(form).getByLabelText('Identifier (hex)'), '18fef100');
    await user.type(within(form).getByLabelText('Name'), 'Vehicle speed');
    await user.click(within(form).getByRole('button', { name: 'Add message' }));
    await within(form).findByText(/saved by Ana since you opened it/);
    const post = calls.find((c) => c.method === 'POST' && c.path === `/api/revisions/${D}/messages`);
    expect(post?.body).toEqual({ version: 7, message: { id: '18FEF100', extended: true, name: 'Vehicle speed' } });
  });
});

describe('BusMessagesForPin', () => {
  const show = (pinRef: string) =>
    render(
      <QueryClientProvider client={createQueryClient()}>
        <BusMessagesForPin revisionId={D} document={doc} pinRef={pinRef} />
      </QueryClientProvider>,
    );

  it('lists the messages of the modules on the bus and marks one not seen through the evaluation', async () => {
    const { calls } = fakeBusApi();
    show('X20A.3');
    expect(screen.getByText('60 Ω').closest('li')?.textContent).toContain('120 Ω terminator at each end');
    const item = document.querySelector('li[data-message="0CFF1021"]') as HTMLElement;
    expect(item.textContent).toContain('Auxiliary roller position');
    await userEvent.setup().click(within(item).getByRole('button', { name: '✗ Not seen' }));
    await within(item).findByText(/points at its power, ground or bus wires/);
    expect(calls.find((c) => c.path.endsWith('/evaluate'))?.body).toEqual({ observations: [{ kind: 'message', messageId: '0CFF1021', seen: false }] });
  });

  it('renders nothing for a pin that is not on a bus', () => {
    const { container } = show('MCU.2');
    expect(container.textContent).toBe('');
  });
});

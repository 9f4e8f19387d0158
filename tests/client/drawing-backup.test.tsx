/**
 * The draft's crash copy: an editor that finds one in this browser offers it
 * back; restoring brings the work back and saves it, discarding removes it,
 * and a copy that holds nothing new is dropped without asking. Each tab keeps
 * its own: copies of closed tabs are all offered, newest first; that of a tab
 * still editing the draft is left to it.
 */
import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { HarnessDocument } from '@shared/harness';
import { backupKey, editingKey } from '@/features/drawing/backup';
import { renderApp } from './render';
import { apiError, fakeMe, installFakeApi } from './fake-api';
import { stubResizeObserverEachTest } from './resize-observer';

const H = 'h'.repeat(26);
const R = 'r'.repeat(26);

const saved: HarnessDocument = {
  format: 'wirewalk-harness',
  version: 1,
  name: 'Loader lights',
  nominalVolts: 12,
  temperatureC: 20,
  components: [
    { id: 'BATT', kind: 'battery', volts: 12.6 },
    { id: 'F1', kind: 'fuse', amps: 10 },
    { id: 'L1', kind: 'load', ohms: 12 },
    { id: 'G1', kind: 'ground' },
  ],
  wires: [
    { id: 'W1', from: 'BATT.+', to: 'F1.1', color: 'RD', size: { mm2: 1.5 }, lengthM: 0.5 },
    { id: 'W2', from: 'F1.2', to: 'L1.1', color: 'RD', size: { mm2: 1.5 }, lengthM: 2 },
  ],
  clamps: [],
  states: [],
};
const positions = { BATT: { x: 0, y: 0 }, F1: { x: 160, y: 10 }, L1: { x: 320, y: 0 }, G1: { x: 480, y: 0 } };
// The lead's last wire, which the server never got.
const unsaved: HarnessDocument = { ...saved, wires: [...saved.wires, { id: 'W3', from: 'L1.2', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 }] };

function setup({ serverDown = false } = {}) {
  const revision = {
    id: R, harnessId: H, number: 1, status: 'draft', version: 4, parentRevisionId: null, name: 'Loader lights',
    createdBy: null, createdAt: '2026-12-01T10:00:00Z', updatedBy: null, updatedAt: '2026-12-01T10:00:00Z', publishedBy: null, publishedAt: null, publishNote: null,
  };
  const puts: Array<{ version: number; document: HarnessDocument }> = [];
  const api = installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('lead') }),
    'GET /api/meta': () => ({ body: { outbox: false, demo: false, version: 'test' } }),
    'GET /api/harnesses/:id': () => ({
      body: { harness: { id: H, name: 'Loader lights', modelId: null, modelName: null, modelKind: null, publishedRevisionId: null, publishedNumber: null, publishedAt: null, draftRevisionId: R, createdAt: '', updatedAt: '' }, revisions: [revision] },
    }),
    'GET /api/revisions/:id': () => ({ body: { revision, document: saved, positions } }),
    'PUT /api/revisions/:id/document': ({ body }) => {
      const b = body as { version: number; document: HarnessDocument };
      puts.push(b);
      if (serverDown) return apiError(503, 'unavailable', 'The server is not answering.');
      return { body: { version: b.version + 1, updatedAt: '2026-12-01T10:05:00Z' } };
    },
  });
  return { ...api, puts };
}

// Without a tab: the single copy versions before tabs kept.
function leaveBackup(doc: HarnessDocument, version = 4, tab?: string, at = Date.parse('2026-12-01T10:03:00Z')) {
  localStorage.setItem(backupKey(R, tab), JSON.stringify({ doc, positions, at, version }));
}
const copyKeys = () => Object.keys(localStorage).filter((k) => k.startsWith('wirewalk.drawing.unsaved.'));
// Two more wires than the draft: a tab's work that differs from the other copies.
const unsaved2: HarnessDocument = { ...unsaved, wires: [...unsaved.wires, { id: 'W4', from: 'BATT.-', to: 'G1.G', color: 'BK', size: { mm2: 1.5 }, lengthM: 1 }] };

const wireList = () => screen.findByRole('list', { name: 'Wires' });

stubResizeObserverEachTest();

describe('the crash copy of a draft', () => {
  it('is offered back, and restoring it brings the unsaved wire back and saves it', async () => {
    const api = setup();
    leaveBackup(unsaved);
    renderApp(`/harnesses/${H}/drawing`);
    const dialog = await screen.findByRole('dialog', { name: 'Unsaved work from this browser' });
    expect(dialog).toHaveTextContent('1 wire more');
    expect(dialog).not.toHaveTextContent(/saved again/);
    // While the lead decides, the copy stays where it is.
    expect(localStorage.getItem(backupKey(R))).toContain('"W3"');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Restore this copy' }));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(within(await wireList()).getByRole('button', { name: /^W3:/ })).toBeInTheDocument();
    await waitFor(() => expect(api.puts.some((p) => p.document.wires.some((w) => w.id === 'W3'))).toBe(true), { timeout: 8000 });
    expect(api.puts.at(-1)!.version).toBe(4);
    // The server has it now: the copy goes.
    await waitFor(() => expect(localStorage.getItem(backupKey(R))).toBeNull());
  });

  it('is removed when the lead discards it, and the draft stays as saved', async () => {
    const api = setup();
    leaveBackup(unsaved, 3);
    renderApp(`/harnesses/${H}/drawing`);
    const dialog = await screen.findByRole('dialog', { name: 'Unsaved work from this browser' });
    // Someone saved the draft after the copy was made: the lead is told before choosing.
    expect(dialog).toHaveTextContent(/saved again after this copy/);
    fireEvent.click(within(dialog).getByRole('button', { name: 'Discard it' }));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(localStorage.getItem(backupKey(R))).toBeNull();
    expect(within(await wireList()).queryByRole('button', { name: /^W3:/ })).toBeNull();
    expect(api.puts).toHaveLength(0);
  });

  it('is dropped without asking when it holds nothing the draft does not', async () => {
    setup();
    leaveBackup(saved);
    renderApp(`/harnesses/${H}/drawing`);
    await wireList();
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(localStorage.getItem(backupKey(R))).toBeNull();
  });

  it('offers the copies of every closed tab newest first, each restored or discarded on its own, and leaves that of a live tab alone', async () => {
    const api = setup();
    leaveBackup(unsaved, 4, 'closedtab', Date.parse('2026-12-01T10:03:00Z'));
    leaveBackup(unsaved2, 4, 'crashtab', Date.parse('2026-12-01T10:07:00Z'));
    // A tab still at work on the draft: its copy is its own business.
    leaveBackup(unsaved2, 4, 'livetab', Date.parse('2026-12-01T10:09:00Z'));
    localStorage.setItem(editingKey(R, 'livetab'), JSON.stringify({ at: Date.now(), page: 'elsewhere' }));
    renderApp(`/harnesses/${H}/drawing`);
    const dialog = await screen.findByRole('dialog', { name: 'Unsaved work from this browser' });
    const items = within(within(dialog).getByRole('list', { name: 'Copies kept in this browser' })).getAllByRole('listitem');
    expect(items).toHaveLength(2);
    expect(items[0]).toHaveAccessibleName(/^Left by another tab or window, .*\d:\d\d/);
    expect(items[0]).toHaveTextContent('2 wires more');
    expect(items[1]).toHaveTextContent('1 wire more');
    // Discarding the newest removes that one only; the other is still offered.
    fireEvent.click(within(items[0]).getByRole('button', { name: 'Discard it' }));
    expect(localStorage.getItem(backupKey(R, 'crashtab'))).toBeNull();
    const left = within(screen.getByRole('dialog')).getAllByRole('listitem');
    expect(left).toHaveLength(1);
    expect(left[0]).toHaveTextContent('1 wire more');
    expect(left[0]).toContainElement(document.activeElement as HTMLElement);
    fireEvent.click(within(left[0]).getByRole('button', { name: 'Restore this copy' }));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(within(await wireList()).getByRole('button', { name: /^W3:/ })).toBeInTheDocument();
    await waitFor(() => expect(api.puts.some((p) => p.document.wires.some((w) => w.id === 'W3'))).toBe(true), { timeout: 8000 });
    // The restored copy is the server's now; the live tab's copy was never touched.
    await waitFor(() => expect(copyKeys()).toEqual([backupKey(R, 'livetab')]));
    expect(JSON.parse(localStorage.getItem(backupKey(R, 'livetab'))!).doc.wires).toHaveLength(4);
  });

  it('writes its own copy under its tab while changes wait, and marks the tab as editing', async () => {
    const api = setup({ serverDown: true });
    renderApp(`/harnesses/${H}/drawing`);
    await wireList();
    const tab = sessionStorage.getItem('wirewalk.tab');
    expect(tab).toBeTruthy();
    expect(JSON.parse(localStorage.getItem(editingKey(R, tab!))!).at).toBeGreaterThan(Date.now() - 60_000);
    // A component added: the autosave pause writes this tab's copy before sending.
    fireEvent.click(within(screen.getByRole('navigation', { name: 'Add a component' })).getByRole('button', { name: 'Resistor' }));
    await waitFor(() => expect(api.puts).toHaveLength(1), { timeout: 8000 });
    expect(localStorage.getItem(backupKey(R, tab!))).toContain('"R1"');
    expect(copyKeys()).toEqual([backupKey(R, tab!)]);
  });
});

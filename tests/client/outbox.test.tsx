import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

const messages = [
  {
    id: 'm1',
    to: 'new.tech@example.com',
    from: 'Wirewalk <no-reply@wirewalk.invalid>',
    subject: 'Owner Person invited you to Ridgeline Compact Repair',
    date: '2026-12-02T01:00:00Z',
    text: 'Choose your password and join here: http://127.0.0.1:3000/invite/abcdefghijklmnopqrstu\nThe link works once.',
    html: '<p>Choose your password <a href="http://127.0.0.1:3000/invite/abcdefghijklmnopqrstu">and join</a></p><script>parent.alert(1)</script>',
    attachments: [],
  },
  {
    id: 'm2',
    to: 'customer@example.com',
    from: 'Wirewalk <no-reply@wirewalk.invalid>',
    subject: 'Your repair report',
    date: '2026-12-02T02:00:00Z',
    text: 'The report is attached.',
    html: '',
    attachments: [{ index: 0, filename: 'report RO-1042.pdf', contentType: 'application/pdf', size: 48_213 }],
  },
];

function owner(outbox: boolean) {
  return installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('owner') }),
    'GET /api/meta': () => ({ body: { outbox, demo: true, version: 'test' } }),
    'GET /api/outbox': () => ({ body: { messages } }),
  });
}

describe('outbox page', () => {
  it('lists messages newest first and opens one with its links', async () => {
    owner(true);
    const { router } = renderApp('/outbox');
    const list = await screen.findByRole('navigation', { name: 'Messages' });
    const links = within(list).getAllByRole('link');
    expect(links.map((l) => l.textContent)).toEqual([
      expect.stringContaining('Your repair report'),
      expect.stringContaining('invited you'),
    ]);
    expect(links[1]).toHaveTextContent('To new.tech@example.com');

    const user = userEvent.setup();
    await user.click(links[1]);
    await waitFor(() => expect(router.state.location.pathname).toBe('/outbox/m1'));
    const frame = await screen.findByTitle(/HTML body of/);
    // No scripts and no same-origin access for the mail's HTML.
    expect(frame).toHaveAttribute('sandbox', 'allow-popups allow-popups-to-escape-sandbox');
    expect(frame.getAttribute('srcdoc')).toContain('<base target="_blank">');

    await user.click(screen.getByRole('button', { name: 'As plain text' }));
    expect(screen.getByRole('link', { name: 'http://127.0.0.1:3000/invite/abcdefghijklmnopqrstu' })).toHaveAttribute(
      'href',
      'http://127.0.0.1:3000/invite/abcdefghijklmnopqrstu',
    );
  });

  it('links to attachments', async () => {
    owner(true);
    renderApp('/outbox/m2');
    const link = await screen.findByRole('link', { name: /report RO-1042\.pdf/ });
    expect(link).toHaveAttribute('href', '/api/outbox/m2/attachments/0');
    expect(link).toHaveTextContent('application/pdf, 48.2 kB');
  });

  it('says there is no outbox when the server sends real mail', async () => {
    const { calls } = owner(false);
    renderApp('/outbox');
    expect(await screen.findByText('No outbox on this installation')).toBeInTheDocument();
    expect(calls.some((c) => c.path === '/api/outbox')).toBe(false);
  });
});

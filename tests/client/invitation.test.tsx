import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { apiError, fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

const TOKEN = 'tok_0123456789abcdefghij';

function routes(extra: Parameters<typeof installFakeApi>[0] = {}) {
  let signedIn = false;
  return installFakeApi({
    'GET /api/auth/me': () => (signedIn ? { body: fakeMe('tech', { user: { id: 'u9', email: 'new.tech@example.com', name: 'Dana Reyes' } }) } : apiError(401, 'unauthenticated', 'Sign in first')),
    'GET /api/meta': () => ({ body: { outbox: false, demo: false, version: 'test' } }),
    'GET /api/invitations/:token': ({ params }) =>
      params.token === TOKEN
        ? { body: { email: 'new.tech@example.com', role: 'tech', shopName: 'Ridgeline Compact Repair', invitedBy: 'Owner Person' } }
        : apiError(404, 'invitation_not_found', 'This invitation does not exist or was withdrawn.'),
    'POST /api/invitations/:token/accept': () => {
      signedIn = true;
      return { body: fakeMe('tech', { user: { id: 'u9', email: 'new.tech@example.com', name: 'Dana Reyes' } }) };
    },
    ...extra,
  });
}

describe('accept invitation page', () => {
  it('shows who invited whom, checks the form, and joins the shop', async () => {
    const { calls } = routes();
    const { router } = renderApp(`/invite/${TOKEN}`);
    expect(await screen.findByRole('heading', { name: 'Join Ridgeline Compact Repair' })).toBeInTheDocument();
    expect(screen.getByText(/Owner Person invited you to join as/)).toHaveTextContent('technician');
    expect(screen.getByText('new.tech@example.com')).toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Join the shop' }));
    expect(await screen.findByText('Enter a name')).toBeInTheDocument();
    expect(screen.getByText('Use at least 10 characters')).toBeInTheDocument();

    await user.type(screen.getByLabelText('Your name'), 'Dana Reyes');
    await user.type(screen.getByLabelText('Password'), 'long enough pass');
    await user.type(screen.getByLabelText('Password again'), 'long enough pasS');
    await user.click(screen.getByRole('button', { name: 'Join the shop' }));
    expect(await screen.findByText('The two passwords are not the same')).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.clear(screen.getByLabelText('Password again'));
    await user.type(screen.getByLabelText('Password again'), 'long enough pass');
    await user.click(screen.getByRole('button', { name: 'Join the shop' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/'));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ name: 'Dana Reyes', password: 'long enough pass' });
    expect(await screen.findByRole('heading', { level: 1, name: 'Hello, Dana' })).toBeInTheDocument();
  });

  it('explains a link that does not work', async () => {
    routes();
    renderApp('/invite/tok_doesnotexist_000000000');
    expect(await screen.findByRole('heading', { name: 'This invitation link does not work' })).toBeInTheDocument();
  });

  it('explains an invitation that ran out', async () => {
    routes({ 'GET /api/invitations/:token': () => apiError(410, 'invitation_expired', 'This invitation has expired.') });
    renderApp(`/invite/${TOKEN}`);
    expect(await screen.findByRole('heading', { name: 'This invitation has run out' })).toBeInTheDocument();
  });

  it('shows the server message when the e-mail already has an account', async () => {
    routes({ 'POST /api/invitations/:token/accept': () => apiError(409, 'account_exists', 'This e-mail already has a Wirewalk account. Sign in with it instead.') });
    renderApp(`/invite/${TOKEN}`);
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('Your name'), 'Dana Reyes');
    await user.type(screen.getByLabelText('Password'), 'long enough pass');
    await user.type(screen.getByLabelText('Password again'), 'long enough pass');
    await user.click(screen.getByRole('button', { name: 'Join the shop' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('already has a Wirewalk account');
  });
});

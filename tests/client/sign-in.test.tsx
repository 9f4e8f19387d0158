import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { apiError, fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

const meta = () => ({ body: { outbox: false, demo: false, version: 'test' } });

describe('sign-in page', () => {
  it('checks the fields before asking the server', async () => {
    const { calls } = installFakeApi({ 'GET /api/auth/me': () => apiError(401, 'unauthenticated', 'Sign in first'), 'GET /api/meta': meta });
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter an e-mail address like name@shop.com')).toBeInTheDocument();
    expect(screen.getByText('Enter your password')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(calls.some((c) => c.path === '/api/auth/sign-in')).toBe(false);
  });

  it('says in words when e-mail and password do not match, and clears the password', async () => {
    const { calls } = installFakeApi({
      'GET /api/auth/me': () => apiError(401, 'unauthenticated', 'Sign in first'),
      'GET /api/meta': meta,
      'POST /api/auth/sign-in': () => apiError(401, 'invalid_credentials', 'Invalid credentials'),
    });
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'Tech@Example.com ');
    await user.type(screen.getByLabelText('Password'), 'wrong-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('That e-mail and password do not match an account here.');
    expect(screen.getByLabelText('Password')).toHaveValue('');
    // The shared schema trims and lower-cases the address before it is sent.
    expect(calls.find((c) => c.path === '/api/auth/sign-in')?.body).toEqual({ email: 'tech@example.com', password: 'wrong-password' });
  });

  it('says to wait when sign-in is rate limited', async () => {
    installFakeApi({
      'GET /api/auth/me': () => apiError(401, 'unauthenticated', 'Sign in first'),
      'GET /api/meta': meta,
      'POST /api/auth/sign-in': () => apiError(429, 'rate_limited', 'Too many attempts'),
    });
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'tech@example.com');
    await user.type(screen.getByLabelText('Password'), 'whatever-it-is');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Too many sign-in attempts');
  });

  it('puts server field details on the fields', async () => {
    installFakeApi({
      'GET /api/auth/me': () => apiError(401, 'unauthenticated', 'Sign in first'),
      'GET /api/meta': meta,
      'POST /api/auth/sign-in': () =>
        apiError(400, 'invalid_request', 'Check the fields', [{ path: '$.email', message: 'This address is not allowed here' }]),
    });
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'tech@example.com');
    await user.type(screen.getByLabelText('Password'), 'whatever-it-is');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('This address is not allowed here')).toBeInTheDocument();
  });

  it('sends a signed-out person to sign-in with the way back, and returns them after', async () => {
    let signedIn = false;
    installFakeApi({
      'GET /api/auth/me': () => (signedIn ? { body: fakeMe('owner') } : apiError(401, 'unauthenticated', 'Sign in first')),
      'GET /api/meta': meta,
      'POST /api/auth/sign-in': () => {
        signedIn = true;
        return { body: fakeMe('owner') };
      },
      'GET /api/account': () => ({ body: { name: 'Owner Person', email: 'owner@example.com', role: 'owner', shopName: 'Ridgeline Compact Repair' } }),
    });
    const { router } = renderApp('/account');
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe('?next=%2Faccount');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'owner@example.com');
    await user.type(screen.getByLabelText('Password'), 'wirewalk-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Account' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/account');
  });
});

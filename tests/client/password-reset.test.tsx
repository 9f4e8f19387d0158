import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { apiError, installFakeApi } from './fake-api';
import { renderApp } from './render';

const TOKEN = 'reset_0123456789abcdefghij';

function signedOut() {
  return installFakeApi({
    'GET /api/auth/me': () => apiError(401, 'unauthenticated', 'Sign in first'),
    'GET /api/meta': () => ({ body: { outbox: true, demo: false, version: 'test' } }),
    'POST /api/auth/password-reset': () => ({ status: 202, body: { ok: true } }),
    'POST /api/auth/password-reset/confirm': ({ body }) =>
      (body as { token: string }).token === TOKEN
        ? { status: 204 }
        : apiError(400, 'invalid_token', 'This reset link was already used or has expired. Ask for a new one.'),
  });
}

describe('password reset', () => {
  it('asks for a link by e-mail and says what happens next', async () => {
    const { calls } = signedOut();
    renderApp('/forgot-password');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'Tech@Example.com');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByRole('heading', { name: 'Check your e-mail' })).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ email: 'tech@example.com' });
  });

  it('sets a new password from the link', async () => {
    const { calls } = signedOut();
    renderApp(`/reset-password/${TOKEN}`);
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('New password'), 'short');
    await user.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByText('Use at least 10 characters')).toBeInTheDocument();
    await user.clear(screen.getByLabelText('New password'));
    await user.type(screen.getByLabelText('New password'), 'a good long password');
    await user.type(screen.getByLabelText('New password again'), 'a good long password');
    await user.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByRole('heading', { name: /Password changed/ })).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ token: TOKEN, password: 'a good long password' });
  });

  it('explains a used or expired link and offers a new one', async () => {
    signedOut();
    renderApp('/reset-password/reset_used_000000000000000000');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('New password'), 'a good long password');
    await user.type(screen.getByLabelText('New password again'), 'a good long password');
    await user.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByRole('heading', { name: 'This link no longer works' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toHaveAttribute('href', '/forgot-password');
  });
});

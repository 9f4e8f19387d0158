import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { apiError, fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

function signedIn() {
  const account = { name: 'Tech Person', email: 'tech@example.com', role: 'tech', shopName: 'Ridgeline Compact Repair' };
  return installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('tech', { user: { id: 'u-tech', email: 'tech@example.com', name: account.name } }) }),
    'GET /api/meta': () => ({ body: { outbox: false, demo: false, version: 'test' } }),
    'GET /api/account': () => ({ body: account }),
    'PATCH /api/account': ({ body }) => {
      account.name = (body as { name: string }).name;
      return { body: account };
    },
    'POST /api/account/password': ({ body }) =>
      (body as { currentPassword: string }).currentPassword === 'right-password'
        ? { status: 204 }
        : apiError(400, 'wrong_password', 'The current password is not right.', [{ path: '$.currentPassword', message: 'The current password is not right.' }]),
  });
}

describe('account page', () => {
  it('saves a new name', async () => {
    const { calls } = signedIn();
    renderApp('/account');
    const user = userEvent.setup();
    const name = await screen.findByLabelText('Name');
    expect(name).toHaveValue('Tech Person');
    await user.clear(name);
    await user.type(name, 'Priya Okafor');
    await user.click(screen.getByRole('button', { name: 'Save name' }));
    expect(await screen.findByText('Name saved.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ name: 'Priya Okafor' });
  });

  it('checks the new password twice and shows a wrong current password on its field', async () => {
    const { calls } = signedIn();
    renderApp('/account');
    const user = userEvent.setup();
    const panel = (await screen.findByRole('heading', { name: 'Password' })).closest('section')!;
    await user.type(within(panel).getByLabelText('Current password'), 'wrong-password');
    await user.type(within(panel).getByLabelText('New password'), 'a brand new password');
    await user.type(within(panel).getByLabelText('New password again'), 'a brand new passwort');
    await user.click(within(panel).getByRole('button', { name: 'Change password' }));
    expect(await within(panel).findByText('The two new passwords are not the same')).toBeInTheDocument();
    expect(calls.some((c) => c.path === '/api/account/password')).toBe(false);

    await user.clear(within(panel).getByLabelText('New password again'));
    await user.type(within(panel).getByLabelText('New password again'), 'a brand new password');
    await user.click(within(panel).getByRole('button', { name: 'Change password' }));
    expect(await within(panel).findByText('The current password is not right.')).toBeInTheDocument();
    expect(within(panel).getByLabelText('Current password')).toHaveAttribute('aria-invalid', 'true');

    await user.clear(within(panel).getByLabelText('Current password'));
    await user.type(within(panel).getByLabelText('Current password'), 'right-password');
    await user.click(within(panel).getByRole('button', { name: 'Change password' }));
    expect(await screen.findByText('Password changed. Use the new one from now on.')).toBeInTheDocument();
    expect(within(panel).getByLabelText('Current password')).toHaveValue('');
  });
});

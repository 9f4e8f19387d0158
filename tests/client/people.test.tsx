import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Role } from '@shared/api/auth';
import { apiError, fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

function fakeShop() {
  const state = {
    people: [
      { userId: 'u-owner', name: 'Owner Person', email: 'owner@example.com', role: 'owner' as Role, joinedAt: '2026-01-05T09:00:00Z' },
      { userId: 'u-ana', name: 'Ana Ferreira', email: 'ana@example.com', role: 'tech' as Role, joinedAt: '2026-02-10T09:00:00Z' },
    ],
    invitations: [
      { id: 'inv-1', email: 'waiting@example.com', role: 'writer' as Role, invitedAt: '2026-11-30T10:00:00Z', expiresAt: '2026-12-07T10:00:00Z' },
    ],
  };
  const api = installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('owner') }),
    'GET /api/meta': () => ({ body: { outbox: true, demo: false, version: 'test' } }),
    'GET /api/people': () => ({ body: state }),
    'POST /api/people/invitations': ({ body }) => {
      const { email, role } = body as { email: string; role: Role };
      if (state.people.some((p) => p.email === email)) return apiError(409, 'already_member', `${email} is already in this shop.`);
      state.invitations.push({ id: `inv-${state.invitations.length + 2}`, email, role, invitedAt: '2026-12-02T01:00:00Z', expiresAt: '2026-12-09T01:00:00Z' });
      return { status: 201, body: state.invitations.at(-1) };
    },
    'DELETE /api/people/invitations/:id': ({ params }) => {
      state.invitations = state.invitations.filter((i) => i.id !== params.id);
      return { status: 204 };
    },
    'PATCH /api/people/:userId': ({ params, body }) => {
      const person = state.people.find((p) => p.userId === params.userId)!;
      const role = (body as { role: Role }).role;
      if (person.role === 'owner' && role !== 'owner' && state.people.filter((p) => p.role === 'owner').length === 1) {
        return apiError(409, 'last_owner', 'A shop needs at least one owner: make someone else owner first.');
      }
      person.role = role;
      return { body: person };
    },
    'DELETE /api/people/:userId': ({ params }) => {
      state.people = state.people.filter((p) => p.userId !== params.userId);
      return { status: 204 };
    },
  });
  return { state, ...api };
}

describe('people page', () => {
  it('lists people and waiting invitations', async () => {
    fakeShop();
    renderApp('/people');
    expect(await screen.findByRole('heading', { level: 1, name: 'People' })).toBeInTheDocument();
    expect(await screen.findByText('Ana Ferreira')).toBeInTheDocument();
    expect(screen.getByText('(you)')).toBeInTheDocument();
    expect(screen.getByText('waiting@example.com')).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'Waiting invitations (1)' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'People in the shop (2)' })).toBeInTheDocument();
  });

  it('invites by e-mail with a role, and the invitation appears', async () => {
    const { calls } = fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    const form = await screen.findByRole('form', { name: 'Invite someone' });
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await within(form).findByText('Enter an e-mail address like name@shop.com')).toBeInTheDocument();

    await user.type(within(form).getByLabelText('E-mail'), 'New.Lead@Example.com');
    await user.selectOptions(within(form).getByLabelText('Role'), 'lead');
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Invitation sent to new.lead@example.com as lead technician.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ email: 'new.lead@example.com', role: 'lead' });
    expect(await screen.findByText('new.lead@example.com')).toBeInTheDocument();
    expect(within(form).getByLabelText('E-mail')).toHaveValue('');
  });

  it('shows the server answer on the e-mail field when the person is already in the shop', async () => {
    fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    const form = await screen.findByRole('form', { name: 'Invite someone' });
    await user.type(within(form).getByLabelText('E-mail'), 'ana@example.com');
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await within(form).findByText('ana@example.com is already in this shop.')).toBeInTheDocument();
  });

  it('revokes an invitation after confirming', async () => {
    const { calls } = fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Revoke the invitation for waiting@example.com' }));
    const dialog = screen.getByRole('alertdialog', { name: 'Revoke this invitation?' });
    await user.click(within(dialog).getByRole('button', { name: 'Revoke invitation' }));
    await waitFor(() => expect(screen.queryByText('waiting@example.com', { selector: 'p' })).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'DELETE' && c.path === '/api/people/invitations/inv-1')).toBe(true);
  });

  it('changes a role only after confirming, and cancel changes nothing', async () => {
    const { calls } = fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    const select = await screen.findByLabelText('Role of Ana Ferreira');
    await user.selectOptions(select, 'lead');
    await user.click(within(screen.getByRole('alertdialog')).getByRole('button', { name: 'Cancel' }));
    expect(select).toHaveValue('tech');
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);

    await user.selectOptions(select, 'lead');
    const dialog = screen.getByRole('alertdialog', { name: 'Make Ana Ferreira lead technician?' });
    await user.click(within(dialog).getByRole('button', { name: 'Change role' }));
    await waitFor(() => expect(screen.getByLabelText('Role of Ana Ferreira')).toHaveValue('lead'));
    expect(calls.find((c) => c.method === 'PATCH')).toMatchObject({ path: '/api/people/u-ana', body: { role: 'lead' } });
  });

  it('explains why the last owner cannot stop being owner', async () => {
    fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    await user.selectOptions(await screen.findByLabelText('Role of Owner Person'), 'tech');
    const dialog = screen.getByRole('alertdialog');
    expect(dialog).toHaveTextContent('You are changing your own role');
    await user.click(within(dialog).getByRole('button', { name: 'Change role' }));
    expect(await within(dialog).findByRole('alert')).toHaveTextContent('A shop needs at least one owner');
  });

  it('removes a person after confirming', async () => {
    const { calls } = fakeShop();
    renderApp('/people');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Remove Ana Ferreira' }));
    const dialog = screen.getByRole('alertdialog', { name: 'Remove Ana Ferreira from the shop?' });
    await user.click(within(dialog).getByRole('button', { name: 'Remove Ana Ferreira' }));
    await waitFor(() => expect(screen.queryByLabelText('Role of Ana Ferreira')).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'DELETE' && c.path === '/api/people/u-ana')).toBe(true);
  });

  it('is not open to a technician', async () => {
    installFakeApi({
      'GET /api/auth/me': () => ({ body: fakeMe('tech') }),
      'GET /api/meta': () => ({ body: { outbox: true, demo: false, version: 'test' } }),
    });
    renderApp('/people');
    expect(await screen.findByText('This page is not open to your role')).toBeInTheDocument();
  });
});

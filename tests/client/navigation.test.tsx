import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Role } from '@shared/api/auth';
import { navigation, navigationFor } from '@/app/navigation';
import { fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

function signedInAs(role: Role, outbox = true) {
  return installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe(role) }),
    'GET /api/meta': () => ({ body: { outbox, demo: false, version: 'test' } }),
    'POST /api/auth/sign-out': () => ({ status: 204 }),
  });
}

async function mainNavLabels() {
  // The desktop navigation (the phone menu is closed until asked for).
  const nav = await screen.findByRole('navigation', { name: 'Main' });
  await within(nav).findByRole('link', { name: 'Home' });
  return within(nav).getAllByRole('link').map((a) => a.textContent);
}

describe('navigation by role', () => {
  it('gives the owner People, Outbox and Account', async () => {
    signedInAs('owner');
    renderApp('/');
    const labels = await mainNavLabels();
    expect(labels).toEqual(navigationFor('owner', { outbox: true }).map((e) => e.label));
    expect(labels).toEqual(expect.arrayContaining(['Home', 'People', 'Outbox', 'Account']));
  });

  it('hides the Outbox when the server has none', async () => {
    signedInAs('owner', false);
    renderApp('/');
    const labels = await mainNavLabels();
    expect(labels).toEqual(expect.arrayContaining(['Home', 'People', 'Account']));
    expect(labels).not.toContain('Outbox');
  });

  it.each(['lead', 'tech', 'writer'] as const)('gives a %s no owner pages', async (role) => {
    signedInAs(role);
    renderApp('/');
    const labels = await mainNavLabels();
    expect(labels).not.toContain('People');
    expect(labels).not.toContain('Outbox');
    expect(labels).toContain('Account');
    expect(labels).toEqual(navigationFor(role, { outbox: true }).map((e) => e.label));
  });

  it('matches the registry for every role', () => {
    for (const role of ['owner', 'lead', 'tech', 'writer'] as const) {
      const shown = navigationFor(role, { outbox: true }).map((e) => e.to);
      const expected = navigation.filter((e) => e.roles.includes(role)).map((e) => e.to);
      expect(new Set(shown)).toEqual(new Set(expected));
    }
    expect(navigationFor(null, { outbox: true })).toEqual([]);
  });

  it('home links only to the pages in the menu', async () => {
    signedInAs('tech');
    renderApp('/');
    const main = await screen.findByRole('main');
    await within(main).findByRole('heading', { level: 1, name: 'Hello, Tech' });
    const links = within(main).getAllByRole('link').map((a) => a.getAttribute('href'));
    expect(links).toEqual(navigationFor('tech', { outbox: true }).filter((e) => e.to !== '/').map((e) => e.to));
  });

  it('opens the phone menu and closes it after picking a page', async () => {
    signedInAs('owner');
    renderApp('/');
    const user = userEvent.setup();
    const button = await screen.findByRole('button', { name: 'Menu' });
    expect(button).toHaveAttribute('aria-expanded', 'false');
    await user.click(button);
    expect(button).toHaveAttribute('aria-expanded', 'true');
    const menu = document.getElementById('ww-phone-menu')!;
    await user.click(within(menu).getByRole('link', { name: 'Account' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Account' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Menu' })).toHaveAttribute('aria-expanded', 'false');
  });

  it('shows a 404 page inside the layout for an unknown address', async () => {
    signedInAs('writer');
    renderApp('/no/such/page');
    expect(await screen.findByText('No page at this address')).toBeInTheDocument();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeInTheDocument();
  });

  it('signs out to the sign-in page', async () => {
    const { calls } = signedInAs('lead');
    const { router } = renderApp('/');
    const user = userEvent.setup();
    const buttons = await screen.findAllByRole('button', { name: 'Sign out' });
    await user.click(buttons[0]);
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/auth/sign-out')).toBe(true);
  });
});

import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { readFileSync } from 'node:fs';
import { MODE_STORAGE_KEY } from '@/lib/mode';
import { fakeMe, installFakeApi } from './fake-api';
import { renderApp } from './render';

function signedIn() {
  installFakeApi({
    'GET /api/auth/me': () => ({ body: fakeMe('tech') }),
    'GET /api/meta': () => ({ body: { outbox: false, demo: false, version: 'test' } }),
    'GET /api/account': () => ({ body: { name: 'Tech Person', email: 'tech@example.com', role: 'tech', shopName: 'Ridgeline Compact Repair' } }),
  });
}

describe('bench / bay mode', () => {
  it('switches on the Account page, applies at once and is kept', async () => {
    signedIn();
    renderApp('/account');
    const user = userEvent.setup();
    const bay = await screen.findByRole('radio', { name: 'Bay (dark)' });
    expect(screen.getByRole('radio', { name: 'Bench (light)' })).toBeChecked();
    await user.click(bay);
    expect(bay).toBeChecked();
    expect(document.documentElement.getAttribute('data-mode')).toBe('bay');
    expect(localStorage.getItem(MODE_STORAGE_KEY)).toBe('bay');
    // The header toggle follows the same state.
    expect(screen.getByRole('button', { name: 'Switch to Bench (light) mode' })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Switch to Bench (light) mode' }));
    expect(document.documentElement.getAttribute('data-mode')).toBe('bench');
    expect(localStorage.getItem(MODE_STORAGE_KEY)).toBe('bench');
    expect(screen.getByRole('radio', { name: 'Bench (light)' })).toBeChecked();
  });

  it('the saved mode is applied before first paint by public/mode.js', () => {
    const script = readFileSync('public/mode.js', 'utf8');
    expect(readFileSync('index.html', 'utf8')).toMatch(/<head>[\s\S]*<script src="\/mode\.js"><\/script>[\s\S]*<\/head>/);
    localStorage.setItem(MODE_STORAGE_KEY, 'bay');
    document.documentElement.setAttribute('data-mode', 'bench');
    new Function(script)();
    expect(document.documentElement.getAttribute('data-mode')).toBe('bay');
    localStorage.setItem(MODE_STORAGE_KEY, 'nonsense');
    new Function(script)();
    expect(document.documentElement.getAttribute('data-mode')).toBe('bench');
  });
});

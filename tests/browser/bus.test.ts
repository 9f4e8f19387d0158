/**
 * Bus messages in the real app: the demo lead uploads the two demo captures of the loader's
 * bus (auxiliary roller at rest, then moved), compares them, files the top change into the
 * draft's catalogue and publishes; then the demo tech opens the pin card of the cab-to-bulkhead
 * connector (a bus cavity) and sees the filed signal among the messages expected there, and
 * marks the message not seen to get the checks it implies.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { baseUrl, demoEmail, demoPassword, launchBrowser, newContext, screenshot, signIn } from '../support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const FOUND = 'Auxiliary roller (found by compare)';

async function apiAs(email: string) {
  const res = await fetch(`${baseUrl()}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: demoPassword }) });
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return (path: string, init: RequestInit = {}) => fetch(`${baseUrl()}${path}`, { ...init, headers: { cookie, 'content-type': 'application/json', ...(init.headers ?? {}) } });
}

describe('bus messages', () => {
  let harnessId = '';

  it('the lead uploads two captures, compares them and files the finding into the draft', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.lead);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.getByRole('link', { name: 'Bus messages' }).first().click();
    await page.getByRole('link', { name: /Main harness and front attachment circuit/ }).click();
    await page.waitForURL(/\/bus\/[a-z2-7]{26}$/);
    harnessId = page.url().split('/').pop()!;
    const catalogue = page.getByRole('table', { name: 'Message catalogue' });
    await expect(catalogue.locator('tr[data-message="0CFF1021"]').getByTestId('j1939-split').textContent()).resolves.toContain('PGN 65296');

    for (const [file, name] of [['aux-rest.log', 'Roller at rest'], ['aux-moved.log', 'Roller moved']] as const) {
      await page.getByLabel('Capture log file').setInputFiles(join(process.cwd(), 'seeds', 'captures', file));
      await page.getByLabel('Name (what the machine was doing)').fill(name);
      await page.getByRole('button', { name: 'Upload capture' }).click();
      await page.getByRole('status').filter({ hasText: `“${name}”` }).waitFor();
    }
    await expect(page.getByRole('status').filter({ hasText: 'Roller moved' }).textContent()).resolves.toContain('Every line was read');

    const ranked = page.getByRole('list', { name: 'Ranked changes' });
    await ranked.waitFor();
    const top = ranked.locator('li').first();
    await expect(top.getAttribute('data-change')).resolves.toBe('0CFF1021:1');
    await expect(top.textContent()).resolves.toContain('byte 1: 0x7D at rest');
    await screenshot(page, 'bus-compare');
    await top.getByRole('button', { name: 'File this' }).click();
    await top.getByLabel('Signal name').fill(FOUND);
    await top.getByRole('button', { name: 'File in the draft' }).click();
    await top.getByRole('status').filter({ hasText: 'Filed as signal' }).waitFor();
    await catalogue.locator('tr[data-message="0CFF1021"]').getByText(FOUND).waitFor();
    await screenshot(page, 'bus-filed');
    await ctx.close();

    // The lead publishes the draft (the publish flow itself belongs to the drawing pages).
    const lead = await apiAs(demoEmail.lead);
    const h = (await (await lead(`/api/harnesses/${harnessId}`)).json()) as { harness: { draftRevisionId: string } };
    const pub = await lead(`/api/revisions/${h.harness.draftRevisionId}/publish`, { method: 'POST', body: JSON.stringify({ note: 'Auxiliary roller byte found by comparing captures' }) });
    expect(pub.status).toBe(200);
  });

  it('the tech sees the filed signal on the pin card of a bus connector and marks it not seen', async () => {
    const ctx = await newContext(browser, 'phone');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.tech);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto(`/pin-cards/${harnessId}/latest/X20A`);
    const panel = page.locator('.bus-for-pin');
    await panel.waitFor();
    const msg = panel.locator('li[data-message="0CFF1021"]');
    await msg.getByText(FOUND).waitFor();
    await msg.getByRole('button', { name: '✗ Not seen' }).click();
    const advice = msg.getByRole('status');
    await advice.filter({ hasText: 'points at its power, ground or bus wires' }).waitFor();
    await expect(advice.textContent()).resolves.toContain('MCU.6');
    await msg.scrollIntoViewIfNeeded();
    await screenshot(page, 'bus-pin-card');
    await ctx.close();
  });
});

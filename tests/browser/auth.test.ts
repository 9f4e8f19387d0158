import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { demoEmail, launchBrowser, newContext, screenshot, signIn, type DemoRole } from '../support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const mainNav = (page: Page) => page.locator('nav[aria-label="Main"]:visible');

// What each role must and must not find in the navigation (product.md: who does what).
const expected: Record<DemoRole, { sees: string[]; notSees: string[] }> = {
  owner: { sees: ['Harnesses', 'People', 'Outbox', 'Account'], notSees: [] },
  lead: { sees: ['Harnesses', 'Account'], notSees: ['People', 'Outbox'] },
  tech: { sees: ['Account'], notSees: ['People', 'Outbox', 'Harnesses'] },
  writer: { sees: ['Account'], notSees: ['People', 'Outbox', 'Harnesses'] },
};

describe('signing in', () => {
  for (const role of Object.keys(expected) as DemoRole[]) {
    it(`the demo ${role} signs in and sees that role's navigation`, async () => {
      const context = await newContext(browser);
      const page = await context.newPage();
      await signIn(page, demoEmail[role]);
      const nav = mainNav(page);
      // The role's entries come with the session, the Outbox entry with /api/meta a moment later.
      for (const label of expected[role].sees) {
        await expect.poll(() => nav.getByRole('link', { name: label, exact: true }).count(), { message: label, timeout: 15_000 }).toBe(1);
      }
      for (const label of expected[role].notSees) expect(await nav.getByRole('link', { name: label, exact: true }).count(), label).toBe(0);
      await screenshot(page, `auth-home-${role}`);
      await context.close();
    });
  }

  it('a wrong password shows an error and keeps the person on the sign-in page', async () => {
    const context = await newContext(browser, 'phone');
    const page = await context.newPage();
    await signIn(page, demoEmail.tech, 'not-the-password');
    await expect.poll(() => page.getByRole('alert').first().textContent(), { timeout: 10_000 }).toMatch(/not right|password/i);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await screenshot(page, 'auth-wrong-password-phone');
    await context.close();
  });
});

describe('inviting a technician', () => {
  it('the owner invites a new tech, the mail arrives in the Outbox, the tech accepts and signs in', async () => {
    const email = `new.tech.${Date.now()}@example.com`;
    const owner = await newContext(browser);
    const page = await owner.newPage();
    await signIn(page, demoEmail.owner);
    await mainNav(page).getByRole('link', { name: 'People', exact: true }).click();
    const form = page.getByRole('form', { name: 'Invite someone' });
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Role').selectOption('tech');
    await form.getByRole('button').click();
    await expect.poll(() => page.getByText(email).count(), { timeout: 10_000 }).toBeGreaterThan(0);
    await screenshot(page, 'auth-people-invited');

    await mainNav(page).getByRole('link', { name: 'Outbox', exact: true }).click();
    const message = page.getByRole('link', { name: new RegExp('invited you') }).first();
    await message.waitFor({ timeout: 10_000 });
    await message.click();
    await page.getByRole('button', { name: /text/i }).click();
    const body = await page.locator('body').innerText();
    const link = body.match(/https?:\/\/[^\s]+\/invite\/[A-Za-z0-9_-]+/)?.[0];
    expect(link, 'the invitation mail carries a link').toBeTruthy();
    await screenshot(page, 'auth-outbox-invitation');

    const invitee = await newContext(browser, 'phone');
    const invitePage = await invitee.newPage();
    await invitePage.goto(new URL(link!).pathname);
    await invitePage.getByLabel('Your name').fill('Jordan Test');
    await invitePage.getByLabel('Password', { exact: true }).fill('a-long-new-password');
    await invitePage.getByLabel('Password again').fill('a-long-new-password');
    await invitePage.getByRole('button', { name: /join|accept/i }).click();
    await expect.poll(() => invitePage.getByText('Jordan Test').count(), { timeout: 10_000 }).toBeGreaterThan(0);
    await screenshot(invitePage, 'auth-invitation-accepted-phone');

    // A fresh browser: the new account signs in with its own password.
    const again = await newContext(browser);
    const againPage = await again.newPage();
    await signIn(againPage, email, 'a-long-new-password');
    await expect.poll(() => mainNav(againPage).getByRole('link', { name: 'Account' }).count(), { timeout: 10_000 }).toBe(1);
    expect(await mainNav(againPage).getByRole('link', { name: 'People', exact: true }).count()).toBe(0);
    await Promise.all([owner.close(), invitee.close(), again.close()]);
  });
});

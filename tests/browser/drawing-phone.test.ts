/**
 * The drawing editor on a phone: the drawing gets most of the screen; the
 * side panel is a sheet that opens when something is picked on the drawing
 * and closes with its button or Escape; the tools and the add list fold away.
 * On a desktop the three columns stay as they were.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { demoEmail, launchBrowser, newContext, screenshot, signIn } from '../support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function openDemoDraft(page: Page) {
  await signIn(page, demoEmail.lead);
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  await page.goto('/harnesses');
  await page.getByRole('list', { name: 'Harnesses' }).getByRole('link', { name: 'Main harness and front attachment circuit' }).click();
  await page.getByRole('toolbar', { name: 'Drawing tools' }).waitFor();
  await page.locator('[data-component]').first().waitFor({ timeout: 30_000 });
}

const focusedText = (page: Page) => page.evaluate(() => document.activeElement?.textContent?.trim() ?? '');

describe('the drawing editor on a phone', () => {
  it('gives the drawing most of the screen, and the side panel opens over it on selection and closes', async () => {
    const ctx = await newContext(browser, 'phone');
    const page = await ctx.newPage();
    await openDemoDraft(page);
    const viewport = page.viewportSize()!;
    const pane = page.locator('.ww-drawing');
    const panel = page.getByRole('complementary', { name: 'Side panel' });
    const paneBox = (await pane.boundingBox())!;
    expect(paneBox.height).toBeGreaterThanOrEqual(0.6 * viewport.height);
    expect(paneBox.width).toBe(viewport.width);
    expect(await panel.isVisible()).toBe(false);
    await screenshot(page, 'drawing-phone-open');

    // Pick the largest part on the drawing, the way a finger does.
    let best: { id: string; x: number; y: number; area: number } | null = null;
    for (const node of await page.locator('[data-component]').all()) {
      const b = await node.boundingBox();
      if (b && b.y > paneBox.y && b.y + b.height < paneBox.y + paneBox.height && (!best || b.width * b.height > best.area)) {
        best = { id: (await node.getAttribute('data-component'))!, x: b.x + b.width / 2, y: b.y + b.height / 2, area: b.width * b.height };
      }
    }
    expect(best).not.toBeNull();
    await page.mouse.click(best!.x, best!.y);
    await expect.poll(() => panel.isVisible()).toBe(true);
    await expect.poll(() => panel.getByLabel('Id', { exact: true }).inputValue()).toBe(best!.id);
    // A sheet over the lower part of the drawing; the drawing keeps its size, and the part picked stays in sight above the sheet.
    const sheet = (await panel.boundingBox())!;
    expect(sheet.y).toBeGreaterThan(paneBox.y + paneBox.height / 4);
    expect(sheet.y + sheet.height).toBeLessThanOrEqual(paneBox.y + paneBox.height + 1);
    expect((await pane.boundingBox())!.height).toBe(paneBox.height);
    await expect
      .poll(async () => {
        const picked = (await page.locator(`[data-component="${best!.id}"]`).boundingBox())!;
        return picked.y + Math.min(picked.height, 80) / 2 < sheet.y;
      })
      .toBe(true);
    await screenshot(page, 'drawing-phone-selected');

    await page.keyboard.press('Escape');
    await expect.poll(() => panel.isVisible()).toBe(false);
    expect(await focusedText(page)).toBe('Panel');

    // The Panel button opens it on its tabs; the close button puts it away again.
    await page.getByRole('button', { name: 'Panel' }).click();
    await expect.poll(() => panel.isVisible()).toBe(true);
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('tab');
    await panel.getByRole('tab', { name: 'Walk' }).click();
    await panel.getByLabel('From pin').waitFor();
    await panel.getByRole('button', { name: 'Close the panel' }).click();
    await expect.poll(() => panel.isVisible()).toBe(false);
    expect(await focusedText(page)).toBe('Panel');

    // The tools fold behind one button; the add list is a sheet too.
    const publish = page.getByRole('button', { name: 'Publish…' });
    expect(await publish.isVisible()).toBe(false);
    await page.getByRole('button', { name: 'Tools' }).click();
    await expect.poll(() => publish.isVisible()).toBe(true);
    await screenshot(page, 'drawing-phone-tools');
    await page.keyboard.press('Escape');
    await expect.poll(() => publish.isVisible()).toBe(false);
    const addList = page.getByRole('navigation', { name: 'Add a component' });
    expect(await addList.isVisible()).toBe(false);
    await page.getByRole('button', { name: 'Add', exact: true }).click();
    await expect.poll(() => addList.getByRole('button', { name: 'Fuse', exact: true }).isVisible()).toBe(true);
    await page.keyboard.press('Escape');
    await expect.poll(() => addList.isVisible()).toBe(false);
    await ctx.close();
  });

  it('shows a tech the published drawing on most of the screen, with the revisions folded under it', async () => {
    const ctx = await newContext(browser, 'phone');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.tech);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto('/harnesses');
    await page.getByRole('list', { name: 'Harnesses' }).getByRole('link', { name: 'Main harness and front attachment circuit' }).click();
    await page.locator('[data-component]').first().waitFor({ timeout: 30_000 });
    const viewport = page.viewportSize()!;
    expect((await page.locator('.ww-drawing').boundingBox())!.height).toBeGreaterThanOrEqual(0.55 * viewport.height);
    const list = page.getByRole('list', { name: 'Revisions' });
    expect(await list.isVisible()).toBe(false);
    const toggle = page.getByRole('button', { name: /^Revisions \(\d+\)/ });
    await screenshot(page, 'drawing-phone-read-only');
    await toggle.click();
    await expect.poll(() => list.isVisible()).toBe(true);
    expect(await toggle.getAttribute('aria-expanded')).toBe('true');
    await screenshot(page, 'drawing-phone-read-only-revisions');
    await toggle.click();
    await expect.poll(() => list.isVisible()).toBe(false);
    await ctx.close();
  });

  it('keeps the three columns on a desktop', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await openDemoDraft(page);
    const panel = page.getByRole('complementary', { name: 'Side panel' });
    const addList = page.getByRole('navigation', { name: 'Add a component' });
    expect(await panel.isVisible()).toBe(true);
    expect(await addList.isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Publish…' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Panel' }).count()).toBe(0);
    const [nav, pane, side] = [(await addList.boundingBox())!, (await page.locator('.ww-drawing').boundingBox())!, (await panel.boundingBox())!];
    expect(nav.x + nav.width).toBeLessThanOrEqual(pane.x + 1);
    expect(pane.x + pane.width).toBeLessThanOrEqual(side.x + 1);
    await ctx.close();
  });
});

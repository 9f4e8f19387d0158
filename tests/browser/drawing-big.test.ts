/**
 * A big drawing (the 100-circuit benchmark harness, never laid out) in the
 * real app: it opens at working zoom on a stretch full of parts and wires,
 * draws only what is in view, and shows parts again after fit-view and after
 * a reload on the positions it saved.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { demoEmail, launchBrowser, newContext, screenshot, signIn } from '../support/browser';
import { makeHarnessText } from '../support/make-harness';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** How many nodes and wires are drawn, and how many of the nodes lie inside the pane. */
async function inView(page: Page) {
  return page.evaluate(() => {
    const pane = document.querySelector('.react-flow')!.getBoundingClientRect();
    const nodes = [...document.querySelectorAll('.react-flow__node')];
    const inside = nodes.filter((n) => {
      const r = n.getBoundingClientRect();
      return r.right > pane.left && r.left < pane.right && r.bottom > pane.top && r.top < pane.bottom;
    });
    return { drawn: nodes.length, inside: inside.length, wires: document.querySelectorAll('.ww-wire').length };
  });
}

describe('a big drawing', () => {
  it('opens on a full view, draws only what is in view, and is never blank', async () => {
    const big = makeHarnessText(100);
    const total = (JSON.parse(big) as { components: unknown[] }).components.length;
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.lead);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    const res = await page.request.post('/api/harnesses/import', { data: big, headers: { 'content-type': 'application/json' } });
    expect(res.status()).toBe(201);
    const { harnessId } = (await res.json()) as { harnessId: string };

    await page.goto(`/harnesses/${harnessId}/drawing`);
    await page.waitForFunction(() => performance.getEntriesByName('ww-drawing-layout').length > 0 && document.querySelectorAll('.react-flow__node').length > 0, undefined, { timeout: 60_000 });
    await page.waitForTimeout(300);
    const opened = await inView(page);
    await screenshot(page, 'drawing-big-open');
    // A screenful of parts with their wires, not an empty corner or a lone battery …
    expect(opened.inside).toBeGreaterThanOrEqual(12);
    expect(opened.wires).toBeGreaterThanOrEqual(12);
    // … and only what is near the view is in the page.
    expect(opened.drawn).toBeLessThan(total / 4);
    const zoom = await page.evaluate(() => new DOMMatrixReadOnly(getComputedStyle(document.querySelector('.react-flow__viewport')!).transform).a);
    expect(zoom).toBeCloseTo(0.8, 2);

    await page.locator('.react-flow__controls-fitview').click();
    await page.waitForTimeout(500);
    expect((await inView(page)).inside).toBeGreaterThan(100);
    await screenshot(page, 'drawing-big-fit');

    // The laid-out positions are saved; reopened, the drawing again opens on a full view.
    await page.locator('[data-save="saved"]').waitFor({ timeout: 30_000 });
    await page.reload();
    await page.locator('.react-flow__node').first().waitFor();
    await page.waitForTimeout(300);
    const reopened = await inView(page);
    await screenshot(page, 'drawing-big-reopened');
    expect(reopened.inside).toBeGreaterThanOrEqual(12);
    expect(reopened.drawn).toBeLessThan(total / 4);
    await ctx.close();
  });
});

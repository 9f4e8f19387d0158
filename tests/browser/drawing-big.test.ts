/**
 * A big drawing (the 100-circuit benchmark harness) in the real app: laid out
 * on import, it opens drawn; stored without positions, it is laid out in the
 * browser. Either way it opens at working zoom on a stretch full of parts and wires,
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

/**
 * How many nodes and wires are in the page, how many of the nodes lie inside the pane, and how many
 * are shown (under the overview picture the nodes kept from before are in the page but hidden).
 */
async function inView(page: Page) {
  return page.evaluate(() => {
    const pane = document.querySelector('.react-flow')!.getBoundingClientRect();
    const nodes = [...document.querySelectorAll('.react-flow__node')];
    const inside = nodes.filter((n) => {
      const r = n.getBoundingClientRect();
      return r.right > pane.left && r.left < pane.right && r.bottom > pane.top && r.top < pane.bottom;
    });
    const shown = nodes.filter((n) => getComputedStyle(n).visibility !== 'hidden' && getComputedStyle(n.parentElement!).display !== 'none');
    return { drawn: nodes.length, inside: inside.length, shown: shown.length, wires: document.querySelectorAll('.ww-wire').length };
  });
}

const viewportZoom = (page: Page) => page.evaluate(() => new DOMMatrixReadOnly(getComputedStyle(document.querySelector('.react-flow__viewport')!).transform).a);

/**
 * The overview picture as shown: its share of the pane, the share of its pixels with ink on them, the
 * middle one of its inked pixels (in reading order, on the page) and how many nodes are drawn beside it.
 */
async function overviewInk(page: Page) {
  return page.evaluate(() => {
    const pane = document.querySelector('.react-flow')!.getBoundingClientRect();
    const img = document.querySelector<HTMLImageElement>('[data-overview] img')!;
    const r = img.getBoundingClientRect();
    const canvas = document.createElement('canvas');
    [canvas.width, canvas.height] = [Math.max(1, Math.round(r.width)), Math.max(1, Math.round(r.height))];
    const g = canvas.getContext('2d')!;
    g.drawImage(img, 0, 0, canvas.width, canvas.height);
    const px = g.getImageData(0, 0, canvas.width, canvas.height).data;
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i < px.length; i += 4) {
      if (px[i + 3] > 128 && px[i] + px[i + 1] + px[i + 2] < 600) {
        xs.push(r.left + ((i / 4) % canvas.width));
        ys.push(r.top + Math.floor(i / 4 / canvas.width));
      }
    }
    const mid = xs.length >> 1;
    return {
      natural: img.width,
      widthShare: r.width / pane.width,
      heightShare: r.height / pane.height,
      inked: xs.length / (px.length / 4),
      at: [xs[mid] ?? 0, ys[mid] ?? 0] as [number, number],
    };
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
    const { harnessId, revisionId } = (await res.json()) as { harnessId: string; revisionId: string };

    // Imported, it was laid out by the server: it opens drawn, with no layout in the browser.
    await page.goto(`/harnesses/${harnessId}/drawing`);
    await page.locator('.react-flow__node').first().waitFor();
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => performance.getEntriesByName('ww-drawing-layout').length)).toBe(0);
    expect((await inView(page)).inside).toBeGreaterThanOrEqual(12);
    expect(await viewportZoom(page)).toBeCloseTo(0.8, 2);
    // Fit-view at once, maybe before the overview picture is painted: the overview (or the note that it
    // is being painted) stands in; the ~800 nodes are not mounted in one go (those drawn before stay, hidden).
    const beforeFit = await inView(page);
    await page.locator('.react-flow__controls-fitview').click();
    await page.locator('[data-overview], [data-overview-pending]').first().waitFor();
    const fitAtOnce = await inView(page);
    expect(fitAtOnce.shown).toBe(0);
    expect(fitAtOnce.drawn).toBeLessThanOrEqual(beforeFit.drawn);
    await screenshot(page, 'drawing-big-fit-at-once');
    await page.locator('[data-overview]').waitFor({ timeout: 15_000 });

    // Stored without positions (as a harness too big to lay out on import is), the browser lays it out.
    const cleared = await page.request.put(`/api/revisions/${revisionId}/document`, { data: `{"version":1,"positions":{},"document":${big}}`, headers: { 'content-type': 'application/json' } });
    expect(cleared.status()).toBe(200);
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
    expect(await viewportZoom(page)).toBeCloseTo(0.8, 2);

    // Fit-view: so far out, one overview picture of the whole drawing stands in for its nodes. It is
    // loaded, fills much of the pane and has ink on it (not a blank view).
    // One part selected at working zoom stays marked on the overview.
    const picked = await page.locator('.react-flow__node').first().getAttribute('data-id');
    await page.locator('.react-flow__node').first().click();
    await page.locator('.react-flow__controls-fitview').click();
    await page.locator('[data-overview]').waitFor();
    expect(await page.locator('.ww-overview-marks [data-mark="selected"]').count()).toBe(1);
    expect(picked).toBeTruthy();
    // The picture of the drawing as laid out, not of an earlier one still standing in while it is painted.
    await page.locator('[data-overview]:not([data-stale])').waitFor({ timeout: 15_000 });
    const fit = await overviewInk(page);
    await screenshot(page, 'drawing-big-fit');
    const underFit = await inView(page);
    expect(underFit.shown).toBe(0);
    expect(underFit.drawn).toBeLessThan(total / 4);
    expect(fit.natural).toBeGreaterThan(0);
    expect(Math.max(fit.widthShare, fit.heightShare)).toBeGreaterThan(0.5);
    expect(fit.inked).toBeGreaterThan(0.01);

    // A click on the picture, on the part marked there, zooms in on it: working zoom, the drawing's own
    // parts and wires back (the marked one among them), the picture gone.
    const mark = (await page.locator('.ww-overview-marks [data-mark="selected"]').boundingBox())!;
    await page.mouse.click(mark.x + mark.width / 2, mark.y + mark.height / 2);
    await page.waitForTimeout(500);
    const zoomedIn = await inView(page);
    await screenshot(page, 'drawing-big-overview-clicked');
    expect(await viewportZoom(page)).toBeCloseTo(0.8, 2);
    expect(zoomedIn.drawn).toBeGreaterThanOrEqual(1);
    expect(await page.locator(`.react-flow__node[data-id="${picked}"]`).count()).toBe(1);
    expect(zoomedIn.wires).toBeGreaterThanOrEqual(2);
    expect(await page.locator('[data-overview]').isVisible()).toBe(false);

    // Wheeling out again past the threshold brings the overview back.
    await page.mouse.move(fit.at[0], fit.at[1]);
    for (let i = 0; i < 40 && (await viewportZoom(page)) > 0.1; i++) {
      await page.mouse.wheel(0, 200);
      await page.waitForTimeout(30);
    }
    await page.locator('[data-overview]').waitFor();
    const wheeledOut = await inView(page);
    expect(wheeledOut.shown).toBe(0);
    expect(wheeledOut.drawn).toBeLessThan(total / 4);

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

/**
 * The draft's crash copies in the real browser: two tabs of one browser on one
 * draft keep a copy each while the server does not get their changes; the tab
 * that crashes finds its own copy on reload (and not the other tab's, which is
 * still editing); once that other tab closes, its copy is offered too.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, CDPSession, Page } from 'playwright-core';
import { artifactsDir, demoEmail, launchBrowser, newContext, screenshot, signIn } from '../support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const copyKeys = (page: Page) => page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('wirewalk.drawing.unsaved.')).sort());
const add = (page: Page, label: string) => page.getByRole('navigation', { name: 'Add a component' }).getByRole('button', { name: label, exact: true }).click();
// The server does not get this page's saves: its changes wait, with the crash copy in storage.
const cutOff = (page: Page) => page.route('**/api/revisions/*/document', (route) => (route.request().method() === 'PUT' ? route.abort() : route.fallback()));
/** The same over CDP, for a page that will crash: playwright's routes would hold up its reload. */
async function cutOffOverCdp(cdp: CDPSession) {
  cdp.on('Fetch.requestPaused', (e) => {
    const answer = e.request.method === 'PUT' ? cdp.send('Fetch.failRequest', { requestId: e.requestId, errorReason: 'ConnectionRefused' }) : cdp.send('Fetch.continueRequest', { requestId: e.requestId });
    answer.catch(() => undefined);
  });
  await cdp.send('Fetch.enable', { patterns: [{ urlPattern: '*/api/revisions/*/document', requestStage: 'Request' }] });
}
// A page that crashed stays crashed for playwright; its tab, reloaded, is driven over CDP.
const run = async <T>(cdp: CDPSession, expression: string): Promise<T> =>
  ((await cdp.send('Runtime.evaluate', { expression, awaitPromise: true, returnByValue: true })).result.value as T);
const poll = <T>(cdp: CDPSession, expression: string) => expect.poll(() => run<T>(cdp, expression).catch(() => null), { timeout: 20_000 });

describe('crash copies, one per tab', () => {
  it('keeps each tab its own copy; a crashed tab gets its own back, a closed one is offered to the next', async () => {
    const ctx = await newContext(browser, 'desktop');
    const a = await ctx.newPage();
    await signIn(a, demoEmail.lead);
    await a.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await a.goto('/harnesses');
    await a.getByLabel('Name').fill('Browser test crash copies');
    await a.getByRole('button', { name: 'New blank drawing' }).click();
    await a.waitForURL(/\/harnesses\/[a-z2-7]+\/drawing/);
    const url = new URL(a.url()).pathname;
    await add(a, 'Battery');
    await a.locator('[data-save="saved"]').waitFor({ timeout: 20_000 });

    const b = await ctx.newPage();
    await b.goto(url);
    await b.locator('[data-component="BATT"]').waitFor();
    const cdp = await ctx.newCDPSession(a);
    await cutOffOverCdp(cdp);
    await cutOff(b);
    await add(a, 'Resistor');
    await add(b, 'Splice');
    await expect.poll(() => copyKeys(a), { timeout: 20_000 }).toHaveLength(2);
    const [keysA, tabA, tabB] = [await copyKeys(a), await a.evaluate(() => sessionStorage.getItem('wirewalk.tab')), await b.evaluate(() => sessionStorage.getItem('wirewalk.tab'))];
    expect(tabA).not.toBe(tabB);
    expect(keysA.map((k) => k.split('.').at(-1)).sort()).toEqual([tabA, tabB].sort());

    // Tab A's page crashes (no pagehide, no beforeunload); reloaded, it finds its own copy, not B's (B is still at work).
    const crashed = new Promise((resolve) => a.once('crash', resolve));
    // The crash never answers the command: wait for the page's crash event instead.
    void cdp.send('Page.crash').catch(() => undefined);
    await crashed;
    await cdp.send('Fetch.disable');
    await cdp.send('Page.reload');
    const items = `JSON.stringify([...document.querySelectorAll('[role=dialog] li')].map((li) => li.textContent))`;
    await poll<string>(cdp, `document.querySelector('[role=dialog] h2')?.textContent ?? null`).toBe('Unsaved work from this browser');
    await poll<string>(cdp, items).toMatch(/^\["Left in this tab, [^"]*1 component more[^"]*"\]$/);
    mkdirSync(artifactsDir, { recursive: true });
    writeFileSync(join(artifactsDir, 'drawing-crash-copy-own.png'), Buffer.from((await cdp.send('Page.captureScreenshot')).data, 'base64'));
    await run(cdp, `[...document.querySelectorAll('[role=dialog] button')].find((el) => el.textContent === 'Restore this copy').click()`);
    await poll<boolean>(cdp, `!!document.querySelector('[data-component="R1"]') && !!document.querySelector('[data-save="saved"]')`).toBe(true);
    // The server has A's work: only B's copy is left.
    await expect.poll(() => copyKeys(b), { timeout: 20_000 }).toEqual([keysA.find((k) => k.endsWith(`.${tabB}`))]);

    // B closes with its change still unsent; the next tab on the draft is offered B's copy.
    b.on('dialog', (d) => void d.accept());
    await b.close({ runBeforeUnload: true });
    await expect.poll(() => b.isClosed()).toBe(true);
    const c = await ctx.newPage();
    await c.goto(url);
    const offer = c.getByRole('dialog', { name: 'Unsaved work from this browser' });
    await offer.waitFor({ timeout: 20_000 });
    await expect.poll(() => offer.getByRole('listitem').count()).toBe(1);
    await expect.poll(() => offer.getByRole('listitem').first().textContent()).toMatch(/^Left by another tab or window, /);
    await screenshot(c, 'drawing-crash-copy-other');
    await offer.getByRole('button', { name: 'Discard it' }).click();
    await expect.poll(() => offer.count()).toBe(0);
    await expect.poll(() => copyKeys(c)).toEqual([]);
    await expect.poll(() => c.locator('[data-component="R1"]').count()).toBe(1);
    await expect.poll(() => c.locator('[data-component="S1"]').count()).toBe(0);
    await ctx.close();
  });
});

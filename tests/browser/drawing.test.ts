/**
 * The harness drawing in the real app, as the demo lead and tech: draw a small
 * circuit from nothing, set wire colours and sizes, save, reload, walk it,
 * see expected volts; two sessions on one draft get the conflict choice;
 * a tech sees the published drawing read only; a demo harness opens laid out
 * (the seed stores its layout), with no layout and no save on open.
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

const handle = (page: Page, comp: string, pin: string) => page.locator(`.react-flow__handle[data-nodeid="${comp}"][data-handleid="${pin}"]`);

async function wire(page: Page, a: [string, string], b: [string, string]) {
  const from = await handle(page, ...a).boundingBox();
  const to = await handle(page, ...b).boundingBox();
  if (!from || !to) throw new Error(`handle not found: ${a.join('.')} or ${b.join('.')}`);
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move((from.x + to.x) / 2, (from.y + to.y) / 2, { steps: 5 });
  await page.mouse.move(to.x + to.width / 2, to.y + to.height / 2, { steps: 5 });
  await page.mouse.up();
}

async function waitSaved(page: Page) {
  await page.locator('[data-save="saved"]').waitFor({ timeout: 20_000 });
}

async function setWire(page: Page, id: string, colour: string, stripe: string, size: string) {
  const clear = page.getByRole('button', { name: /clear the selection/i });
  if (await clear.isVisible()) await clear.click();
  await page.getByRole('list', { name: 'Wires' }).getByRole('button', { name: new RegExp(`^${id}:`) }).click();
  const form = page.getByRole('form', { name: `Wire ${id}` });
  await form.getByLabel('Colour').selectOption(colour);
  await form.getByLabel('Stripe').selectOption(stripe);
  await form.getByLabel('Size', { exact: true }).fill(size);
  await form.getByRole('button', { name: 'Apply' }).click();
}

async function newHarness(page: Page, name: string): Promise<string> {
  await page.goto('/harnesses');
  await page.getByLabel('Name').fill(name);
  await page.getByRole('button', { name: 'New blank drawing' }).click();
  await page.waitForURL(/\/harnesses\/[a-z2-7]+\/drawing/);
  await page.getByRole('toolbar', { name: 'Drawing tools' }).waitFor();
  return page.url().match(/harnesses\/([a-z2-7]+)\//)![1];
}

async function add(page: Page, label: string) {
  await page.getByRole('navigation', { name: 'Add a component' }).getByRole('button', { name: label, exact: true }).click();
}

describe('harness drawing', () => {
  let harnessId = '';

  it('draws a small circuit from nothing, saves, and finds it intact after a reload', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.lead);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    harnessId = await newHarness(page, 'Browser test work light circuit');
    await screenshot(page, 'drawing-empty');

    for (const k of ['Battery', 'Fuse', 'Connector pair', 'Load', 'Ground']) await add(page, k);
    await page.locator('[data-component="G1"]').waitFor();
    // Fit everything in view before wiring.
    await page.locator('.react-flow__controls-fitview').click();
    await page.waitForTimeout(300);

    await wire(page, ['BATT', '+'], ['F1', '1']);
    await wire(page, ['F1', '2'], ['X1A', '1']);
    await wire(page, ['X1B', '1'], ['L1', '1']);
    await wire(page, ['L1', '2'], ['G1', 'G']);
    await wire(page, ['BATT', '-'], ['G1', 'G']);
    await expect.poll(() => page.locator('.ww-wire').count()).toBe(5);

    await setWire(page, 'W1', 'RD', '', '2.5');
    await setWire(page, 'W2', 'RD', 'WH', '1.5');
    await setWire(page, 'W3', 'RD', 'WH', '1.5');
    await setWire(page, 'W4', 'BK', '', '1.5');
    await setWire(page, 'W5', 'BK', '', '6');

    // A state to compute volts in.
    await page.getByRole('tab', { name: /States/ }).click();
    await page.getByRole('button', { name: 'Add a state' }).click();
    await page.getByRole('form', { name: /State key_off/ }).getByRole('button', { name: 'Add state' }).click();
    await waitSaved(page);
    await screenshot(page, 'drawing-drawn');

    await page.reload();
    await page.locator('[data-component="L1"]').waitFor();
    for (const id of ['BATT', 'F1', 'X1A', 'X1B', 'L1', 'G1']) await expect.poll(() => page.locator(`[data-component="${id}"]`).count()).toBe(1);
    await expect.poll(() => page.locator('.ww-wire').count()).toBe(5);
    await expect.poll(() => page.locator('[data-wire="W2"] .ww-wire-label').textContent()).toMatch(/W2 · RD\/WH · 1\.5 mm²/);
    await expect.poll(() => page.locator('[data-wire="W5"] .ww-wire-label').textContent()).toMatch(/BK · 6 mm²/);

    // Live engine: expected volts on every pin, and a walk from the battery to the load.
    await page.getByLabel('State for expected volts').selectOption('key_off');
    await expect.poll(() => page.locator('[data-pin="L1.1"]').textContent(), { timeout: 20_000 }).toMatch(/^1[12]\.\d\d V$/);
    await page.getByRole('tab', { name: 'Walk' }).click();
    await page.getByLabel('From pin').fill('BATT.+');
    await page.getByLabel('To pin').fill('L1.1');
    await page.getByRole('button', { name: 'Walk', exact: true }).click();
    const steps = page.getByRole('list', { name: 'Walk steps' });
    await expect.poll(() => steps.textContent()).toMatch('Fuse F1');
    await expect.poll(() => steps.textContent()).toMatch('Mated cavity');
    await expect.poll(() => steps.textContent()).toMatch(/1[12]\.\d\d V/);
    await expect.poll(() => page.locator('.ww-wire.ww-on-walk').count()).toBe(3);
    await screenshot(page, 'drawing-walk');
    await ctx.close();
  });

  it('gives the second of two sessions on one draft the conflict choice, and loses neither edit', async () => {
    const a = await newContext(browser, 'desktop');
    const b = await newContext(browser, 'desktop');
    const pa = await a.newPage();
    const pb = await b.newPage();
    await signIn(pa, demoEmail.lead);
    await signIn(pb, demoEmail.lead);
    await pa.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await pb.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await pa.goto(`/harnesses/${harnessId}/drawing`);
    await pb.goto(`/harnesses/${harnessId}/drawing`);
    await pa.locator('[data-component="L1"]').waitFor();
    await pb.locator('[data-component="L1"]').waitFor();

    await add(pa, 'Resistor');
    await waitSaved(pa);
    await add(pb, 'Splice');
    await pb.getByRole('dialog', { name: /changed by someone else/ }).waitFor({ timeout: 20_000 });
    await screenshot(pb, 'drawing-conflict');
    await pb.getByRole('button', { name: 'Keep mine as a copy' }).click();
    await pb.waitForURL((u) => !u.pathname.includes(harnessId) && /\/harnesses\/[a-z2-7]+\/drawing/.test(u.pathname), { timeout: 20_000 });
    await pb.locator('[data-component="S1"]').waitFor();
    await expect.poll(() => pb.locator('[data-component="R1"]').count()).toBe(0);

    // A's edit is on the original draft.
    await pa.reload();
    await pa.locator('[data-component="R1"]').waitFor();
    await expect.poll(() => pa.locator('[data-component="S1"]').count()).toBe(0);
    await a.close();
    await b.close();
  });

  it('publishes with the caution, and a tech sees the drawing read only', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.lead);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto(`/harnesses/${harnessId}/drawing`);
    await page.locator('[data-component="L1"]').waitFor();
    // The resistor from the conflict test has no wires; remove it so the drawing is tidy.
    await page.getByRole('button', { name: 'Publish…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Publish this drawing' });
    await expect.poll(() => dialog.getByRole('note').textContent()).toMatch(/expectations/i);
    await dialog.getByLabel(/What changed/).fill('First drawing of the work light circuit');
    await screenshot(page, 'drawing-publish');
    await dialog.getByRole('button', { name: 'Publish' }).click();
    await page.getByText(/published, read only/).waitFor({ timeout: 20_000 });
    await ctx.close();

    const tech = await newContext(browser, 'desktop');
    const tp = await tech.newPage();
    await signIn(tp, demoEmail.tech);
    await tp.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await tp.goto(`/harnesses/${harnessId}/drawing`);
    await tp.getByText(/published, read only/).waitFor();
    await tp.locator('[data-component="L1"]').waitFor();
    await expect.poll(() => tp.getByRole('navigation', { name: 'Add a component' }).count()).toBe(0);
    await expect.poll(() => tp.getByRole('button', { name: /Publish/ }).count()).toBe(0);
    await expect.poll(() => tp.getByRole('list', { name: 'Revisions' }).textContent()).toMatch('First drawing of the work light circuit');
    await screenshot(tp, 'drawing-tech-readonly');
    await tech.close();
  });

  it('opens a demo harness as the seed laid it out: a new draft of it runs no layout and saves nothing on open', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    const writes: string[] = [];
    page.on('request', (r) => {
      if (r.method() !== 'GET' && r.url().includes('/api/revisions/')) writes.push(`${r.method()} ${new URL(r.url()).pathname}`);
    });
    await signIn(page, demoEmail.lead);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto('/harnesses');
    await page.getByRole('link', { name: /With FW-G72 grapple fitted/ }).first().click();
    await page.getByText(/published, read only/).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Start a new draft' }).click();
    await page.getByRole('toolbar', { name: 'Drawing tools' }).waitFor({ timeout: 20_000 });
    await page.locator('[data-save="saved"]').waitFor({ timeout: 20_000 });
    // Long enough for the open-time layout and its autosave to have shown, had they run.
    const seen = new Set<string>();
    for (let i = 0; i < 30; i++) {
      seen.add((await page.locator('[data-save]').getAttribute('data-save')) ?? '');
      if (await page.getByText(/Laying out the drawing/).count()) seen.add('laying out');
      await page.waitForTimeout(100);
    }
    expect([...seen]).toEqual(['saved']);
    expect(await page.evaluate(() => performance.getEntriesByName('ww-drawing-layout').length)).toBe(0);
    expect(writes).toEqual([]);
    await page.locator('.react-flow__node').first().waitFor();
    await screenshot(page, 'drawing-demo-draft-opened');
    await ctx.close();
  });
});

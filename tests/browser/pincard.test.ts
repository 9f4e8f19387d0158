/**
 * Pin cards, walks, readings and suspects in the real app, on a phone (360 × 740) as the demo
 * tech: search a circuit, open its pin card, walk the attachment feed, enter readings that match
 * the lift-arm clip CL7 short (values from the faults what-if route as a lead would set it up,
 * and the walk-through's split readings), see CL7 first with the connector to unplug, save.
 * The print layout is printed to PDF by chromium and turned into a PNG to look at.
 */
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { walkThroughFault } from '../../seeds/harnesses/walk-through';
import { artifactsDir, baseUrl, demoEmail, demoPassword, launchBrowser, newContext, screenshot, signIn } from '../support/browser';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The lead's what-if: readings with the CL7 short applied, straight from the API. */
async function whatIf(revisionId: string, state: string) {
  const signInRes = await fetch(`${baseUrl()}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: demoEmail.lead, password: demoPassword }),
  });
  const cookie = signInRes.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const res = await fetch(`${baseUrl()}/api/revisions/${revisionId}/faults`, {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ fault: { kind: 'short', ref: 'CL7' }, state }),
  });
  expect(res.status).toBe(200);
  return (await res.json()) as { blowsOnInsert: string[]; pins: Array<{ ref: string; volts: number | null }> };
}

async function addOhms(page: Page, a: string, b: string, state: string, ohms: number) {
  const form = page.getByRole('form', { name: 'Enter a reading' }).last();
  await form.getByText('Ohms (power off)').click();
  await form.getByLabel('From pin (red probe)').fill(a);
  await form.getByLabel('To pin (black probe)').fill(b);
  await form.getByLabel('Machine state').selectOption(state);
  await form.getByLabel('Meter showed (Ω, or OL)').fill(String(ohms));
  await form.getByRole('button', { name: 'Add reading' }).click();
}

describe('pin cards and walks on a phone', () => {
  let cardUrl = '';
  let revisionId = '';

  it('finds circuit 120 by search and opens the pin card of its lift-arm connector', async () => {
    const ctx = await newContext(browser, 'phone');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.tech);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto('/pin-cards');
    await page.getByRole('searchbox').fill('120');
    const results = page.getByRole('list', { name: /Search results for 120/ });
    await results.waitFor();
    await screenshot(page, 'pincard-search');
    await results.getByRole('link', { name: /X30B\.1.*Main harness/ }).first().click();
    await page.getByRole('heading', { level: 1, name: /Pin card X30B \/ X30A/ }).waitFor();
    cardUrl = page.url();
    revisionId = new URL(cardUrl).pathname.split('/')[3];
    const cavity1 = page.getByRole('listitem', { name: /^Cavity 1/ });
    await expect(cavity1.getByText('RD/WH').first().isVisible()).resolves.toBe(true);
    await expect(cavity1.locator('span.text-sm', { hasText: /red with white stripe/i }).first().isVisible()).resolves.toBe(true);
    await expect(cavity1.getByText(/Cavity 1 of X30B \(red probe\) to chassis ground/).first().isVisible()).resolves.toBe(true);
    // Bus checks for the CAN cavities, with the harness's own resistance.
    await page.getByRole('heading', { name: 'Bus checks' }).waitFor();
    await page.getByText(/This harness: \d+(\.\d+)? Ω/).first().waitFor();
    // Cautions on the page.
    await expect(page.getByRole('note', { name: /Disconnect the battery/ }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('note', { name: /Never fit a larger fuse/ }).isVisible()).resolves.toBe(true);
    // Nothing wider than the phone.
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(artifactsDir, 'pincard-card-phone.png') });
    await ctx.close();
  });

  it('takes readings along a walk that match the CL7 short and puts CL7 first, with X20 or X30 to unplug', async () => {
    const keyOff = await whatIf(revisionId, 'key_off');
    expect(keyOff.blowsOnInsert).toContain('F2');
    const keyOn = await whatIf(revisionId, 'key_on');
    const x30b1 = keyOn.pins.find((p) => p.ref === 'X30B.1')!;

    const ctx = await newContext(browser, 'phone');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.tech);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto(`/walk?revision=${revisionId}`);
    await page.getByLabel('From', { exact: true }).fill('F2.1');
    await page.getByLabel('To', { exact: true }).fill('X40.1');
    await page.getByLabel('Expected readings for').selectOption('key_on');
    await page.getByRole('button', { name: 'Walk', exact: true }).click();
    const steps = page.getByRole('list', { name: 'Walk steps' });
    await steps.waitFor();
    await expect(steps.locator('[data-step="fuse"]').first().textContent()).resolves.toMatch(/Fuse F2: 15 A, blue/);
    await page.screenshot({ path: join(artifactsDir, 'pincard-walk.png') });

    // The fuse, as the what-if says it goes: the suspects ask for X20 apart first.
    await steps.getByRole('button', { name: 'Fuse F2 blows on insert' }).click();
    const taken = page.getByRole('list', { name: 'Readings taken' });
    await taken.getByText(/OUT: fuse blows on insert/).waitFor();
    const unplug = page.getByTestId('next-unplug');
    await page.waitForFunction(() => /X20/.test(document.querySelector('[data-testid="next-unplug"]')?.textContent ?? ''), undefined, { timeout: 20_000 });
    // Volts at X30B.1 key on, as the what-if computes it with the fault in (F2 gone: nothing there).
    await steps.getByRole('button', { name: 'Take a reading at X30B.1' }).click();
    const entry = steps.getByRole('form', { name: 'Enter a reading' });
    await entry.getByLabel('Meter showed (V)').fill((x30b1.volts ?? 0).toFixed(2));
    await entry.getByRole('button', { name: 'Add reading' }).click();
    await taken.getByText(/OUT: 0\.0 V, expected/).waitFor();
    await page.locator('section[aria-labelledby="readings-h"]').screenshot({ path: join(artifactsDir, 'pincard-suspects-first.png') });

    // The splits the suspects ask for: X20 apart (then X30 is next), X30 apart (the walk-through's readings).
    const [x20, ...x30] = walkThroughFault.observations.filter((o): o is { a: string; b: string; state: string; ohms: number } => 'a' in o && o.ohms !== null);
    await addOhms(page, x20.a, x20.b, x20.state, x20.ohms);
    await taken.getByText(/OUT: 0\.09 Ω/).waitFor();
    await page.waitForFunction(() => /X30/.test(document.querySelector('[data-testid="next-unplug"]')?.textContent ?? ''), undefined, { timeout: 20_000 });
    await expect(unplug.textContent()).resolves.toMatch(/X30/);
    for (const o of x30) await addOhms(page, o.a, o.b, o.state, o.ohms);
    await expect(taken.getByRole('listitem').count()).resolves.toBe(5);
    await page.waitForFunction(() => document.querySelector('[aria-label="Suspects"] li')?.getAttribute('data-suspect') === 'CL7', undefined, { timeout: 20_000 });
    const first = page.getByRole('list', { name: 'Suspects' }).getByRole('listitem').first();
    await expect(first.textContent()).resolves.toMatch(/clamp CL7/);
    await page.getByRole('button', { name: /Save readings/ }).click();
    await page.getByText(/Saved 5 readings/).waitFor();
    await page.locator('section[aria-labelledby="readings-h"]').screenshot({ path: join(artifactsDir, 'pincard-suspects-cl7.png') });
    await screenshot(page, 'pincard-walk-full');
    await ctx.close();
  });

  it('prints one connector on one page, black on white, colour codes spelled out', async () => {
    const ctx = await newContext(browser, 'desktop');
    const page = await ctx.newPage();
    await signIn(page, demoEmail.tech);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto(cardUrl);
    await page.getByRole('heading', { level: 1, name: /Pin card X30B/ }).waitFor();
    await page.getByText(/This harness: \d/).first().waitFor();
    const pdf = join(artifactsDir, 'pincard-print.pdf');
    await page.emulateMedia({ media: 'print' });
    await page.pdf({ path: pdf, preferCSSPageSize: true, printBackground: false });
    const info = execFileSync('pdfinfo', [pdf], { encoding: 'utf8' });
    expect(info).toMatch(/Pages:\s+1\b/);
    const text = execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' });
    expect(text).toMatch(/RD\/WH \(red with\s+white stripe\)/i);
    expect(text).toMatch(/X30B\.1/);
    execFileSync('pdftoppm', ['-png', '-r', '60', '-singlefile', pdf, join(artifactsDir, 'pincard-print')]);
    await ctx.close();
  });
});

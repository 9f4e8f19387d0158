import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import sharp from 'sharp';
import { demoEmail, launchBrowser, newContext, screenshot, signIn } from '../support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function signedIn(role: keyof typeof demoEmail, size: 'phone' | 'desktop' = 'desktop'): Promise<Page> {
  const context = await newContext(browser, size);
  const page = await context.newPage();
  await signIn(page, demoEmail[role]);
  await page.locator('nav[aria-label="Main"]:visible').getByRole('link', { name: 'Account' }).waitFor({ timeout: 20_000 });
  return page;
}

describe('a job from complaint to the customer’s e-mail', () => {
  it('writer opens the order, tech adds drawing, photo and findings, writer sends the report, owner sees it in the Outbox, the customer link opens it', async () => {
    // The writer finds the demo order for the mulcher that is not found.
    const writer = await signedIn('writer');
    await writer.goto('/repair-orders');
    await writer.getByRole('cell', { name: /Mulcher will not start/ }).waitFor({ timeout: 20_000 });
    await screenshot(writer, 'repair-orders-list-writer');
    const row = writer.getByRole('row', { name: /Mulcher will not start/ });
    const number = (await row.getByRole('link').first().textContent())!.trim();
    await row.getByRole('link').first().click();
    await writer.getByRole('heading', { name: `Repair order ${number}` }).waitFor();
    const orderUrl = writer.url();
    const orderId = new URL(orderUrl).pathname.split('/').pop()!;

    // The lead sees the stalled order stand out.
    const lead = await signedIn('lead');
    await lead.goto('/repair-orders');
    await lead.getByText(/Stalled · \d+\.\d h diagnosis/).first().waitFor({ timeout: 20_000 });
    await screenshot(lead, 'repair-orders-list-lead-stalled');
    await lead.context().close();

    // The tech, on a phone-sized screen: My orders → the order.
    const tech = await signedIn('tech');
    await tech.goto('/repair-orders?techId=me');
    await tech.getByRole('link', { name: number, exact: true }).click();
    await tech.getByRole('heading', { name: `Repair order ${number}` }).waitFor();

    // A marked-up drawing: walk F2.2 → X40.1 on the loader with the mulcher, mark the chafe.
    await tech.getByRole('button', { name: 'Attach a drawing' }).click();
    const form = tech.getByRole('group', { name: 'Attach a marked-up drawing' });
    await form.getByLabel('Harness').selectOption({ label: 'With FW-M60 mulcher fitted' });
    await expect.poll(() => form.getByLabel('Revision').locator('option').count(), { timeout: 15_000 }).toBeGreaterThan(1);
    await form.getByLabel('Revision').selectOption({ index: 1 });
    await form.getByLabel('From pin').fill('F2.2');
    await form.getByLabel('To pin').fill('X40.1');
    await form.getByRole('button', { name: 'Walk' }).click();
    await expect.poll(() => form.getByText(/Wires on the path \((\d+) highlighted\)/).textContent(), { timeout: 20_000 }).not.toMatch(/\(0 highlighted\)/);
    await form.getByLabel('Marker kind').selectOption('fault');
    await form.getByLabel('Marker on').selectOption('W27');
    await form.getByLabel('Short note').fill('Insulation rubbed through at clip CL7');
    await form.getByRole('button', { name: 'Add marker' }).click();
    await form.getByLabel('Title', { exact: true }).fill('Attachment feed F2 to the plug, chafe at CL7');
    await screenshot(tech, 'repair-order-tech-drawing-form');
    await form.getByRole('button', { name: 'Attach the drawing to this order' }).click();
    await tech.getByRole('img', { name: /Drawing: Attachment feed F2 to the plug/ }).waitFor({ timeout: 20_000 });

    // A photo.
    const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 120, g: 96, b: 60 } } }).jpeg().toBuffer();
    await tech.getByLabel('Choose photos or files').setInputFiles({ name: 'clip-cl7.jpg', mimeType: 'image/jpeg', buffer: photo });
    await tech.getByRole('button', { name: /Upload 1 file/ }).click();
    await tech.getByText('clip-cl7.jpg').waitFor({ timeout: 20_000 });

    // Readings on this order through the readings API (what the pin card saves), then shown on the order.
    const list = await tech.request.get('/api/harnesses');
    const harness = (await list.json()).harnesses.find((h: { name: string }) => h.name === 'With FW-M60 mulcher fitted');
    const revs = (await (await tech.request.get(`/api/harnesses/${harness.id}`)).json()).revisions as { id: string; status: string }[];
    const revisionId = revs.find((r) => r.status === 'published')!.id;
    const taken = await tech.request.post('/api/reading-sets', {
      data: { revisionId, repairOrderId: orderId, observations: [{ kind: 'volts', pin: 'X40.1', state: 'key_on', volts: 0 }, { kind: 'fuse', fuse: 'F2', blowsOnInsert: true }] },
      headers: { Origin: new URL(orderUrl).origin },
    });
    expect(taken.status()).toBe(201);
    await tech.reload();
    await tech.getByText('✗ OUT').first().waitFor({ timeout: 20_000 });
    await tech.getByText('Suspects at the time (most likely first):').waitFor();

    // Findings and status.
    await tech.getByLabel('Cause').fill('Attachment feed wire W27 rubbed through at clip CL7 on the lift arm and shorted to the frame.');
    await tech.getByLabel('Correction').fill('Repaired W27 with a sealed splice, sleeved the run and refitted clip CL7; fitted a 15 A fuse at F2.');
    await tech.getByLabel('Status').selectOption('ready');
    await tech.getByRole('button', { name: 'Save the order' }).click();
    await tech.getByText(`Order ${number} saved.`).waitFor({ timeout: 15_000 });
    await screenshot(tech, 'repair-order-tech-after-findings');
    await tech.context().close();

    // The writer sends the report.
    await writer.reload();
    await writer.getByText('Attachment feed wire W27 rubbed through').waitFor({ timeout: 15_000 });
    const pdf = await writer.request.get(`/api/repair-orders/${orderId}/report.pdf`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    await writer.getByLabel('Message').fill('Your loader and mulcher are ready for pick-up.');
    await writer.getByRole('button', { name: 'E-mail the report' }).click();
    const linkNote = writer.getByRole('status').filter({ hasText: 'Customer link:' });
    await linkNote.waitFor({ timeout: 30_000 });
    const customerLink = (await linkNote.getByRole('link').getAttribute('href'))!;
    await writer.getByText(/→ marek@oxbow-clearing\.example\.net/).waitFor();
    await screenshot(writer, 'repair-order-writer-sent');

    // The owner reads it in the Outbox, with the PDF attached.
    const owner = await signedIn('owner');
    await owner.goto('/outbox');
    await owner.getByText(`repair order ${number} report`, { exact: false }).first().click({ timeout: 20_000 });
    await owner.getByText(`repair-order-${number}-report.pdf`).first().waitFor({ timeout: 15_000 });
    await screenshot(owner, 'repair-order-outbox-owner');
    await owner.context().close();

    // The customer opens the link without an account.
    const customer = await (await newContext(browser, 'phone')).newPage();
    await customer.goto(customerLink);
    await customer.getByRole('heading', { name: `Repair order ${number}` }).waitFor({ timeout: 20_000 });
    await customer.getByText('Attachment feed wire W27 rubbed through').waitFor();
    await customer.getByRole('img', { name: /Attachment feed F2 to the plug/ }).waitFor();
    expect(await customer.getByText('Ask before replacing').count()).toBe(0);
    await screenshot(customer, 'repair-order-customer-link-phone');
    // A tampered link shows nothing of the order.
    await customer.goto(customerLink.replace(/.$/, (c) => (c === 'A' ? 'B' : 'A')));
    await customer.getByRole('heading', { name: 'This report link does not open' }).waitFor({ timeout: 15_000 });
    await customer.context().close();
    await writer.context().close();
  }, 240_000);
});

import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';

/** Debian's chromium, never a downloaded browser; playwright gives it a fresh profile folder. */
export const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const artifactsDir = join(process.cwd(), 'tests', 'artifacts');

export const demoPassword = 'wirewalk-demo';
export const demoEmail = { owner: 'owner@example.com', lead: 'lead@example.com', tech: 'tech@example.com', writer: 'writer@example.com' } as const;
export type DemoRole = keyof typeof demoEmail;

export const baseUrl = () => inject('baseUrl');

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

/** A fresh browser context (its own cookies), phone-sized or desktop. */
export async function newContext(browser: Browser, size: 'phone' | 'desktop' = 'desktop'): Promise<BrowserContext> {
  const viewport = size === 'phone' ? { width: 360, height: 740 } : { width: 1366, height: 900 };
  return browser.newContext({ baseURL: baseUrl(), viewport, deviceScaleFactor: 1 });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(artifactsDir, { recursive: true });
  const path = join(artifactsDir, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}

/** Signs in through the real form, the way a person does. */
export async function signIn(page: Page, email: string, password = demoPassword): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
}

import { mkdirSync, mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { type BrowserContext, chromium, type Page } from 'playwright-core';

export const SCREENSHOT_DIR = path.resolve('.test-output/screenshots');

/** Debian's Chromium driven by playwright-core, headless, with its own empty profile. */
export async function openBrowser(): Promise<BrowserContext> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'coppice-chromium-'));
  return chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Signs in through the identity provider's own form, as a person would. */
export async function signInWithForm(
  page: Page,
  appUrl: string,
  email: string,
  password = 'quillfern-demo',
  at = '/',
) {
  await page.goto(`${appUrl}${at}`);
  await page.waitForSelector('input[name="username"]');
  await page.fill('input[name="username"]', email);
  await page.fill('input[name="password"]', password);
  await Promise.all([
    page.waitForURL((url) => url.href.startsWith(appUrl)),
    page.click('button[type="submit"]'),
  ]);
}

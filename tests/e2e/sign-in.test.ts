import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openBrowser, screenshot, signInWithForm } from '../helpers/browser';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

let coppice: TestCoppice;
let browser: BrowserContext;
beforeAll(async () => {
  coppice = await startTestCoppice();
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await coppice?.stop();
});

describe('signing in with a browser', () => {
  it('sends a signed-out visitor to the sign-in form, then shows the analyst their name and navigation', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.analyst);
    await page.waitForSelector('nav');
    const body = await page.textContent('body');
    expect(body).toContain('Ada Analyst');
    expect(await page.locator('nav').textContent()).toContain('Home');
    await screenshot(page, 'sign-in-analyst-home');
    await page.close();
  });

  it('shows the sign-in form again with a clear message after a wrong password', async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/`);
    await page.waitForSelector('input[name="username"]');
    await page.fill('input[name="username"]', ACCOUNTS.analyst);
    await page.fill('input[name="password"]', 'wrong-password');
    await page.click('button[type="submit"]');
    await page.waitForSelector('[role="alert"]');
    expect(await page.textContent('[role="alert"]')).toContain('do not match');
    await page.close();
  });
});

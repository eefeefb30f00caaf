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

describe('the privacy officer in the browser', () => {
  it('raises k, blocks a field with a reason, and finds the change in the audit trail', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.privacy, undefined, '/privacy-policy');
    await page.getByRole('heading', { name: 'Version 1' }).waitFor();

    await page.getByLabel('Minimum group size (k)').fill('7');
    await page.getByLabel('Column name to block').fill('Date of Birth');
    await page.getByRole('button', { name: 'Add', exact: true }).click();
    await page.getByLabel('Reason for the change').fill('Agreed with the works council');
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved as version 2' }).waitFor();
    expect(await page.getByRole('heading', { name: 'Version 2' }).count()).toBe(1);
    expect(await page.getByRole('table').textContent()).toContain('Agreed with the works council');
    await screenshot(page, 'privacy-policy-version-2');

    const saved = await coppice.sql<{ k: number; blocked_fields: string[] }>(
      'SELECT k, blocked_fields FROM policy_versions ORDER BY version DESC LIMIT 1',
    );
    expect(saved[0]).toEqual({ k: 7, blocked_fields: ['Date of Birth'] });

    await page.getByRole('link', { name: 'Audit trail' }).click();
    await page.getByRole('table').getByText('Changed the privacy policy').first().waitFor();
    await page.getByLabel('What').fill('policy.');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    await page.getByRole('status').filter({ hasText: '1 line' }).waitFor();
    expect(await page.getByRole('table').textContent()).toContain('Agreed with the works council');
    await screenshot(page, 'audit-trail-policy-change');
    await page.close();
  });

  it('shows the policy read-only to an analyst and keeps the audit trail from them', async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.analyst, undefined, '/privacy-policy');
    await page.getByText('Only a privacy officer can change the policy.').waitFor();
    expect(await page.getByRole('button', { name: /Save as version/ }).count()).toBe(0);
    expect(await page.locator('nav').getByRole('link', { name: 'Audit trail' }).count()).toBe(0);
    await page.close();
  });
});

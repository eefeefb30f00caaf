import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { axeViolations, tabTo } from '../helpers/axe';
import { openBrowser, screenshot, signInWithForm } from '../helpers/browser';
import { validCsv } from '../helpers/hostile-files';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

let coppice: TestCoppice;
let browser: BrowserContext;
let datasetId: string;
beforeAll(async () => {
  coppice = await startTestCoppice();
  browser = await openBrowser();
  const analyst = await coppice.signIn(ACCOUNTS.analyst);
  const uploaded = await analyst.post('/api/datasets').attach('file', Buffer.from(validCsv()), 'staff.csv');
  datasetId = uploaded.body.id;
});
afterAll(async () => {
  await browser?.close();
  await coppice?.stop();
});

async function settle(page: Page) {
  await page.waitForLoadState('networkidle');
  await page.locator('h1').first().waitFor();
}

async function checkPage(page: Page, path: string, shot: string) {
  await page.goto(`${coppice.url}${path}`);
  await settle(page);
  await screenshot(page, `a11y-${shot}`);
  return axeViolations(page);
}

// Every main page that exists, per role: axe-core finds no serious or critical violation.
const PAGES: Record<string, { account: string; paths: Record<string, string> }> = {
  analyst: {
    account: ACCOUNTS.analyst,
    paths: {
      home: '/',
      datasets: '/datasets',
      dataset: '/datasets/:id',
      policy: '/privacy-policy',
      models: '/models',
      briefs: '/teams',
    },
  },
  'privacy officer': {
    account: ACCOUNTS.privacy,
    paths: {
      home: '/',
      datasets: '/datasets',
      policy: '/privacy-policy',
      audit: '/audit',
      review: '/review',
      'dataset review': '/review/datasets/:id',
    },
  },
  manager: { account: ACCOUNTS.managerNorth, paths: { home: '/', teams: '/teams' } },
};

describe('accessibility in Chromium (axe-core)', () => {
  it('has a checker that does find a critical problem (an image without text, a field without a label)', async () => {
    const page = await browser.newPage();
    await page.setContent('<html lang="en"><title>t</title><main><img src="x.png"><input></main></html>');
    const ids = (await axeViolations(page)).map((v) => v.id);
    expect(ids).toEqual(expect.arrayContaining(['image-alt', 'label']));
    await page.close();
  });

  it('finds no serious or critical violation on the sign-in page', async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/`);
    await page.waitForSelector('input[name="username"]');
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });

  for (const [role, { account, paths }] of Object.entries(PAGES)) {
    it(`finds no serious or critical violation on the ${role}'s pages`, async () => {
      await browser.clearCookies();
      const page = await browser.newPage();
      await signInWithForm(page, coppice.url, account);
      const found: Record<string, unknown> = {};
      for (const [name, path] of Object.entries(paths)) {
        const violations = await checkPage(
          page,
          path.replace(':id', datasetId),
          `${role.replace(' ', '-')}-${name}`,
        );
        if (violations.length) found[path] = violations;
      }
      expect(found).toEqual({});
      await page.close();
    });
  }
});

describe('forms by keyboard alone', () => {
  it('signs in with Tab and Enter only', async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/`);
    await page.waitForSelector('input[name="username"]');
    expect(await tabTo(page, 'input[name="username"]')).toBe(true);
    await page.keyboard.type(ACCOUNTS.privacy);
    await page.keyboard.press('Tab');
    await page.keyboard.type('quillfern-demo');
    await Promise.all([
      page.waitForURL((url) => url.href.startsWith(coppice.url)),
      page.keyboard.press('Enter'),
    ]);
    await settle(page);
    expect(await page.textContent('body')).toContain('Priya Privacy');
    await page.close();
  });

  it('changes the privacy policy with Tab, typing and Enter only', async () => {
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/privacy-policy`);
    await settle(page);
    await page.getByRole('heading', { name: 'Version 1' }).waitFor();
    await page.locator('body').focus();
    expect(await tabTo(page, 'input[name="k"]'), 'k is reachable by Tab').toBe(true);
    await page.keyboard.press('Control+A');
    await page.keyboard.type('8');
    expect(await tabTo(page, '[name="reason"]'), 'the reason is reachable by Tab').toBe(true);
    await page.keyboard.type('Keyboard-only change');
    expect(await tabTo(page, 'button[type="submit"]'), 'the save button is reachable by Tab').toBe(true);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Version 2' }).waitFor();
    const [row] = await coppice.sql<{ k: number }>(
      'SELECT k FROM policy_versions ORDER BY version DESC LIMIT 1',
    );
    expect(row.k).toBe(8);
    await page.close();
  });

  it('filters the audit trail with Tab, typing and Enter only', async () => {
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/audit`);
    await settle(page);
    await page.locator('body').focus();
    expect(await tabTo(page, 'input[name="action"]')).toBe(true);
    await page.keyboard.type('policy.');
    await page.keyboard.press('Enter');
    await page.getByRole('status').filter({ hasText: '1 line' }).waitFor();
    await page.close();
  });
});

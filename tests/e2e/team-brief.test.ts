import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { useDemoRuns, waitForPublication } from '../backend/briefs/demo-sources';
import { openBrowser, SCREENSHOT_DIR, screenshot, signInWithForm } from '../helpers/browser';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

let coppice: TestCoppice;
let browser: BrowserContext;
let privacy: Awaited<ReturnType<TestCoppice['signIn']>>;
let run: string;

beforeAll(async () => {
  coppice = await startTestCoppice();
  const analyst = await coppice.signIn(ACCOUNTS.analyst);
  privacy = await coppice.signIn(ACCOUNTS.privacy);
  const demo = await useDemoRuns(analyst, privacy, { rows: 400 });
  run = await demo.requestedRun();
  browser = await openBrowser();
}, 90_000);

afterAll(async () => {
  await browser?.close();
  await coppice?.stop();
});

describe('a privacy officer publishes the briefs in the browser', () => {
  it('finds the request in the review queue, follows it to the run page and publishes it there', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.privacy, undefined, '/review');
    await page.getByRole('heading', { name: 'Publication requests (1)' }).waitFor();
    expect(await page.getByRole('heading', { name: /^Datasets awaiting approval/ }).count()).toBe(1);
    const requests = page.getByRole('table', { name: 'Publication requests' });
    expect(await requests.textContent()).toContain(ACCOUNTS.analyst);
    await screenshot(page, 'review-queue-publication-request');
    await requests.getByRole('link', { name: /^Model run on / }).click();
    await page.waitForURL(`**/models/${run}`);

    await page.getByRole('button', { name: 'Publish team briefs' }).click();
    await page.getByText('Published to the managers').waitFor({ timeout: 30_000 });
    expect((await waitForPublication(privacy, run)).status).toBe('published');

    await page.getByRole('link', { name: 'Review queue' }).click();
    await page.getByText('No model run waits for publication.').waitFor();
    await page.close();
    await browser.clearCookies();
  }, 60_000);
});

describe('a manager reads a team brief in the browser', () => {
  it('signs in, sees their teams with the small one withheld, opens a brief and prints it', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.managerNorth);
    await page.getByRole('link', { name: 'My teams' }).click();
    await page.waitForSelector('ul[aria-label="Teams"] li');
    const cards = page.locator('ul[aria-label="Teams"] > li');
    expect(await cards.count()).toBe(3);
    const withheld = page.locator('ul[aria-label="Teams"] > li[data-withheld="true"]');
    expect(await withheld.count()).toBe(1);
    expect(await withheld.textContent()).toContain('Harrowfield Night Crew');
    expect(await withheld.textContent()).toContain('withheld: fewer than k employees');
    expect(await page.textContent('body')).toContain('must not be used for decisions about individuals');
    await screenshot(page, 'team-brief-my-teams');

    await page.getByRole('link', { name: /Alderbrook Crew 1/ }).click();
    await page.waitForSelector('article[aria-label="Team brief: Alderbrook Crew 1"]');
    await page.waitForSelector('[data-testid="driver-card"]');
    const article = (await page.textContent('article'))!;
    expect(article).toContain('Top drivers for this team');
    expect(article).toContain('Suggested action');
    expect(article).toContain('must not be used for decisions about individuals');
    await screenshot(page, 'team-brief-page');

    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    expect(await page.locator('nav').first().isVisible()).toBe(false);
    await screenshot(page, 'team-brief-print');
    mkdirSync(SCREENSHOT_DIR, { recursive: true });
    const pdf = await page.pdf({ path: path.join(SCREENSHOT_DIR, 'team-brief.pdf'), format: 'A4' });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');

    await page.emulateMedia({ media: 'screen' });
    await page.goto(`${coppice.url}/teams`);
    await page.locator('ul[aria-label="Teams"] > li[data-withheld="true"] a').click();
    await page.waitForSelector('article');
    expect(await page.textContent('article')).toContain('so it has no brief');
    await page.close();
  }, 60_000);
});

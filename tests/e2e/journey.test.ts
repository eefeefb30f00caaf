import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../backend/src/demo/quillfern-csv';
import { openBrowser, screenshot, signInWithForm } from '../helpers/browser';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

// The whole journey across the three roles, in one browser, as far as it is written today: the
// suggested actions, the publication request, publishing, the manager's e-mail and the manager's
// brief are still to be added (publishing does not read real model runs in this build yet).
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

async function as(email: string, at: string): Promise<Page> {
  await browser.clearCookies();
  const page = await browser.newPage();
  await signInWithForm(page, coppice.url, email, undefined, at);
  return page;
}

describe('from privacy policy to a trained model run, across the roles', () => {
  let datasetId = '';

  it('1. the privacy officer sets k and blocks the protected fields', async () => {
    const page = await as(ACCOUNTS.privacy, '/privacy-policy');
    await page.getByRole('heading', { name: 'Version 1' }).waitFor();
    await page.getByLabel('Minimum group size (k)').fill('6');
    for (const field of ['Date of Birth', 'Sex', 'Ethnicity', 'Disability']) {
      await page.getByLabel('Column name to block').fill(field);
      await page.getByRole('button', { name: 'Add', exact: true }).click();
    }
    await page.getByLabel('Reason for the change').fill('Agreed with the staff representatives');
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    await page.getByRole('heading', { name: 'Version 2' }).waitFor();
    await screenshot(page, 'journey-1-policy');
    await page.close();
  });

  it('2. the analyst uploads the invented demo export and maps it', async () => {
    const page = await as(ACCOUNTS.analyst, '/datasets');
    await page.waitForSelector('text=Upload a staff export');
    await page.setInputFiles('input[type="file"]', {
      name: 'quillfern-demo.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(quillfernCsv(generateQuillfernExport({ rows: 600, seed: 3 })), 'utf8'),
    });
    await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
    datasetId = page.url().split('/').pop()!;
    await page.waitForSelector('text=Voluntary leavers');
    await page.click('button:has-text("Save mapping")');
    await page.waitForSelector('text=Saved.');
    await screenshot(page, 'journey-2-mapped');
    await page.close();
  });

  it('3. the privacy officer reviews the proxies and approves the dataset', async () => {
    const page = await as(ACCOUNTS.privacy, `/review/datasets/${datasetId}`);
    // The demo plants one proxy: years since qualification, tied to age.
    await page.getByRole('button', { name: 'Accept Years Since Qualification' }).waitFor({ timeout: 60_000 });
    const accept = page.getByRole('button', { name: /^Accept / });
    for (let i = 0; i < 20 && (await accept.count()) > 0; i++) {
      await accept.first().click();
      await page
        .getByRole('dialog')
        .locator('textarea, input[type="text"]')
        .first()
        .fill('Reviewed: kept for the analysis');
      await page.getByRole('button', { name: 'Accept with this reason' }).click();
      await page.getByRole('dialog').waitFor({ state: 'detached' });
      await page.waitForLoadState('networkidle');
    }
    await screenshot(page, 'journey-3-proxies');
    await page.getByRole('button', { name: /Approve for modelling/ }).click();
    await page.waitForSelector('text=/[Aa]pproved/');
    await screenshot(page, 'journey-3-approved');
    await page.close();
  });

  it('4. the analyst trains a model run on the approved dataset and opens its tree', async () => {
    const page = await as(ACCOUNTS.analyst, '/models');
    const dataset = page.getByLabel('Dataset');
    await dataset.waitFor();
    await page.waitForFunction((id) => !!document.querySelector(`select option[value="${id}"]`), datasetId, {
      timeout: 30_000,
    });
    await dataset.selectOption(datasetId);
    await page.getByRole('button', { name: 'Start the run' }).click();
    await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
    const runId = new URL(page.url()).pathname.split('/').pop();
    let status = '';
    for (let i = 0; i < 240 && !['done', 'failed'].includes(status); i++) {
      [{ status }] = await coppice.sql<{ status: string }>('SELECT status FROM model_runs WHERE id = $1', [
        runId,
      ]);
      if (status !== 'done') await new Promise((r) => setTimeout(r, 500));
    }
    expect(status).toBe('done');
    await page.reload();
    await page.waitForLoadState('networkidle');
    await page.locator('svg').first().waitFor();
    await screenshot(page, 'journey-4-run');
    await page.close();
  });
});

import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoDataset } from '../../backend/src/demo/seed-demo-dataset';
import { approveDataset } from '../backend/models/model-data';
import { openBrowser, screenshot, signInWithForm } from '../helpers/browser';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

let coppice: TestCoppice;
let browser: BrowserContext;
let datasetId: string;
beforeAll(async () => {
  coppice = await startTestCoppice();
  // The invented demo export, uploaded and mapped the way the demo seeds it.
  datasetId = (await seedDemoDataset(coppice.config)) as string;
  await approveDataset(await coppice.signIn(ACCOUNTS.privacy), datasetId);
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
  await coppice?.stop();
});

describe('an analyst trains and explains a model run in the browser', () => {
  it('trains a run on the demo data, opens the tree, reads a segment and writes a suggested action', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.analyst, undefined, `/models?datasetId=${datasetId}`);
    const form = page.getByRole('form', { name: 'New model run' });
    await form.getByText('Features').waitFor();
    expect(await form.textContent()).toContain('Never below k = 5');
    await form.getByLabel('Cross-validation folds').fill('3');
    await form.getByLabel('Maximum depth').fill('4');
    await form.getByLabel('Pruning').selectOption('none');
    await form.getByRole('button', { name: 'Start the run' }).click();

    await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: 'Tree', exact: true }).waitFor({ timeout: 60_000 });
    await screenshot(page, 'model-run-page');

    // The root node of the drawing: its segment is everyone.
    const tree = page.getByRole('group', { name: /Tree of the model run/ });
    await tree.getByRole('button').first().click();
    const segment = page.getByTestId('selected-segment');
    await segment.waitFor();
    expect(await segment.textContent()).toMatch(/\d[\d,]* employees, \d[\d,]* leavers, leaver share \d/);

    // The first driver's suggested action, saved and still there after a reload.
    const box = page.getByLabel(/^Suggested action for managers/).first();
    await box.fill('Review overtime allocation on van routes');
    await page.getByRole('button', { name: 'Save action' }).first().click();
    await page.getByRole('status').filter({ hasText: 'Saved' }).waitFor();
    await page.reload();
    await page.getByRole('heading', { name: 'Drivers and suggested actions' }).waitFor();
    expect(
      await page
        .getByLabel(/^Suggested action for managers/)
        .first()
        .inputValue(),
    ).toBe('Review overtime allocation on van routes');
    await page.close();
  });
});

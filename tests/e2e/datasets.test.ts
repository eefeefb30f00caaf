import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../backend/src/demo/quillfern-csv';
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

describe('an analyst brings in a staff export', () => {
  it('uploads the demo export, sees its profile, maps it with a live preview and saves the mapping', async () => {
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.analyst, undefined, '/datasets');
    await page.waitForSelector('text=Upload a staff export');

    const csv = quillfernCsv(generateQuillfernExport({ rows: 300, seed: 5 }));
    await page.setInputFiles('input[type="file"]', {
      name: 'quillfern-demo.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(csv, 'utf8'),
    });
    await page.waitForURL(/\/datasets\/[0-9a-f-]{36}$/);
    await page.waitForSelector('text=Not stored: Full Name, Personal Email, Phone');
    expect(await page.textContent('body')).toContain('protected: sex');

    // The form guesses the columns from their names; the preview appears once it is complete.
    await page.waitForSelector('text=Voluntary leavers');
    expect(await page.inputValue('select:near(:text("Employee ID"))')).toBe('Staff No');
    await screenshot(page, 'dataset-mapping-preview');
    await page.click('button:has-text("Save mapping")');
    await page.waitForSelector('text=Saved.');
    await page.waitForSelector('text=Mapped');
    await page.close();
  });

  it('shows the rows that are wrong in place when an upload is rejected', async () => {
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/datasets`);
    await page.waitForSelector('text=Upload a staff export');
    const lines = Array.from({ length: 20 }, (_, i) => `QF-${i},${i === 3 ? 'soon' : '2024-01-01'}`);
    await page.setInputFiles('input[type="file"]', {
      name: 'broken.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(`Staff No,Start Date\n${lines.join('\n')}\n`, 'utf8'),
    });
    await page.waitForSelector('[role="alert"]');
    const alert = await page.textContent('[role="alert"]');
    expect(alert).toContain('broken.csv was not uploaded');
    expect(alert).toContain('"soon" is not a date');
    await screenshot(page, 'dataset-upload-rejected');
    await page.close();
  });
});

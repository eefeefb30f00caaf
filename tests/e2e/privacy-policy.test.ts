import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../backend/src/demo/quillfern';
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

describe('approving the demo dataset', () => {
  it('lets the privacy officer review the flagged proxy and approve the mapped demo export', async () => {
    // The analyst's part, through the API: upload the invented Quillfern export and map it.
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const csv = Buffer.from(quillfernCsv(generateQuillfernExport({ rows: 400, seed: 8 })), 'utf8');
    const uploaded = await analyst.post('/api/datasets').attach('file', csv, 'quillfern.csv');
    expect(uploaded.status).toBe(201);
    expect(
      (await analyst.put(`/api/datasets/${uploaded.body.id}/mapping`).send(QUILLFERN_MAPPING)).status,
    ).toBe(200);

    await browser.clearCookies();
    const page = await browser.newPage();
    await signInWithForm(page, coppice.url, ACCOUNTS.privacy, undefined, '/privacy-policy');
    await page.getByRole('heading', { name: /^Version \d+$/ }).waitFor();
    for (const field of ['Date of Birth', 'Sex']) {
      await page.getByLabel('Column name to block').fill(field);
      await page.getByRole('button', { name: 'Add', exact: true }).click();
    }
    await page.getByLabel('Reason for the change').fill('Block date of birth and sex');
    await page.getByRole('button', { name: /Save as version/ }).click();
    await page.getByRole('status').filter({ hasText: 'Saved as version' }).waitFor();

    await page.getByRole('link', { name: 'Review queue' }).click();
    await page.getByRole('link', { name: uploaded.body.name }).click();
    await page.getByRole('heading', { name: 'Proxy report' }).waitFor();
    await page.getByText('Possible proxy').first().waitFor();
    await screenshot(page, 'dataset-review-proxy-flagged');

    await page.getByRole('button', { name: 'Approve for modelling' }).click();
    await page.getByRole('alert').filter({ hasText: 'Decide on every flagged proxy first' }).waitFor();

    await page.getByRole('button', { name: 'Accept Years Since Qualification' }).click();
    await page
      .getByRole('dialog')
      .getByLabel('Reason')
      .fill('Needed for nursing grades; agreed with the works council');
    await page.getByRole('button', { name: 'Accept with this reason' }).click();
    await page
      .getByRole('button', { name: 'Accept Years Since Qualification' })
      .waitFor({ state: 'detached' });
    expect(await page.getByRole('table').first().textContent()).toContain('Needed for nursing grades');

    await page.getByRole('button', { name: 'Approve for modelling' }).click();
    await page.getByText('Approved for modelling', { exact: true }).waitFor();
    await screenshot(page, 'dataset-review-approved');
    const [row] = await coppice.sql<{ decision: string }>(
      'SELECT decision FROM dataset_approvals WHERE dataset_id = $1',
      [uploaded.body.id],
    );
    expect(row?.decision).toBe('approved');
    await page.close();
  });
});

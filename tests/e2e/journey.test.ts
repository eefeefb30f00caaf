import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../backend/src/demo/quillfern-csv';
import type { ModelRunDetail } from '../../shared/models';
import type { TreeNode } from '../../shared/tree';
import { waitForPublication } from '../backend/briefs/demo-sources';
import { openBrowser, screenshot, signInWithForm } from '../helpers/browser';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../helpers/test-coppice';

// The whole journey across the three roles, in one browser: policy, upload and mapping, proxy
// review and approval, a model run with suggested actions, the publication request, which the
// privacy officer finds in the review queue and publishes from the run page, the managers' e-mail
// and a manager reading their team briefs. Screenshots go to the ignored .test-output/screenshots
// folder.
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

type Mail = { to: string[]; subject: string; text: string; receivedAt: string };

/** Polls the local mail sink until a message to `to` whose subject matches arrives. */
async function mailTo(to: string, subject: RegExp): Promise<Mail> {
  for (let i = 0; i < 300; i++) {
    const box = (await (await fetch(`${coppice.url}/dev/mailbox`)).json()) as Mail[];
    const mail = box.find((m) => m.to.includes(to) && subject.test(m.subject));
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no e-mail to ${to} matching ${subject}`);
}

function linkIn(mail: Mail): string {
  const link = mail.text.match(/https?:\/\/\S+/)?.[0];
  expect(link, mail.text).toBeDefined();
  return new URL(link!).pathname;
}

// The demo's fixed crews: manager.north runs Harrowfield Night Crew of 3 people, always under k = 6.
const MANAGER = ACCOUNTS.managerNorth;
const SMALL_TEAM = 'Harrowfield Night Crew';

describe('from privacy policy to a manager reading a team brief, across the roles', () => {
  let datasetId = '';
  let runId = '';
  const actions = new Map<string, string>();

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
    // The intake's likely protected characteristics, each with whether the policy blocks it.
    const flagged = page.locator('section').filter({
      has: page.getByRole('heading', { name: 'Likely protected characteristics' }),
    });
    await expect.poll(async () => (await flagged.textContent()) ?? '').toMatch(/Sex.*· blocked/);
    expect(await flagged.textContent()).toMatch(/Marital Status.*not blocked: models may split on it/);
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
    // On 600 rows cross-validated pruning cuts the demo tree back to its root (no drivers to act
    // on), so the analyst trains a shallow unpruned tree, as the seeded demo runs do.
    await page.getByLabel('Maximum depth').fill('4');
    await page.getByLabel('Pruning').selectOption('none');
    await page.getByLabel('Cross-validation folds').fill('2');
    await page.getByRole('button', { name: 'Start the run' }).click();
    await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
    runId = new URL(page.url()).pathname.split('/').pop()!;
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
  it('4b. the analyst reads a segment, writes suggested actions and asks for publication', async () => {
    const page = await as(ACCOUNTS.analyst, `/models/${runId}`);
    const run = (await page.evaluate(
      async (id) => (await fetch(`/api/models/${id}`)).json(),
      runId,
    )) as ModelRunDetail;
    const root = run.result!.tree as Extract<TreeNode, { split: unknown }>;
    expect(root.split, 'the demo tree has at least one split').toBeDefined();
    const left = root.children[0] as { n: number; positive: number };

    const tree = page.getByRole('group', { name: /^Tree of the model run/ });
    await tree.locator('[data-node-id="L"]').click();
    const segment = page.getByTestId('selected-segment');
    await segment.waitFor();
    const words = (await segment.textContent())!;
    expect(words.startsWith(root.split.feature), words).toBe(true);
    expect(words).toContain(`${left.n.toLocaleString('en-GB')} employees`);
    expect(words).toContain(`${left.positive.toLocaleString('en-GB')} leavers`);
    await screenshot(page, 'journey-4b-segment');

    const drivers = run.result!.drivers;
    expect(drivers.length).toBeGreaterThan(0);
    for (const driver of drivers) {
      const text = `Talk with the crews about ${driver.feature.toLowerCase()} (invented demo action)`;
      actions.set(driver.feature, text);
      const box = page.getByLabel(`Suggested action for managers (${driver.feature})`);
      await box.fill(text);
      const row = page.getByRole('listitem').filter({ has: box });
      await row.getByRole('button', { name: 'Save action' }).click();
      await row.getByRole('status').filter({ hasText: 'Saved' }).waitFor();
    }
    await page.reload();
    for (const [feature, text] of actions)
      await expect
        .poll(() => page.getByLabel(`Suggested action for managers (${feature})`).inputValue())
        .toBe(text);
    await screenshot(page, 'journey-4b-actions');

    await page.getByLabel('A note for the privacy officers (optional)').fill('Ready for the managers');
    await page.getByRole('button', { name: 'Request publication' }).click();
    await page.getByText('Publication requested', { exact: false }).first().waitFor();
    await expect.poll(() => page.getByRole('button', { name: 'Request publication' }).count()).toBe(0);
    const [{ publication_state }] = await coppice.sql<{ publication_state: string }>(
      'SELECT publication_state FROM model_runs WHERE id = $1',
      [runId],
    );
    expect(publication_state).toBe('requested');
    await screenshot(page, 'journey-4b-requested');
    await page.close();
  });

  it('5. the privacy officer finds the request in the review queue, publishes the run there and the request leaves the queue', async () => {
    // The e-mail to the privacy officers still arrives with the note and a link to the run.
    const request = await mailTo(ACCOUNTS.privacy, /asks for publication/);
    expect(request.text).toContain('Ready for the managers');
    expect(linkIn(request)).toBe(`/models/${runId}`);

    const page = await as(ACCOUNTS.privacy, '/review');
    await page.getByRole('heading', { name: /^Publication requests \(/ }).waitFor();
    const requests = page.getByRole('table', { name: 'Publication requests' });
    const thisRun = requests.getByRole('row').filter({ hasText: `run ${runId.slice(0, 8)}` });
    expect(await thisRun.count()).toBe(1);
    const row = (await thisRun.textContent())!;
    expect(row).toContain(ACCOUNTS.analyst);
    expect(row).toContain('Ready for the managers');
    await screenshot(page, 'journey-5-review-queue');

    await thisRun.getByRole('link', { name: /^Model run on / }).click();
    await page.waitForURL(`**/models/${runId}`);
    await page.getByRole('button', { name: 'Publish team briefs' }).click();
    await page.getByText('Published to the managers').waitFor({ timeout: 60_000 });
    const publication = await waitForPublication(await coppice.signIn(ACCOUNTS.privacy), runId);
    expect(publication.status).toBe('published');
    expect(publication.withheldTeamCount).toBeGreaterThan(0);
    await screenshot(page, 'journey-5-published');

    await page.getByRole('link', { name: 'Review queue' }).click();
    await page.getByRole('heading', { name: /^Publication requests \(/ }).waitFor();
    await expect.poll(() => thisRun.count()).toBe(0);
    await page.close();
  });

  let teamsLink = '';
  it("6. the manager's e-mail arrives in the mail sink, with a link and no figures", async () => {
    const mail = await mailTo(MANAGER, /^Team briefs are ready in Coppice$/);
    expect(mail.to).toEqual([MANAGER]);
    teamsLink = linkIn(mail);
    expect(teamsLink).toBe('/teams');
    const words = mail.text.replace(/https?:\/\/\S+/g, '');
    expect(words).not.toMatch(/\d|%/);
    expect(words).not.toContain(SMALL_TEAM);
    expect(words).toMatch(/not for decisions about any one person/);

    await browser.clearCookies();
    const page = await browser.newPage();
    await page.goto(`${coppice.url}/dev/mailbox`);
    expect(await page.textContent('body')).toContain(MANAGER);
    await screenshot(page, 'journey-6-mailbox');
    await page.close();
  });

  it('7. the manager opens their teams, sees the small team withheld and reads a brief with the caution', async () => {
    const page = await as(MANAGER, teamsLink);
    await page.getByRole('heading', { name: 'My teams' }).waitFor();
    const cards = page.getByRole('list', { name: 'Teams' }).getByRole('listitem');
    await cards.first().waitFor();
    const withheld = cards.filter({ hasText: SMALL_TEAM });
    expect(await withheld.getAttribute('data-withheld')).toBe('true');
    expect(await withheld.textContent()).toContain('withheld: fewer than k employees');
    expect(await page.getByRole('complementary', { name: 'Caution' }).textContent()).toContain(
      'must not be used for decisions about individuals',
    );
    await screenshot(page, 'journey-7-my-teams');

    const visible = page.locator('ul[aria-label="Teams"] > li:not([data-withheld])').first();
    const name = (await visible.getByRole('heading').textContent())!.trim();
    await visible.getByRole('link').click();
    const brief = page.getByRole('article', { name: `Team brief: ${name}` });
    await brief.waitFor();
    const text = (await brief.textContent())!;
    expect(text).toContain('must not be used for decisions about individuals');
    expect(text).toContain('employee representatives');
    // The actions the analyst wrote in 4b reach the manager beside their team's drivers.
    const driverCards = brief.getByTestId('driver-card');
    expect(await driverCards.count()).toBeGreaterThan(0);
    for (const card of await driverCards.all()) {
      const feature = (await card.getByRole('heading').textContent())!.trim();
      expect(await card.textContent()).toContain(actions.get(feature));
    }
    await screenshot(page, 'journey-7-brief');
    await page.close();
  });
});

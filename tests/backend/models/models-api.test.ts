import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { buildTable } from '../../../backend/src/modeling/table';
import { trainModel } from '../../../backend/src/modeling/train';
import { loadDatasetColumns } from '../../../backend/src/modules/datasets/datasets.repository';
import type { ModelRunDetail } from '../../../shared/models';
import { isInternal, isWithheld, type TreeNode } from '../../../shared/tree';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { approveDataset, mappedDataset, waitForRun } from './model-data';

let coppice: TestCoppice;
let analyst: request.Agent;
let privacy: request.Agent;
let manager: request.Agent;
let datasetId: string;

beforeAll(async () => {
  coppice = await startTestCoppice();
  [analyst, privacy, manager] = await Promise.all([
    coppice.signIn(ACCOUNTS.analyst),
    coppice.signIn(ACCOUNTS.privacy),
    coppice.signIn(ACCOUNTS.managerNorth),
  ]);
  datasetId = await mappedDataset(analyst);
  await approveDataset(privacy, datasetId);
});
afterAll(async () => {
  await coppice?.stop();
});

function splitFeatures(node: TreeNode): string[] {
  return isInternal(node)
    ? [node.split.feature, ...splitFeatures(node.children[0]), ...splitFeatures(node.children[1])]
    : [];
}

function nodes(node: TreeNode): TreeNode[] {
  return isInternal(node) ? [node, ...nodes(node.children[0]), ...nodes(node.children[1])] : [node];
}

describe('POST /api/models', () => {
  it('refuses a body that breaks the rules, naming the field', async () => {
    const res = await analyst.post('/api/models').send({ datasetId, criterion: 'variance', maxDepth: 0 });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['criterion', 'maxDepth']));
  });

  it('answers 404 for a dataset that does not exist and 403 to a manager', async () => {
    const missing = await analyst
      .post('/api/models')
      .send({ datasetId: '00000000-0000-4000-8000-000000000001' });
    expect(missing.status).toBe(404);
    const forbidden = await manager.post('/api/models').send({ datasetId });
    expect(forbidden.status).toBe(403);
  });

  it('refuses a mapped dataset until a privacy officer approves it (409)', async () => {
    const id = await mappedDataset(analyst, { seed: 9 });
    const res = await analyst.post('/api/models').send({ datasetId: id });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/privacy officer must approve/);
  });

  it('refuses a dataset that is not mapped yet (409)', async () => {
    const upload = await analyst
      .post('/api/datasets')
      .attach('file', Buffer.from('Staff No,Crew,Left\nA1,North,Yes\nA2,South,No\n', 'utf8'), 'tiny.csv');
    expect(upload.status).toBe(201);
    const res = await analyst.post('/api/models').send({ datasetId: upload.body.id });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Map the dataset and ask a privacy officer to approve it/);
  });

  it('raises minLeaf to the policy k and says so in the 202 response', async () => {
    const res = await analyst.post('/api/models').send({ datasetId, minLeaf: 2, folds: 3 });
    expect(res.status).toBe(202);
    expect(res.body).toMatchObject({ status: 'queued', minLeaf: 5, minLeafRaisedToK: true });
    expect(res.body.notices.join(' ')).toMatch(/raised from 2 to 5.*k is 5/);
    const run = await waitForRun(analyst, res.body.id);
    expect(run.settings).toMatchObject({ minLeaf: 2, effectiveMinLeaf: 5, k: 5 });
  });
});

describe('a model run from queue to result', () => {
  let run: ModelRunDetail;

  it('is queued, trains with stored progress and ends done with metrics, tree and explanations', async () => {
    const res = await analyst
      .post('/api/models')
      .send({ datasetId, minLeaf: 10, maxDepth: 4, pruning: 'none', folds: 3, seed: 4 });
    expect(res.status).toBe(202);
    const seen = new Set<string>();
    for (let i = 0; i < 200; i++) {
      const poll = await analyst.get(`/api/models/${res.body.id}`);
      seen.add(poll.body.status);
      expect(poll.body.progress).toBeGreaterThanOrEqual(0);
      expect(poll.body.progress).toBeLessThanOrEqual(1);
      if (poll.body.status === 'done') break;
      await new Promise((r) => setTimeout(r, 50));
    }
    expect(seen.has('done')).toBe(true);
    run = await waitForRun(privacy, res.body.id);
    expect(run).toMatchObject({ status: 'done', progress: 1, phase: null, error: null, policyVersion: 1 });
    expect(run.result?.metricsSource).toBe('cross-validation');
    expect(run.result?.metrics.auc).toBeGreaterThan(0.5);
    expect(run.result?.segments.length).toBeGreaterThan(0);
    expect(run.result?.drivers.length).toBeGreaterThan(0);
    const audit = await coppice.sql('SELECT action FROM audit_events WHERE object_id = $1', [run.id]);
    expect(audit.map((a) => a.action)).toContain('model.run');
  });

  it('reports the same metrics as the engine trained on the same data and settings', async () => {
    const input = await loadDatasetColumns(datasetId);
    const table = buildTable(
      input.features
        .filter((f) => run.features.includes(f.name))
        .map((f) =>
          f.kind === 'numeric'
            ? { name: f.name, kind: 'numeric' as const, values: f.values as (number | null)[] }
            : { name: f.name, kind: 'categorical' as const, values: f.values as (string | null)[] },
        ),
    );
    const engine = trainModel(table, input.labels, {
      minLeaf: 10,
      k: 5,
      folds: 3,
      seed: 4,
      maxDepth: 4,
      criterion: 'gini',
      pruning: 'none',
    });
    expect(run.result?.metrics.auc).toBeCloseTo(engine.crossValidation!.pooled.metrics.auc, 10);
    expect(run.result?.crossValidation?.metrics.auc.mean).toBeCloseTo(
      engine.crossValidation!.metrics.auc.mean,
      10,
    );
    expect(run.result?.baseRate).toBeCloseTo(engine.baseRate, 12);
    expect(run.result?.tree).toEqual(engine.tree);
  });

  it('trains the same tree again from the stored settings and seed', async () => {
    // The request takes the settings the analyst chose, not what the run derived from them.
    const { effectiveMinLeaf: _e, k: _k, requestedFeatures, ...chosen } = run.settings;
    const again = await analyst
      .post('/api/models')
      .send({ datasetId, ...chosen, features: requestedFeatures ?? undefined });
    expect(again.status).toBe(202);
    const second = await waitForRun(analyst, again.body.id);
    expect(second.result?.tree).toEqual(run.result?.tree);
    expect(second.result?.metrics).toEqual(run.result?.metrics);
  });

  it('saves a suggested action per driver and shows it with the driver', async () => {
    const feature = run.result!.drivers[0].feature;
    const put = await analyst
      .put(`/api/models/${run.id}/drivers/${encodeURIComponent(feature)}/action`)
      .send({ text: 'Review overtime allocation on van routes' });
    expect(put.status).toBe(200);
    const read = await analyst.get(`/api/models/${run.id}`);
    const driver = read.body.result.drivers.find((d: { feature: string }) => d.feature === feature);
    expect(driver.suggestedAction).toBe('Review overtime allocation on van routes');
    const unknown = await analyst
      .put(`/api/models/${run.id}/drivers/No%20Such%20Column/action`)
      .send({ text: 'x' });
    expect(unknown.status).toBe(404);
  });
});

describe('blocked fields under the privacy policy', () => {
  it('never uses a blocked field or anything derived from it as a feature, split or driver', async () => {
    const policy = await privacy.put('/api/policy').send({
      k: 5,
      blockedFields: ['Date of Birth', 'Sex', 'Ethnicity', 'Disability'],
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Block the protected characteristics',
    });
    expect(policy.status).toBe(200);
    // the policy changed: the dataset is reviewed again, and the planted proxy blocked this time
    expect((await analyst.post('/api/models').send({ datasetId })).status).toBe(409);
    await approveDataset(privacy, datasetId, ['Years Since Qualification']);
    const res = await analyst
      .post('/api/models')
      .send({ datasetId, minLeaf: 5, maxDepth: 8, pruning: 'none', folds: 3 });
    expect(res.status).toBe(202);
    const excluded = res.body.excludedFeatures.map((e: { name: string }) => e.name);
    // the intake turns the date of birth into an age: derived, so blocked too
    expect(excluded).toEqual(
      expect.arrayContaining(['Age (years)', 'Sex', 'Ethnicity', 'Disability', 'Years Since Qualification']),
    );
    expect(res.body.notices.join(' ')).toMatch(/derived from the blocked field "Date of Birth"/);
    const run = await waitForRun(analyst, res.body.id);
    const forbidden = /birth|age \(years\)|^sex$|ethnicity|disability|qualification/i;
    for (const name of [
      ...run.features,
      ...splitFeatures(run.result!.tree),
      ...run.result!.drivers.map((d) => d.feature),
    ])
      expect(name).not.toMatch(forbidden);
    for (const segment of run.result!.segments)
      if (!segment.withheld) expect(segment.rule).not.toMatch(forbidden);
  });

  it('refuses a run whose chosen features are all blocked', async () => {
    const res = await analyst.post('/api/models').send({ datasetId, features: ['Sex'] });
    expect(res.status).toBe(422);
  });

  it('marks runs made under an older policy as needing review when the policy changes', async () => {
    // runs made before the last change need review already; those made under the current version do not
    const policy = (await analyst.get('/api/policy')).body;
    const before = await analyst.get('/api/models');
    for (const r of before.body) expect(r.needsReview).toBe(r.policyVersion < policy.version);
    expect(before.body.some((r: { policyVersion: number }) => r.policyVersion === policy.version)).toBe(true);
    const change = await privacy.put('/api/policy').send({
      k: 6,
      blockedFields: policy.blockedFields,
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Larger groups only',
    });
    expect(change.status).toBe(200);
    const after = await analyst.get('/api/models');
    expect(after.body.length).toBeGreaterThan(0);
    expect(after.body.every((r: { needsReview: boolean }) => r.needsReview)).toBe(true);
  });

  it('applies a raised k to runs trained under the old one: nothing under the new k is shown', async () => {
    const list = await analyst.get('/api/models');
    for (const summary of list.body.filter((r: { status: string }) => r.status === 'done')) {
      const run = (await analyst.get(`/api/models/${summary.id}`)).body as ModelRunDetail;
      expect(run.k).toBe(6);
      for (const node of nodes(run.result!.tree))
        if (!isWithheld(node)) expect(node.n).toBeGreaterThanOrEqual(6);
      for (const s of run.result!.segments) if (!s.withheld) expect(s.n).toBeGreaterThanOrEqual(6);
    }
  });
});

describe('a run that cannot learn', () => {
  it('fails with a message that says what to check', async () => {
    const id = await mappedDataset(analyst, {
      seed: 8,
      // every region counts as "left": only one class, nothing to learn
      mapping: {
        ...QUILLFERN_MAPPING,
        outcome: {
          kind: 'flag',
          column: 'Region',
          positiveValues: ['North', 'South', 'East', 'West', 'Central'],
        },
      },
    });
    await approveDataset(privacy, id);
    const res = await analyst.post('/api/models').send({ datasetId: id });
    expect(res.status).toBe(202);
    const run = await waitForRun(analyst, res.body.id);
    expect(run.status).toBe('failed');
    expect(run.error).toMatch(/same outcome.*Check the outcome in the dataset mapping/);
    expect(run.result).toBeNull();
  });
});

describe('publication requests', () => {
  let runId: string;

  async function mailTo(address: string, subject: RegExp) {
    for (let i = 0; i < 100; i++) {
      const box = await analyst.get('/dev/mailbox');
      const found = (box.body as { to: string | string[]; subject: string; text: string }[]).find(
        (m) => String(m.to).includes(address) && subject.test(m.subject),
      );
      if (found) return found;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`no mail to ${address} about ${subject}`);
  }

  beforeAll(async () => {
    await approveDataset(privacy, datasetId, ['Years Since Qualification']);
    const res = await analyst.post('/api/models').send({ datasetId, folds: 3, pruning: 'none', maxDepth: 3 });
    runId = res.body.id;
    await waitForRun(analyst, runId);
  });

  it('asks the privacy officers by e-mail and records the request', async () => {
    const res = await analyst
      .post(`/api/models/${runId}/publication-request`)
      .send({ comment: 'Ready for review' });
    expect(res.status).toBe(200);
    expect(res.body.publicationState).toBe('requested');
    const mail = await mailTo(ACCOUNTS.privacy, /asks for publication/);
    expect(mail.text).toContain(`/models/${runId}`);
    const again = await analyst.post(`/api/models/${runId}/publication-request`).send({});
    expect(again.status).toBe(409);
    const audit = await coppice.sql('SELECT action FROM audit_events WHERE object_id = $1', [runId]);
    expect(audit.map((a) => a.action)).toContain('model.publication_request');
  });

  it('lets only a privacy officer send it back, with a comment the analyst reads', async () => {
    expect((await analyst.post(`/api/models/${runId}/send-back`).send({ comment: 'No' })).status).toBe(403);
    expect((await privacy.post(`/api/models/${runId}/send-back`).send({})).status).toBe(400);
    const res = await privacy
      .post(`/api/models/${runId}/send-back`)
      .send({ comment: 'Reword the action on overtime' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      publicationState: 'sent_back',
      publicationComment: 'Reword the action on overtime',
    });
    await mailTo(ACCOUNTS.analyst, /sent back/);
  });

  it('gives the briefs engineer the run as plain data, tree unwithheld', async () => {
    const { getModelRunForPublishing } = await import(
      '../../../backend/src/modules/models/models.repository'
    );
    const data = await getModelRunForPublishing(runId);
    expect(data).toMatchObject({ id: runId, datasetId, status: 'done', publicationState: 'sent_back' });
    expect(data?.tree && 'n' in data.tree ? data.tree.n : 0).toBeGreaterThan(0);
    expect(await getModelRunForPublishing('00000000-0000-4000-8000-000000000002')).toBeNull();
  });
});

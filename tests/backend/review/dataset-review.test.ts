import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { assertApprovedForModelling } from '../../../backend/src/modules/review/review.service';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let analyst: request.Agent;
let privacy: request.Agent;
let manager: request.Agent;

// The invented Quillfern demo export, small: it plants "Years Since Qualification" as a proxy for age.
const demoCsv = Buffer.from(quillfernCsv(generateQuillfernExport({ rows: 400, seed: 5 })), 'utf8');
const BLOCKED = ['Date of Birth', 'Sex', 'Ethnicity', 'Disability'];

beforeAll(async () => {
  coppice = await startTestCoppice();
  [analyst, privacy, manager] = await Promise.all([
    coppice.signIn(ACCOUNTS.analyst),
    coppice.signIn(ACCOUNTS.privacy),
    coppice.signIn(ACCOUNTS.managerNorth),
  ]);
});
afterAll(async () => {
  await coppice?.stop();
});

async function uploadDemo(map = true): Promise<string> {
  const uploaded = await analyst.post('/api/datasets').attach('file', demoCsv, 'quillfern.csv');
  expect(uploaded.status).toBe(201);
  if (map)
    expect(
      (await analyst.put(`/api/datasets/${uploaded.body.id}/mapping`).send(QUILLFERN_MAPPING)).status,
    ).toBe(200);
  return uploaded.body.id;
}

async function setPolicy(
  change: Partial<{ k: number; blockedFields: string[]; proxyThreshold: number; retentionDays: number }>,
  reason: string,
) {
  const { k, blockedFields, proxyThreshold, retentionDays } = (await privacy.get('/api/policy')).body;
  const res = await privacy
    .put('/api/policy')
    .send({ k, blockedFields, proxyThreshold, retentionDays, ...change, reason });
  expect(res.status).toBe(200);
  return res.body;
}

async function auditActions(objectId: string): Promise<string[]> {
  const rows = await coppice.sql<{ action: string }>(
    `SELECT action FROM audit_events WHERE object_id = $1 ORDER BY id`,
    [objectId],
  );
  return rows.map((r) => r.action);
}

describe('reviewing a dataset before any model is trained on it', () => {
  let id: string;

  it('has nothing to compare while no field is blocked', async () => {
    id = await uploadDemo();
    const res = await analyst.get(`/api/datasets/${id}/proxies`);
    expect(res.status).toBe(200);
    expect(res.body.rows).toEqual([]);
  });

  it('flags the planted proxy for age and leaves an unrelated field alone, saying how numbers are binned', async () => {
    await setPolicy({ blockedFields: BLOCKED, proxyThreshold: 0.5 }, 'Block the protected characteristics');
    const res = await privacy.get(`/api/datasets/${id}/proxies`);
    expect(res.status).toBe(200);
    expect(res.body.bins).toBe(5);
    const pair = (feature: string, blocked: string) =>
      res.body.rows.find(
        (r: { feature: string; blockedField: string }) => r.feature === feature && r.blockedField === blocked,
      );
    expect(pair('Years Since Qualification', 'Date of Birth')).toMatchObject({
      flagged: true,
      featureBins: 5,
      decision: null,
    });
    expect(pair('Weekly Overtime Hours', 'Date of Birth').flagged).toBe(false);
    expect(res.body.rows.map((r: { feature: string }) => r.feature)).not.toContain('Sex');
    const strengths = res.body.rows.map((r: { cramersV: number }) => r.cramersV);
    expect(strengths).toEqual([...strengths].sort((a, b) => b - a));
  });

  it('refuses approval while a flagged proxy is undecided, naming it', async () => {
    const res = await privacy.post(`/api/datasets/${id}/approval`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('Years Since Qualification for Date of Birth');
  });

  it('lets the privacy officer accept the proxy with a written reason, audited', async () => {
    const flagged = (await privacy.get(`/api/datasets/${id}/proxies`)).body.rows.filter(
      (r: { flagged: boolean }) => r.flagged,
    );
    for (const row of flagged) {
      const res = await privacy.post(`/api/datasets/${id}/proxies/decisions`).send({
        feature: row.feature,
        blockedField: row.blockedField,
        decision: 'accept',
        reason: 'Qualification age matters for the nursing grades; reviewed with the works council',
      });
      expect(res.status).toBe(200);
    }
    const after = (await analyst.get(`/api/datasets/${id}/proxies`)).body.rows.filter(
      (r: { flagged: boolean }) => r.flagged,
    );
    expect(
      after.every((r: { decision: { decision: string } | null }) => r.decision?.decision === 'accept'),
    ).toBe(true);
    expect(await auditActions(id)).toContain('dataset.proxy_accepted');
  });

  it('is not for analysts to approve, nor for managers to read', async () => {
    expect((await analyst.post(`/api/datasets/${id}/approval`).send({})).status).toBe(403);
    expect((await manager.get(`/api/datasets/${id}/proxies`)).status).toBe(403);
    expect((await manager.get(`/api/datasets/${id}/approval`)).status).toBe(403);
  });

  it('approves the dataset under the current policy version, audited; models may now be trained', async () => {
    await expect(assertApprovedForModelling(id)).rejects.toMatchObject({ status: 409 });
    const queue = (await privacy.get('/api/review-queue')).body;
    expect(queue.map((item: { id: string }) => item.id)).toContain(id);

    const policy = (await privacy.get('/api/policy')).body;
    const res = await privacy.post(`/api/datasets/${id}/approval`).send({ comment: 'Fine to model' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      state: 'approved',
      latest: { decision: 'approved', policyVersion: policy.version },
    });
    expect(await assertApprovedForModelling(id)).toBe(policy.version);
    expect(await auditActions(id)).toContain('dataset.approved');
    expect(
      (await privacy.get('/api/review-queue')).body.map((item: { id: string }) => item.id),
    ).not.toContain(id);
  });

  it('marks the approval "needs review" when k rises, and refuses modelling until it is reviewed again', async () => {
    const before = (await privacy.get('/api/policy')).body;
    await setPolicy({ k: before.k + 2 }, 'Larger groups for the new region');
    const status = (await analyst.get(`/api/datasets/${id}/approval`)).body;
    expect(status.state).toBe('needs-review');
    expect(status.reasons[0]).toContain(`k changed from ${before.k} to ${before.k + 2}`);
    await expect(assertApprovedForModelling(id)).rejects.toThrow(
      /policy changed since this dataset was approved/,
    );
    const queue = (await privacy.get('/api/review-queue')).body;
    expect(queue.find((item: { id: string }) => item.id === id)).toMatchObject({ state: 'needs-review' });
  });

  it('keeps an approval valid when only the retention period changes', async () => {
    expect((await privacy.post(`/api/datasets/${id}/approval`).send({})).body.state).toBe('approved');
    const before = (await privacy.get('/api/policy')).body;
    await setPolicy({ retentionDays: before.retentionDays + 30 }, 'Keep data a month longer');
    expect((await analyst.get(`/api/datasets/${id}/approval`)).body.state).toBe('approved');
  });
});

describe('blocking a proxy and sending a dataset back', () => {
  it('blocks the flagged field in the policy too, as a new version with the reason', async () => {
    const id = await uploadDemo();
    const before = (await privacy.get('/api/policy')).body;
    const res = await privacy.post(`/api/datasets/${id}/proxies/decisions`).send({
      feature: 'Years Since Qualification',
      blockedField: 'Date of Birth',
      decision: 'block',
      reason: 'Too close to age',
    });
    expect(res.status).toBe(200);
    const after = (await privacy.get('/api/policy')).body;
    expect(after.version).toBe(before.version + 1);
    expect(after.blockedFields).toContain('Years Since Qualification');
    expect(after.reason).toContain('Too close to age');
    expect(res.body.rows.map((r: { feature: string }) => r.feature)).not.toContain(
      'Years Since Qualification',
    );
    expect(await auditActions(id)).toContain('dataset.proxy_blocked');
  });

  it('needs a comment to send a dataset back, and a mapped dataset to decide at all', async () => {
    const id = await uploadDemo(false);
    expect((await privacy.post(`/api/datasets/${id}/approval`).send({})).status).toBe(409);
    await analyst.put(`/api/datasets/${id}/mapping`).send(QUILLFERN_MAPPING);
    const noComment = await privacy.post(`/api/datasets/${id}/approval`).send({ decision: 'send-back' });
    expect(noComment.status).toBe(400);
    expect(noComment.body.error.details[0].path).toBe('comment');
    const back = await privacy
      .post(`/api/datasets/${id}/approval`)
      .send({ decision: 'send-back', comment: 'Exclude the Marital Status column' });
    expect(back.body).toMatchObject({ state: 'sent-back' });
    await expect(assertApprovedForModelling(id)).rejects.toThrow(/sent this dataset back/);
  });

  it('answers 404 for a dataset that does not exist', async () => {
    expect((await privacy.get('/api/datasets/not-a-uuid/proxies')).status).toBe(404);
    expect((await privacy.get('/api/datasets/00000000-0000-4000-8000-000000000000/approval')).status).toBe(
      404,
    );
  });
});

import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { approveDataset, mappedDataset, waitForRun } from '../models/model-data';

let coppice: TestCoppice;
let analyst: request.Agent;
let privacy: request.Agent;
let runId: string;

beforeAll(async () => {
  coppice = await startTestCoppice();
  [analyst, privacy] = await Promise.all([
    coppice.signIn(ACCOUNTS.analyst),
    coppice.signIn(ACCOUNTS.privacy),
  ]);
  const current = (await privacy.get('/api/policy')).body;
  const blocked = await privacy.put('/api/policy').send({
    k: current.k,
    proxyThreshold: current.proxyThreshold,
    retentionDays: current.retentionDays,
    blockedFields: ['Sex', 'Date of Birth'],
    reason: 'Block sex and date of birth',
  });
  expect(blocked.status, JSON.stringify(blocked.body)).toBe(200);
  const datasetId = await mappedDataset(analyst, { rows: 400, seed: 4 });
  await approveDataset(privacy, datasetId);
  const created = await analyst.post('/api/models').send({ datasetId, folds: 3 });
  expect(created.status).toBe(202);
  const run = await waitForRun(analyst, created.body.id, 60_000);
  expect(run.status).toBe('done');
  runId = run.id;
});
afterAll(async () => {
  await coppice?.stop();
});

describe('GET /api/models/:id/fairness', () => {
  it('gives the privacy officer each blocked field by group, under the four-fifths rule, audited', async () => {
    const res = await privacy.get(`/api/models/${runId}/fairness`);
    expect(res.status).toBe(200);
    expect(res.body.reports.map((r: { field: string }) => r.field)).toEqual(['Sex', 'Date of Birth']);
    const [sex, age] = res.body.reports;
    expect(sex.rule).toMatch(/29 CFR 1607\.4\(D\)/);
    expect(age.bins).toBe(5);
    for (const report of res.body.reports) {
      for (const group of report.groups) {
        if (group.withheld) expect(group.headcount).toEqual({ withheld: true });
        else expect(group.headcount).toBeGreaterThanOrEqual(res.body.k);
      }
    }
    const shown = sex.groups.filter((g: { withheld: boolean }) => !g.withheld);
    expect(shown.filter((g: { reference: boolean }) => g.reference)).toHaveLength(1);
    const [line] = await coppice.sql<{ actor_email: string }>(
      `SELECT actor_email FROM audit_events WHERE action = 'model.fairness_viewed' AND object_id = $1`,
      [runId],
    );
    expect(line?.actor_email).toBe(ACCOUNTS.privacy);
  });

  it('is for privacy officers only', async () => {
    expect((await analyst.get(`/api/models/${runId}/fairness`)).status).toBe(403);
    expect((await privacy.get('/api/models/00000000-0000-4000-8000-000000000000/fairness')).status).toBe(404);
  });
});

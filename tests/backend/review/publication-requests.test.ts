import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type PublicationQueueItem, reviewQueueSchema } from '../../../shared/privacy';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { useDemoRuns, waitForPublication } from '../briefs/demo-sources';

let coppice: TestCoppice;
let analyst: request.Agent;
let privacy: request.Agent;
let manager: request.Agent;
let datasetId: string;
let runId: string;

beforeAll(async () => {
  coppice = await startTestCoppice();
  [analyst, privacy, manager] = await Promise.all([
    coppice.signIn(ACCOUNTS.analyst),
    coppice.signIn(ACCOUNTS.privacy),
    coppice.signIn(ACCOUNTS.managerNorth),
  ]);
  // The invented Quillfern demo export, small; the run is trained but not yet put forward.
  const demo = await useDemoRuns(analyst, privacy, { rows: 400 });
  datasetId = demo.datasetId;
  runId = await demo.requestedRun(false);
}, 90_000);
afterAll(async () => {
  await coppice?.stop();
});

/** The queue as the privacy officer reads it, checked against the shared schema. */
async function publicationRequests(): Promise<PublicationQueueItem[]> {
  const res = await privacy.get('/api/review-queue');
  expect(res.status).toBe(200);
  return reviewQueueSchema
    .parse(res.body)
    .filter((item): item is PublicationQueueItem => item.kind === 'publication');
}

describe('publication requests in the review queue', () => {
  it('lists a requested run with its dataset, who asked and when, the note and the policy version', async () => {
    expect((await publicationRequests()).map((item) => item.id)).not.toContain(runId);
    const before = Date.now();
    const asked = await analyst
      .post(`/api/models/${runId}/publication-request`)
      .send({ comment: 'Weekend shifts lead the drivers; please look at the night crews' });
    expect(asked.status, JSON.stringify(asked.body)).toBe(200);

    const run = (await analyst.get(`/api/models/${runId}`)).body;
    const dataset = (await analyst.get(`/api/datasets/${datasetId}`)).body;
    const item = (await publicationRequests()).find((i) => i.id === runId);
    expect(item).toEqual({
      kind: 'publication',
      id: runId,
      datasetId,
      datasetName: dataset.name,
      requestedBy: ACCOUNTS.analyst,
      requestedAt: expect.any(String),
      note: 'Weekend shifts lead the drivers; please look at the night crews',
      policyVersion: run.policyVersion,
      needsReview: false,
    });
    const at = Date.parse(item!.requestedAt!);
    expect(at).toBeGreaterThanOrEqual(before - 1000);
    expect(at).toBeLessThanOrEqual(Date.now() + 1000);
  });

  it('is for privacy officers only: analysts and managers are refused', async () => {
    expect((await analyst.get('/api/review-queue')).status).toBe(403);
    expect((await manager.get('/api/review-queue')).status).toBe(403);
  });

  it('drops the request once the privacy officer sends the run back', async () => {
    const sent = await privacy
      .post(`/api/models/${runId}/send-back`)
      .send({ comment: 'Add a suggested action for overtime first' });
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect((await publicationRequests()).map((item) => item.id)).not.toContain(runId);
  });

  it('lists the run again when the analyst asks again, without the old comment', async () => {
    expect((await analyst.post(`/api/models/${runId}/publication-request`).send({})).status).toBe(200);
    const item = (await publicationRequests()).find((i) => i.id === runId);
    expect(item).toMatchObject({ requestedBy: ACCOUNTS.analyst, note: null });
  });

  it('drops the request as soon as the privacy officer publishes, and it stays gone once published', async () => {
    const published = await privacy.post(`/api/models/${runId}/publish`).send({});
    expect(published.status, JSON.stringify(published.body)).toBe(202);
    expect((await publicationRequests()).map((item) => item.id)).not.toContain(runId);
    expect((await waitForPublication(privacy, runId)).status).toBe('published');
    expect((await analyst.get(`/api/models/${runId}`)).body.publicationState).toBe('published');
    expect((await publicationRequests()).map((item) => item.id)).not.toContain(runId);
  }, 60_000);
});

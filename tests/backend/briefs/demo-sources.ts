import type request from 'supertest';
import { expect } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { loadDatasetColumns } from '../../../backend/src/modules/datasets/datasets.repository';
import type { PublicationResponse } from '../../../shared/briefs';
import type { ModelRunDetail } from '../../../shared/models';
import { demoAction } from './demo-inputs';

async function waitForRun(agent: request.Agent, id: string): Promise<ModelRunDetail> {
  for (let i = 0; i < 600; i++) {
    const res = await agent.get(`/api/models/${id}`);
    if (!['queued', 'running'].includes(res.body.status)) return res.body;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`model run ${id} did not finish`);
}

/** The privacy officer accepts the flagged proxies and approves the dataset under the policy in force. */
async function approve(privacy: request.Agent, datasetId: string): Promise<void> {
  const report = await privacy.get(`/api/datasets/${datasetId}/proxies`);
  for (const row of (report.body.rows ?? []) as {
    feature: string;
    blockedField: string;
    flagged: boolean;
  }[]) {
    if (!row.flagged) continue;
    await privacy.post(`/api/datasets/${datasetId}/proxies/decisions`).send({
      feature: row.feature,
      blockedField: row.blockedField,
      decision: 'accept',
      reason: 'Reviewed with the employee representatives',
    });
  }
  const approval = await privacy.post(`/api/datasets/${datasetId}/approval`).send({ decision: 'approve' });
  expect([200, 409], JSON.stringify(approval.body)).toContain(approval.status);
}

/**
 * The invented demo export uploaded and mapped by the analyst through the API, and model runs
 * approved by the privacy officer and trained by the model runs job, each driver with a suggested action, publication requested.
 */
export async function useDemoRuns(
  analyst: request.Agent,
  privacy: request.Agent,
  options: { rows?: number } = {},
) {
  const data = generateQuillfernExport({ rows: options.rows ?? 600 });
  const upload = await analyst
    .post('/api/datasets')
    .attach('file', Buffer.from(quillfernCsv(data), 'utf8'), 'quillfern.csv');
  expect(upload.status).toBe(201);
  const datasetId = upload.body.id as string;
  expect((await analyst.put(`/api/datasets/${datasetId}/mapping`).send(QUILLFERN_MAPPING)).status).toBe(200);
  const columns = await loadDatasetColumns(datasetId);
  const col = (name: string) => data.header.indexOf(name as never);
  return {
    datasetId,
    columns,
    /** what identifies a person: staff numbers, names, personal e-mails and the stored hashes */
    identifiers: [
      ...data.rows.flatMap((row) => [
        String(row[col('Staff No')]),
        String(row[col('Full Name')]),
        String(row[col('Personal Email')]),
      ]),
      ...columns.employeeKeys,
    ],
    protectedFields: columns.features.filter((f) => f.protectedCharacteristic !== null).map((f) => f.name),
    /** the file's columns holding protected characteristics, as a privacy officer would block them */
    protectedColumns: [
      ...new Set(
        columns.features
          .filter((f) => f.protectedCharacteristic !== null)
          .map((f) => f.derivedFrom ?? f.name),
      ),
    ],
    /** trains a run of the demo dataset; unless told otherwise, the analyst then asks to publish it */
    async requestedRun(request = true): Promise<string> {
      await approve(privacy, datasetId);
      const created = await analyst
        .post('/api/models')
        .send({ datasetId, folds: 2, pruning: 'none', maxDepth: 4, minLeaf: 25 });
      expect(created.status).toBe(202);
      const run = await waitForRun(analyst, created.body.id);
      expect(run.status).toBe('done');
      for (const driver of run.result!.drivers) {
        const res = await analyst
          .put(`/api/models/${run.id}/drivers/${encodeURIComponent(driver.feature)}/action`)
          .send({ text: demoAction(driver.feature) });
        expect(res.status).toBe(200);
      }
      if (request)
        expect((await analyst.post(`/api/models/${run.id}/publication-request`).send({})).status).toBe(200);
      return run.id;
    },
  };
}

/** Waits until the run's newest publication is no longer computing, and returns it. */
export async function waitForPublication(agent: request.Agent, runId: string): Promise<PublicationResponse> {
  for (let i = 0; i < 600; i++) {
    const list = (await agent.get(`/api/models/${runId}/publications`)).body as PublicationResponse[];
    if (list[0] && list[0].status !== 'computing') return list[0];
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the briefs were not computed in time');
}

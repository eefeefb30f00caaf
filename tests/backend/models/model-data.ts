import type request from 'supertest';
import { expect } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import type { DatasetMapping } from '../../../shared/datasets';
import type { ModelRunDetail } from '../../../shared/models';

/** Uploads and maps a small invented demo export through the real API; returns the dataset id. */
export async function mappedDataset(
  analyst: request.Agent,
  options: { rows?: number; seed?: number; mapping?: DatasetMapping } = {},
): Promise<string> {
  const csv = quillfernCsv(generateQuillfernExport({ rows: options.rows ?? 300, seed: options.seed ?? 7 }));
  const upload = await analyst
    .post('/api/datasets')
    .attach('file', Buffer.from(csv, 'utf8'), 'quillfern.csv');
  expect(upload.status, JSON.stringify(upload.body)).toBe(201);
  const mapped = await analyst
    .put(`/api/datasets/${upload.body.id}/mapping`)
    .send(options.mapping ?? QUILLFERN_MAPPING);
  expect(mapped.status, JSON.stringify(mapped.body)).toBe(200);
  return upload.body.id;
}

/**
 * The privacy officer's review through the real API: every flagged proxy accepted with a reason
 * (or blocked, when listed in `block`), then the dataset approved under the policy in force.
 */
export async function approveDataset(privacy: request.Agent, datasetId: string, block: string[] = []) {
  const report = await privacy.get(`/api/datasets/${datasetId}/proxies`);
  expect(report.status, JSON.stringify(report.body)).toBe(200);
  for (const row of report.body.rows as { feature: string; blockedField: string; flagged: boolean }[]) {
    if (!row.flagged) continue;
    const decided = await privacy.post(`/api/datasets/${datasetId}/proxies/decisions`).send({
      feature: row.feature,
      blockedField: row.blockedField,
      decision: block.includes(row.feature) ? 'block' : 'accept',
      reason: 'Reviewed with the employee representatives',
    });
    expect(decided.status, JSON.stringify(decided.body)).toBeLessThan(300);
  }
  const approval = await privacy.post(`/api/datasets/${datasetId}/approval`).send({ decision: 'approve' });
  expect(approval.status, JSON.stringify(approval.body)).toBe(200);
}

/** Polls a run until it has ended (done, failed or cancelled). */
export async function waitForRun(
  agent: request.Agent,
  id: string,
  timeoutMs = 30_000,
): Promise<ModelRunDetail> {
  const start = Date.now();
  for (;;) {
    const res = await agent.get(`/api/models/${id}`);
    expect(res.status).toBe(200);
    if (!['queued', 'running'].includes(res.body.status)) return res.body;
    if (Date.now() - start > timeoutMs) throw new Error(`run ${id} still ${res.body.status}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

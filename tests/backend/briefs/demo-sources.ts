import { randomUUID } from 'node:crypto';
import type request from 'supertest';
import { expect } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { fitTree } from '../../../backend/src/modeling/fit';
import { buildTable, type ColumnInput } from '../../../backend/src/modeling/table';
import { loadDatasetColumns } from '../../../backend/src/modules/datasets/datasets.repository';
import { type PublishableRun, setBriefSources } from '../../../backend/src/modules/teams/brief-sources';
import type { PublicationResponse } from '../../../shared/briefs';
import { demoAction } from './demo-inputs';

/**
 * The invented demo export uploaded and mapped by the analyst through the API, and model runs
 * trained on it by the engine (protected characteristics left out). Until model runs are in this
 * build, tests put those runs where publishing looks for them.
 */
export async function useDemoRuns(analyst: request.Agent, options: { rows?: number } = {}) {
  const data = generateQuillfernExport({ rows: options.rows ?? 600 });
  const upload = await analyst
    .post('/api/datasets')
    .attach('file', Buffer.from(quillfernCsv(data), 'utf8'), 'quillfern.csv');
  expect(upload.status).toBe(201);
  const datasetId = upload.body.id as string;
  expect((await analyst.put(`/api/datasets/${datasetId}/mapping`).send(QUILLFERN_MAPPING)).status).toBe(200);
  const columns = await loadDatasetColumns(datasetId);
  const allowed = columns.features.filter((f) => f.protectedCharacteristic === null);
  const table = buildTable(allowed as ColumnInput[]);
  const { tree } = fitTree(table, columns.labels, { maxDepth: 4, minLeaf: 25, k: 5 });
  const runs = new Map<string, PublishableRun>();
  const states: { runId: string; state: string }[] = [];
  setBriefSources({
    loadRun: async (id) => runs.get(id) ?? null,
    setPublicationState: async (runId, state) => {
      states.push({ runId, state });
      const run = runs.get(runId);
      if (run) run.publicationState = state;
    },
  });
  const col = (name: string) => data.header.indexOf(name as never);
  return {
    datasetId,
    columns,
    states,
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
    /** a run of the demo dataset whose publication the analyst has requested (or in `state`) */
    requestedRun(state = 'requested'): string {
      const id = randomUUID();
      runs.set(id, {
        id,
        datasetId,
        tree,
        drivers: allowed.map((f) => ({ feature: f.name, suggestedAction: demoAction(f.name) })),
        publicationState: state,
        policyVersion: 1,
      });
      return id;
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

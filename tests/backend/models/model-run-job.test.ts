import PgBoss from 'pg-boss';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerModelRunWorker } from '../../../backend/src/jobs/model-run.job';
import { claimModelRun } from '../../../backend/src/modules/models/models.repository';
import { trainClaimedRun, trainModelRun } from '../../../backend/src/modules/models/train-run';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { approveDataset, mappedDataset, waitForRun } from './model-data';

// No workers in the app process: the runs stay queued until a test starts one.
let coppice: TestCoppice;
let analyst: request.Agent;
let datasetId: string;
const workers: PgBoss[] = [];

beforeAll(async () => {
  coppice = await startTestCoppice({ RUN_WORKERS: 'false' });
  analyst = await coppice.signIn(ACCOUNTS.analyst);
  datasetId = await mappedDataset(analyst, { rows: 200, seed: 3 });
  await approveDataset(await coppice.signIn(ACCOUNTS.privacy), datasetId);
});
afterAll(async () => {
  for (const w of workers) await w.stop({ graceful: false, wait: true });
  await coppice?.stop();
});

async function queueRun(): Promise<string> {
  const res = await analyst.post('/api/models').send({ datasetId, folds: 2, maxDepth: 3, pruning: 'none' });
  expect(res.status).toBe(202);
  return res.body.id;
}

async function runRow(id: string) {
  const [row] = await coppice.sql<{ status: string; attempts: number; worker_name: string | null }>(
    'SELECT status, attempts, worker_name FROM model_runs WHERE id = $1',
    [id],
  );
  return row;
}

/** A second worker process, as `npm run worker` starts one, against the same PostgreSQL. */
async function startWorker(name: string): Promise<void> {
  const b = new PgBoss({ connectionString: coppice.databaseUrl, schema: 'pgboss', max: 2 });
  b.on('error', () => {});
  await b.start();
  workers.push(b);
  await registerModelRunWorker(b, name);
}

describe('the model run job', () => {
  it('keeps a run queued until a worker takes it, and refuses to publish it meanwhile', async () => {
    const id = await queueRun();
    await new Promise((r) => setTimeout(r, 300));
    expect((await analyst.get(`/api/models/${id}`)).body).toMatchObject({ status: 'queued', progress: 0 });
    const publish = await analyst.post(`/api/models/${id}/publication-request`).send({});
    expect(publish.status).toBe(409);
  });

  it('cancels a queued run at once, and no worker trains it afterwards', async () => {
    const id = await queueRun();
    const cancel = await analyst.post(`/api/models/${id}/cancel`);
    expect(cancel.status).toBe(200);
    expect(cancel.body).toEqual({ status: 'cancelled' });
    await trainModelRun(id, 'late-worker');
    expect(await runRow(id)).toMatchObject({ status: 'cancelled', attempts: 0, worker_name: null });
    expect((await analyst.post(`/api/models/${id}/cancel`)).status).toBe(409);
  });

  it('stops a running run when asked, and stores it as cancelled without a result', async () => {
    const id = await queueRun();
    const claimed = await claimModelRun(id, 'test-worker');
    expect(claimed?.status).toBe('running');
    const cancel = await analyst.post(`/api/models/${id}/cancel`);
    expect(cancel.body).toEqual({ status: 'running' });
    await trainClaimedRun(claimed!);
    const run = (await analyst.get(`/api/models/${id}`)).body;
    expect(run).toMatchObject({ status: 'cancelled', result: null });
  });

  it('with two workers, trains every run exactly once', async () => {
    const ids = [await queueRun(), await queueRun(), await queueRun()];
    await startWorker('worker-a');
    await startWorker('worker-b');
    for (const id of ids) expect((await waitForRun(analyst, id)).status).toBe('done');
    for (const id of ids) {
      const row = await runRow(id);
      expect(row.attempts).toBe(1);
      expect(['worker-a', 'worker-b']).toContain(row.worker_name);
    }
    // A job delivered again (a retry, a second queue entry) finds the run taken and does nothing.
    await trainModelRun(ids[0], 'worker-c');
    expect(await runRow(ids[0])).toMatchObject({ status: 'done', attempts: 1 });
  });
});

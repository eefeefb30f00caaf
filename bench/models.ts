// Model run benchmark: trains through the API (POST /api/models, then polling GET /api/models/:id)
// on the invented demo export (2,400 rows) and on a generated 100k-row export, with the default
// settings (5-fold cross-validation and pruning), and measures GET /api/health while the big run
// trains (the server and this client share one process).
//   npm run bench:models                  demo and 100k rows
//   npm run bench:models -- --rows 20000  another size instead of 100k
// Goals: demo run under 3 s end to end; 100k rows under 30 s; /api/health p95 under 50 ms.
import { parseArgs } from 'node:util';
import type request from 'supertest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../backend/src/demo/quillfern';
import { quillfernCsv } from '../backend/src/demo/quillfern-csv';
import { startOwnCluster } from '../tests/helpers/own-cluster';
import { signInAgent } from '../tests/helpers/sign-in';

const { values } = parseArgs({ options: { rows: { type: 'string', default: '100000' } } });
const bigRows = Number(values.rows) || 100_000;

/** Uploads and maps a generated export, then has the privacy officer approve it (nothing is blocked). */
async function mappedDataset(agent: request.Agent, privacy: request.Agent, rows: number): Promise<string> {
  const csv = quillfernCsv(generateQuillfernExport({ rows, seed: 1 }));
  const created = await agent.post('/api/datasets').attach('file', Buffer.from(csv, 'utf8'), 'bench.csv');
  if (created.status !== 201)
    throw new Error(`upload answered ${created.status}: ${created.text.slice(0, 300)}`);
  const mapped = await agent.put(`/api/datasets/${created.body.id}/mapping`).send(QUILLFERN_MAPPING);
  if (mapped.status !== 200)
    throw new Error(`mapping answered ${mapped.status}: ${mapped.text.slice(0, 300)}`);
  const approved = await privacy
    .post(`/api/datasets/${created.body.id}/approval`)
    .send({ decision: 'approve' });
  if (approved.status !== 200)
    throw new Error(`approval answered ${approved.status}: ${approved.text.slice(0, 300)}`);
  return created.body.id;
}

/** Starts a run with the defaults and polls it until it ends; returns seconds from POST to done. */
async function timedRun(agent: request.Agent, datasetId: string): Promise<{ seconds: number; auc: number }> {
  const started = performance.now();
  const res = await agent.post('/api/models').send({ datasetId });
  if (res.status !== 202)
    throw new Error(`POST /api/models answered ${res.status}: ${res.text.slice(0, 300)}`);
  for (;;) {
    const run = await agent.get(`/api/models/${res.body.id}`);
    if (run.body.status === 'done') {
      return { seconds: (performance.now() - started) / 1000, auc: run.body.result.metrics.auc };
    }
    if (run.body.status !== 'queued' && run.body.status !== 'running') {
      throw new Error(`the run ended ${run.body.status}: ${run.body.error}`);
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;
}

const own = await startOwnCluster('bench', { env: { LOG_LEVEL: 'warn' } });
const running = own.running;
const config = own.config;
try {
  const agent = await signInAgent(running, 'analyst@quillfern.example', config.localIdp?.demoPassword ?? '');
  const privacy = await signInAgent(
    running,
    'privacy@quillfern.example',
    config.localIdp?.demoPassword ?? '',
  );
  const demoId = await mappedDataset(agent, privacy, 2400);
  const demo = await timedRun(agent, demoId);
  console.log(
    `demo (2,400 rows)   run ${demo.seconds.toFixed(2)} s   AUC ${demo.auc.toFixed(3)}   goal < 3 s`,
  );

  const bigId = await mappedDataset(agent, privacy, bigRows);
  const latencies: number[] = [];
  let training = true;
  const probe = (async () => {
    while (training) {
      const t = performance.now();
      await fetch(`${running.url}/api/health`);
      latencies.push(performance.now() - t);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  const big = await timedRun(agent, bigId).finally(() => {
    training = false;
  });
  await probe;
  console.log(
    `${bigRows.toLocaleString('en-GB')} rows   run ${big.seconds.toFixed(2)} s   AUC ${big.auc.toFixed(3)}   goal < 30 s`,
  );
  console.log(
    `GET /api/health during training: ${latencies.length} calls, p50 ${percentile(latencies, 50).toFixed(1)} ms, p95 ${percentile(latencies, 95).toFixed(1)} ms, max ${Math.max(...latencies).toFixed(1)} ms   goal p95 < 50 ms`,
  );
} finally {
  await own.stop();
}

// For the benchmarks: walks a dataset through the real API to published team briefs (approval by
// the privacy officer, a model run, the analyst's publication request, publishing), as people do.
import request from 'supertest';

type Cookies = { analyst: string; privacy: string };

async function call(
  base: string,
  cookie: string,
  method: 'get' | 'post' | 'put',
  url: string,
  body?: object,
): Promise<request.Response> {
  const req = request(base)[method](url).set('cookie', cookie);
  const res = await (body ? req.send(body) : req);
  if (res.status >= 300)
    throw new Error(`${method.toUpperCase()} ${url} answered ${res.status}: ${res.text.slice(0, 300)}`);
  return res;
}

async function poll<T>(what: string, read: () => Promise<T | null>): Promise<T> {
  for (let i = 0; i < 1200; i++) {
    const value = await read();
    if (value !== null) return value;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what} did not finish in two minutes`);
}

/** Approves `datasetId` (accepting flagged proxies), trains a run on it and publishes its briefs; returns the run id. */
export async function publishDatasetBriefs(
  base: string,
  cookies: Cookies,
  datasetId: string,
): Promise<string> {
  const proxies = await call(base, cookies.privacy, 'get', `/api/datasets/${datasetId}/proxies`);
  for (const row of proxies.body.rows as { feature: string; blockedField: string; flagged: boolean }[]) {
    if (!row.flagged) continue;
    await call(base, cookies.privacy, 'post', `/api/datasets/${datasetId}/proxies/decisions`, {
      feature: row.feature,
      blockedField: row.blockedField,
      decision: 'accept',
      reason: 'Benchmark set-up',
    });
  }
  await call(base, cookies.privacy, 'post', `/api/datasets/${datasetId}/approval`, { decision: 'approve' });
  const created = await call(base, cookies.analyst, 'post', '/api/models', { datasetId });
  const runId = created.body.id as string;
  await poll('the model run', async () => {
    const run = await call(base, cookies.analyst, 'get', `/api/models/${runId}`);
    if (run.body.status === 'done') return true;
    if (run.body.status !== 'queued' && run.body.status !== 'running')
      throw new Error(`the model run ended ${run.body.status}: ${run.body.error}`);
    return null;
  });
  await call(base, cookies.analyst, 'post', `/api/models/${runId}/publication-request`, {});
  await call(base, cookies.privacy, 'post', `/api/models/${runId}/publish`, {});
  await poll('publishing', async () => {
    const [publication] = (await call(base, cookies.privacy, 'get', `/api/models/${runId}/publications`))
      .body;
    if (publication?.status === 'published') return true;
    if (publication && publication.status !== 'computing')
      throw new Error(`publishing ended ${publication.status}: ${publication.withdrawnReason}`);
    return null;
  });
  return runId;
}

import PgBoss from 'pg-boss';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../../backend/src/demo/quillfern';
import { quillfernXlsx } from '../../../backend/src/demo/quillfern-xlsx';
import { MAIL_QUEUE } from '../../../backend/src/jobs/mail.job';
import { sinkMessages } from '../../../backend/src/mail/mail-sink';
import { INLINE_MAX_BYTES } from '../../../backend/src/modules/datasets/run-intake';
import { ABANDONED_RUN_MESSAGE } from '../../../backend/src/modules/models/models.repository';
// @ts-expect-error: plain JavaScript helpers shared with the npm scripts
import { freePort } from '../../../scripts/lib/pg.mjs';
import { type CoppiceProcess, signInAcross, spawnCoppice } from '../../helpers/processes';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { approveDataset, mappedDataset, waitForRun } from '../models/model-data';

// The scale-out shape: two app processes and two worker processes against one PostgreSQL, behind
// one public URL. This test process runs the identity provider and the mail sink they all use.
let coppice: TestCoppice;
const apps: Array<CoppiceProcess & { url: string }> = [];
const workers: CoppiceProcess[] = [];

beforeAll(async () => {
  coppice = await startTestCoppice({ RUN_WORKERS: 'false' });
  const { config } = coppice;
  const shared = {
    NODE_ENV: 'test',
    DATABASE_URL: coppice.databaseUrl,
    APP_URL: config.appUrl,
    DATA_DIR: config.dataDir,
    SESSION_SECRET: config.sessionSecret,
    EMPLOYEE_ID_SECRET: config.employeeIdSecret,
    OIDC_ISSUER: config.oidc.issuer,
    OIDC_CLIENT_ID: config.oidc.clientId,
    OIDC_CLIENT_SECRET: config.oidc.clientSecret,
    SMTP_URL: `smtp://127.0.0.1:${config.mail.sinkPort}`,
  };
  const started = await Promise.all([
    ...[0, 1].map(async () => {
      const port = String(await freePort());
      const app = await spawnCoppice(
        'server',
        { ...shared, PORT: port, RUN_WORKERS: 'false', LOG_LEVEL: 'warn' },
        /Coppice is running at/,
      );
      return { ...app, url: `http://127.0.0.1:${port}` };
    }),
    ...[0, 1].map(() => spawnCoppice('worker', { ...shared, LOG_LEVEL: 'info' }, /"msg":"worker started"/)),
  ]);
  apps.push(started[0] as (typeof apps)[number], started[1] as (typeof apps)[number]);
  workers.push(started[2], started[3]);
}, 120_000);

afterAll(async () => {
  await Promise.all([...apps, ...workers].map((p) => p.stop()));
  await coppice?.stop();
});

describe('two app processes and two workers on one PostgreSQL', () => {
  it('keeps a session across both app processes: signed in at one, used and ended at the other', async () => {
    const [a, b] = apps;
    const { cookie } = await signInAcross(a.url, b.url, ACCOUNTS.privacy);
    for (const app of apps) {
      const me = await request(app.url).get('/api/me').set('cookie', cookie);
      expect(me.status, app.url).toBe(200);
      expect(me.body.email).toBe(ACCOUNTS.privacy);
    }

    const change = await request(a.url)
      .put('/api/policy')
      .set('cookie', cookie)
      .send({
        k: 8,
        blockedFields: ['Sex'],
        proxyThreshold: 0.5,
        retentionDays: 365,
        reason: 'scale-out check',
      });
    expect(change.status).toBe(200);
    const read = await request(b.url).get('/api/policy').set('cookie', cookie);
    expect(read.body.k).toBe(8);

    const out = await request(b.url)
      .post('/auth/logout')
      .set('cookie', cookie)
      .set('accept', 'application/json');
    expect(out.status).toBe(200);
    for (const app of apps)
      expect((await request(app.url).get('/api/me').set('cookie', cookie)).status).toBe(401);
  });

  it('runs each queued e-mail exactly once across the two workers', async () => {
    const boss = new PgBoss({ connectionString: coppice.databaseUrl, schema: 'pgboss', max: 2 });
    boss.on('error', () => {});
    await boss.start();
    const run = Math.random().toString(36).slice(2, 8);
    const subjects = Array.from({ length: 12 }, (_, i) => `scale-out ${run} #${i}`);
    try {
      for (const subject of subjects)
        await boss.send(MAIL_QUEUE, {
          to: ['manager.north@quillfern.example'],
          subject,
          text: 'invented test mail',
        });
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
    const mine = () => sinkMessages().filter((m) => m.subject.startsWith(`scale-out ${run} `));
    for (let i = 0; i < 120 && mine().length < subjects.length; i++)
      await new Promise((r) => setTimeout(r, 250));
    // A little longer, so that a job run twice would have arrived twice.
    await new Promise((r) => setTimeout(r, 1500));
    const got = mine()
      .map((m) => m.subject)
      .sort();
    expect(got).toEqual([...subjects].sort());
    const states = await coppice.sql<{ state: string; n: string }>(
      'SELECT state, count(*) AS n FROM pgboss.job WHERE name = $1 GROUP BY state',
      [MAIL_QUEUE],
    );
    expect(states).toEqual([{ state: 'completed', n: String(subjects.length) }]);
  });

  it('seeds the invented demo dataset once, though both app processes started at the same moment', async () => {
    const rows = await coppice.sql<{ n: string }>(
      "SELECT count(*) AS n FROM datasets WHERE name LIKE '%invented demo data%'",
    );
    expect(Number(rows[0].n)).toBe(1);
  });

  it('reads an uploaded workbook in a built app process (its intake and workbook-reader workers)', async () => {
    const [a] = apps;
    const { cookie } = await signInAcross(a.url, a.url, ACCOUNTS.analyst);
    // About 1 MB: above the size read on the request path, so both worker threads run.
    const bytes = Buffer.from(quillfernXlsx(generateQuillfernExport({ rows: 3000, seed: 5 })));
    expect(bytes.byteLength).toBeGreaterThan(INLINE_MAX_BYTES);
    const upload = await request(a.url)
      .post('/api/datasets')
      .set('cookie', cookie)
      .attach('file', bytes, 'quillfern.xlsx');
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    expect(upload.body.rowCount).toBe(3000);
    expect(upload.body.sheetName).toBe('Staff');
  });

  it('keeps both app processes answering after all of this', async () => {
    for (const app of apps) expect((await request(app.url).get('/api/health')).status).toBe(200);
    for (const p of [...apps, ...workers]) expect(p.child.exitCode).toBeNull();
  });
  it('trains each model run exactly once across the two workers', async () => {
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const datasetId = await mappedDataset(analyst, { rows: 300 });
    await approveDataset(await coppice.signIn(ACCOUNTS.privacy), datasetId);
    const ids: string[] = [];
    for (const seed of [1, 2, 3]) {
      const res = await analyst.post('/api/models').send({ datasetId, seed, folds: 3, maxDepth: 3 });
      expect(res.status).toBe(202);
      ids.push(res.body.id);
    }
    for (const id of ids) expect((await waitForRun(analyst, id, 90_000)).status).toBe('done');
    const rows = await coppice.sql<{ attempts: number }>(
      'SELECT attempts FROM model_runs WHERE id = ANY($1)',
      [ids],
    );
    expect(rows.map((r) => r.attempts)).toEqual([1, 1, 1]);
  });

  it('fails a run with a reason when its worker is killed mid-training, storing no half-written model', async () => {
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const datasetId = await mappedDataset(analyst, { rows: 1500, seed: 11 });
    await approveDataset(await coppice.signIn(ACCOUNTS.privacy), datasetId);
    const res = await analyst.post('/api/models').send({ datasetId, folds: 10, maxDepth: 12, minLeaf: 5 });
    expect(res.status).toBe(202);
    let owner: string | null = null;
    for (let i = 0; i < 600 && !owner; i++) {
      const [row] = await coppice.sql<{ status: string; worker_name: string | null }>(
        'SELECT status, worker_name FROM model_runs WHERE id = $1',
        [res.body.id],
      );
      if (row.status === 'running') owner = row.worker_name;
      else await new Promise((r) => setTimeout(r, 50));
    }
    expect(owner, 'a worker claimed the run').not.toBeNull();
    const victim = workers.find((w) => owner!.endsWith(`:${w.child.pid}`));
    expect(victim, `the claiming worker ${owner} is one of ours`).toBeDefined();
    victim!.child.kill('SIGKILL');

    const run = await waitForRun(analyst, res.body.id, 60_000);
    expect(run.status).toBe('failed');
    expect(run.error).toBe(ABANDONED_RUN_MESSAGE);
    const [stored] = await coppice.sql<{ result: unknown }>('SELECT result FROM model_runs WHERE id = $1', [
      res.body.id,
    ]);
    expect(stored.result).toBeNull();
  });
});

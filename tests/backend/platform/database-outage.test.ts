import pg from 'pg';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { logger } from '../../../backend/src/lib/logger';
import type { Running } from '../../../backend/src/runtime';
import { validCsv } from '../../helpers/hostile-files';
import { type OwnCluster, startOwnCluster } from '../../helpers/own-cluster';
import { signInAgent } from '../../helpers/sign-in';
import { ACCOUNTS, DEMO_PASSWORD } from '../../helpers/test-coppice';

// This file stops PostgreSQL in the middle of an upload, so it runs against a cluster of its own.
let own: OwnCluster;
let running: Running;
let analyst: request.Agent;

async function query<T extends pg.QueryResultRow>(text: string): Promise<T[]> {
  const client = new pg.Client({ connectionString: running.config.databaseUrl });
  await client.connect();
  try {
    return (await client.query<T>(text)).rows;
  } finally {
    await client.end();
  }
}

async function counts() {
  const [row] = await query<{ datasets: string; columns: string; audit: string }>(
    "SELECT (SELECT count(*) FROM datasets) AS datasets, (SELECT count(*) FROM dataset_columns) AS columns, (SELECT count(*) FROM audit_events WHERE action = 'dataset.uploaded') AS audit",
  );
  return row;
}

async function until(check: () => Promise<boolean>, tries = 200, ms = 50) {
  for (let i = 0; i < tries; i++) {
    if (await check().catch(() => false)) return true;
    await new Promise((r) => setTimeout(r, ms));
  }
  return false;
}

beforeAll(async () => {
  own = await startOwnCluster('outage');
  running = own.running;
  analyst = await signInAgent(running, ACCOUNTS.analyst, DEMO_PASSWORD);
});

afterAll(async () => {
  await own?.stop();
});

describe('PostgreSQL stopped in the middle of an upload', () => {
  it('answers 503 with a clear message and stores the upload not at all; the app recovers without a restart', async () => {
    expect(
      (await analyst.post('/api/datasets').attach('file', Buffer.from(validCsv()), 'one.csv')).status,
    ).toBe(201);
    const before = await counts();

    // Hold the column table so the upload stops inside its transaction, after the dataset row.
    const holder = new pg.Client({ connectionString: running.config.databaseUrl });
    holder.on('error', () => {});
    await holder.connect();
    await holder.query('BEGIN');
    await holder.query('LOCK TABLE dataset_columns IN SHARE ROW EXCLUSIVE MODE');
    const uploading = analyst
      .post('/api/datasets')
      .attach('file', Buffer.from(validCsv()), 'two.csv')
      .then((r) => r);
    const waiting = await until(async () => {
      const rows = await query<{ n: string }>(
        "SELECT count(*) AS n FROM pg_locks l JOIN pg_class c ON c.oid = l.relation WHERE c.relname = 'dataset_columns' AND NOT l.granted",
      );
      return Number(rows[0].n) > 0;
    });
    expect(waiting, 'the upload reached the column insert').toBe(true);

    // The outage is expected here: keep its error lines out of the test output.
    logger.level = 'fatal';
    own.stopPostgres();
    const res = await uploading;
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('database_unavailable');
    expect(res.body.error.message).toMatch(/Nothing was changed/);

    // While it is down: health says so, and signed-in calls get the same clear 503.
    expect((await analyst.get('/api/health')).status).toBe(503);
    const list = await analyst.get('/api/datasets');
    expect(list.status).toBe(503);
    expect(list.body.error.code).toBe('database_unavailable');

    own.startPostgres();
    expect(await until(async () => (await analyst.get('/api/health')).status === 200)).toBe(true);
    expect(await counts()).toEqual(before);
    logger.level = 'warn';

    // The same session still works, and the same upload now goes through whole.
    expect(await until(async () => (await analyst.get('/api/datasets')).status === 200, 40, 250)).toBe(true);
    const again = await analyst.post('/api/datasets').attach('file', Buffer.from(validCsv()), 'two.csv');
    expect(again.status).toBe(201);
    const detail = await analyst.get(`/api/datasets/${again.body.id}`);
    expect(detail.body.rowCount).toBe(again.body.rowCount);
    const after = await counts();
    expect(Number(after.datasets)).toBe(Number(before.datasets) + 1);
    expect(Number(after.audit)).toBe(Number(before.audit) + 1);
  });
});

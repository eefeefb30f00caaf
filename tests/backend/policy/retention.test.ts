import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { RETENTION_QUEUE } from '../../../backend/src/jobs/retention.job';
import { runRetention } from '../../../backend/src/modules/policy/retention.service';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let analyst: request.Agent;
const csv = Buffer.from(quillfernCsv(generateQuillfernExport({ rows: 60, seed: 3 })), 'utf8');
const DAY = 86_400_000;

beforeAll(async () => {
  coppice = await startTestCoppice();
  analyst = await coppice.signIn(ACCOUNTS.analyst);
});
afterAll(async () => {
  await coppice?.stop();
});

async function upload(): Promise<{ id: string; uploadedAt: number }> {
  const res = await analyst.post('/api/datasets').attach('file', csv, 'quillfern.csv');
  expect(res.status).toBe(201);
  const [row] = await coppice.sql<{ uploaded_at: Date }>('SELECT uploaded_at FROM datasets WHERE id = $1', [
    res.body.id,
  ]);
  return { id: res.body.id, uploadedAt: row!.uploaded_at.getTime() };
}

describe('the retention job', () => {
  it('deletes exactly the datasets older than the retention period, with their values, and records it', async () => {
    const older = await upload();
    await new Promise((r) => setTimeout(r, 50));
    const newer = await upload();
    const { retentionDays } = (await analyst.get('/api/policy')).body;

    expect((await runRetention()).deleted).toEqual([]);

    // A moment between the two datasets' due times.
    const now = new Date(older.uploadedAt + retentionDays * DAY + (newer.uploadedAt - older.uploadedAt) / 2);
    const result = await runRetention(now);
    expect(result.deleted).toEqual([older.id]);

    expect((await analyst.get(`/api/datasets/${older.id}`)).status).toBe(404);
    expect((await analyst.get(`/api/datasets/${newer.id}`)).status).toBe(200);
    const [{ n }] = await coppice.sql<{ n: number }>(
      'SELECT count(*)::int AS n FROM dataset_columns WHERE dataset_id = $1',
      [older.id],
    );
    expect(n).toBe(0);
    const [line] = await coppice.sql<{ actor_email: string | null; details: Record<string, unknown> }>(
      `SELECT actor_email, details FROM audit_events WHERE action = 'dataset.deleted' AND object_id = $1`,
      [older.id],
    );
    expect(line).toMatchObject({ actor_email: null, details: { reason: 'retention', retentionDays } });
  });

  it('is scheduled on the job queue', async () => {
    const rows = await coppice.sql<{ name: string; cron: string }>('SELECT name, cron FROM pgboss.schedule');
    expect(rows.map((r) => r.name)).toContain(RETENTION_QUEUE);
  });
});

import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../../backend/src/lib/config';
import { type Running, startCoppice } from '../../../backend/src/runtime';
import {
  ensureDatabase,
  ensurePostgres,
  freePort,
  initCluster,
  removeCluster,
  startCluster,
  stopCluster,
  // @ts-expect-error: plain JavaScript helpers shared with the npm scripts
} from '../../../scripts/lib/pg.mjs';

// This file stops and starts PostgreSQL, so it runs against a cluster of its own.
const bin = ensurePostgres();
const dir = path.join(mkdtempSync(path.join(os.tmpdir(), 'coppice-health-')), 'pg');
let running: Running;

beforeAll(async () => {
  const pgPort = await freePort();
  initCluster(bin, dir);
  startCluster(bin, dir, pgPort, { fast: true });
  ensureDatabase(bin, pgPort, 'coppice');
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: `postgres://coppice@127.0.0.1:${pgPort}/coppice`,
    PORT: String(await freePort()),
    IDP_PORT: String(await freePort()),
    SMTP_PORT: String(await freePort()),
    DATA_DIR: mkdtempSync(path.join(os.tmpdir(), 'coppice-data-')),
  });
  running = await startCoppice(config, { migrate: true, listen: false });
});

afterAll(async () => {
  await running?.stop();
  removeCluster(bin, dir);
});

describe('GET /api/health', () => {
  it('says ok while PostgreSQL answers', async () => {
    const res = await request(running.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('says db "down" with 503 while PostgreSQL is stopped, and other API calls get a 503 JSON error', async () => {
    stopCluster(bin, dir);
    const health = await request(running.app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.db).toBe('down');
    // A request that needs its session from the database gets a clear 503, not a crash.
    const me = await request(running.app).get('/api/me').set('cookie', 'coppice.sid=s%3Aabc.def');
    expect([401, 503]).toContain(me.status);
    expect(me.body.error).toBeDefined();
  });

  it('recovers without a restart when PostgreSQL is back', async () => {
    const port = Number(new URL(running.config.databaseUrl).port);
    startCluster(bin, dir, port, { fast: true });
    let status = 0;
    for (let i = 0; i < 40 && status !== 200; i++) {
      status = (await request(running.app).get('/api/health')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
  });
});

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../../backend/src/runtime';
import { type OwnCluster, startOwnCluster } from '../../helpers/own-cluster';

// This file stops and starts PostgreSQL, so it runs against a cluster of its own.
let own: OwnCluster;
let running: Running;

beforeAll(async () => {
  own = await startOwnCluster('health', { listen: false });
  running = own.running;
});

afterAll(async () => {
  await own?.stop();
});

describe('GET /api/health', () => {
  it('says ok while PostgreSQL answers', async () => {
    const res = await request(running.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('says db "down" with 503 while PostgreSQL is stopped, and other API calls get a 503 JSON error', async () => {
    own.stopPostgres();
    const health = await request(running.app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.db).toBe('down');
    // A request that needs its session from the database gets a clear 503, not a crash.
    const me = await request(running.app).get('/api/me').set('cookie', 'coppice.sid=s%3Aabc.def');
    expect([401, 503]).toContain(me.status);
    expect(me.body.error).toBeDefined();
  });

  it('recovers without a restart when PostgreSQL is back', async () => {
    own.startPostgres();
    let status = 0;
    for (let i = 0; i < 40 && status !== 200; i++) {
      status = (await request(running.app).get('/api/health')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
  });
});

import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import type request from 'supertest';
import { loadConfig } from '../../backend/src/lib/config';
import { type Running, startCoppice } from '../../backend/src/runtime';
// @ts-expect-error: plain JavaScript helpers shared with the npm scripts
import { freePort } from '../../scripts/lib/pg.mjs';
import { signInAgent } from './sign-in';

export const DEMO_PASSWORD = 'quillfern-demo';
export const ACCOUNTS = {
  analyst: 'analyst@quillfern.example',
  privacy: 'privacy@quillfern.example',
  managerNorth: 'manager.north@quillfern.example',
  managerSouth: 'manager.south@quillfern.example',
  lead: 'lead@quillfern.example',
} as const;

export type TestCoppice = Running & {
  databaseUrl: string;
  /** A supertest agent signed in through the real local identity provider. */
  signIn: (email: string, password?: string) => Promise<request.Agent>;
  /** Runs SQL directly against this test's own database (for checks, never for set-up shortcuts). */
  sql: <T extends pg.QueryResultRow = Record<string, unknown>>(
    text: string,
    values?: unknown[],
  ) => Promise<T[]>;
};

function adminUrl(): string {
  const url = process.env.TEST_PG_ADMIN_URL;
  if (!url)
    throw new Error('TEST_PG_ADMIN_URL is not set: run the tests with npm test or vitest (global set-up)');
  return url;
}

/**
 * A whole Coppice for one test file: its own database (copied from the migrated template), its own
 * local identity provider, mail sink and HTTP port. Call `stop()` in afterAll.
 */
export async function startTestCoppice(env: Record<string, string> = {}): Promise<TestCoppice> {
  const name = `coppice_t_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl() });
  await admin.connect();
  for (let attempt = 0; ; attempt++) {
    try {
      await admin.query(`CREATE DATABASE ${name} TEMPLATE coppice_template`);
      break;
    } catch (error) {
      // Two files copying the template at the same moment: wait and try again.
      if (attempt > 20 || !/being accessed by other users/.test((error as Error).message)) throw error;
      await new Promise((r) => setTimeout(r, 100 + Math.random() * 200));
    }
  }
  await admin.end();
  const databaseUrl = adminUrl().replace(/\/[^/]*$/, `/${name}`);
  const [port, idpPort, smtpPort] = [await freePort(), await freePort(), await freePort()];
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    IDP_PORT: String(idpPort),
    SMTP_PORT: String(smtpPort),
    DATA_DIR: mkdtempSync(path.join(os.tmpdir(), 'coppice-data-')),
    LOG_LEVEL: 'warn',
    ...env,
  });
  const running = await startCoppice(config, { migrate: false, listen: true });
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  return {
    ...running,
    databaseUrl,
    signIn: (email, password = DEMO_PASSWORD) => signInAgent(running, email, password),
    sql: async (text, values) => (await pool.query(text, values as unknown[])).rows,
    stop: async () => {
      await pool.end();
      await running.stop();
      const cleanup = new pg.Client({ connectionString: adminUrl() });
      await cleanup.connect();
      await cleanup.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await cleanup.end();
    },
  };
}

import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { startBoss, stopBoss } from '../backend/src/jobs/boss';
import { QUEUES } from '../backend/src/jobs/registry';
import { createDataSource } from '../backend/src/lib/db';
import { runMigrations } from '../backend/src/runtime';
// @ts-expect-error: plain JavaScript helpers shared with the npm scripts
import { ensurePostgres, freePort, initCluster, removeCluster, startCluster } from '../scripts/lib/pg.mjs';

/**
 * Once per test run: a PostgreSQL cluster (the one `npm test` started, or a throw-away one of our
 * own) and a migrated template database from which every test file copies its own database.
 */
export default async function setup() {
  let teardownCluster: (() => void) | null = null;
  if (!process.env.TEST_PG_ADMIN_URL) {
    const bin = ensurePostgres();
    const dir = path.join(mkdtempSync(path.join(os.tmpdir(), 'coppice-vitest-')), 'pg');
    const port = await freePort();
    initCluster(bin, dir);
    startCluster(bin, dir, port, { fast: true });
    process.env.TEST_PG_ADMIN_URL = `postgres://postgres@127.0.0.1:${port}/postgres`;
    teardownCluster = () => removeCluster(bin, dir);
  }
  const admin = new pg.Client({ connectionString: process.env.TEST_PG_ADMIN_URL });
  await admin.connect();
  await admin.query('DROP DATABASE IF EXISTS coppice_template');
  await admin.query('CREATE DATABASE coppice_template');
  await admin.end();

  const templateUrl = process.env.TEST_PG_ADMIN_URL.replace(/\/[^/]*$/, '/coppice_template');
  const dataSource = createDataSource(templateUrl);
  await dataSource.initialize();
  await runMigrations(dataSource);
  await dataSource.destroy();
  // pg-boss's own schema, so each test database starts with it.
  await startBoss(templateUrl, QUEUES);
  await stopBoss();

  return () => {
    teardownCluster?.();
  };
}

// Generates or checks TypeORM migrations against a throw-away PostgreSQL cluster.
//   npm run migration:generate -- <name>   writes backend/src/migrations/<timestamp>-<name>.ts
//   npm run migration:check                fails when the entities differ from the migrations
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import {
  ensureDatabase,
  ensurePostgres,
  freePort,
  initCluster,
  log,
  removeCluster,
  startCluster,
} from './lib/pg.mjs';

const [mode, name] = process.argv.slice(2);
if (!['generate', 'check'].includes(mode) || (mode === 'generate' && !name)) {
  console.error('usage: node scripts/migrations.mjs generate <name> | check');
  process.exit(2);
}

const bin = ensurePostgres();
const dir = mkdtempSync(path.join(os.tmpdir(), 'coppice-migrate-'));
const port = await freePort();
let status = 1;
try {
  initCluster(bin, path.join(dir, 'pg'));
  startCluster(bin, path.join(dir, 'pg'), port, { fast: true });
  ensureDatabase(bin, port, 'coppice');
  const env = { ...process.env, DATABASE_URL: `postgres://coppice@127.0.0.1:${port}/coppice` };
  const typeorm = (...args) =>
    spawnSync('npx', ['tsx', './node_modules/typeorm/cli.js', ...args, '-d', 'backend/src/data-source.ts'], {
      stdio: 'inherit',
      env,
    }).status;
  if (typeorm('migration:run') !== 0) throw new Error('migration:run failed');
  status =
    mode === 'generate'
      ? typeorm('migration:generate', `backend/src/migrations/${name}`, '--pretty')
      : typeorm('migration:generate', 'backend/src/migrations/unused', '--check');
  if (mode === 'check' && status !== 0)
    log('The entities differ from the migrations: run npm run migration:generate -- <name>.');
} finally {
  removeCluster(bin, path.join(dir, 'pg'));
}
process.exit(status);

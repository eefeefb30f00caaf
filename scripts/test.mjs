// `npm test`: the same set-up as `npm start`, for a throw-away PostgreSQL cluster of its own, then
// every check: lint, type-check, migrations in step with the entities, build, and all tests
// (unit, API and the browser suite). Extra arguments go to vitest (e.g. `npm test -- tests/backend/auth`).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  aptInstall,
  ensureDatabase,
  ensureNodeModules,
  ensurePostgres,
  freePort,
  initCluster,
  log,
  removeCluster,
  startCluster,
} from './lib/pg.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const started = Date.now();
const vitestArgs = process.argv.slice(2);

ensureNodeModules(root);
const bin = ensurePostgres();
// Debian's Chromium for the browser suite. (The scikit-learn reference values are committed
// fixtures made by tests/fixtures/make-sklearn-fixtures.py; only `npm run bench` needs scikit-learn.)
if (!existsSync('/usr/bin/chromium')) aptInstall(['chromium']);

const dir = path.join(mkdtempSync(path.join(os.tmpdir(), 'coppice-test-')), 'pg');
const port = await freePort();
initCluster(bin, dir);
startCluster(bin, dir, port, { fast: true });
log(`throw-away PostgreSQL on 127.0.0.1:${port}`);
const adminUrl = `postgres://postgres@127.0.0.1:${port}/postgres`;

const env = {
  ...process.env,
  NODE_ENV: 'test',
  TEST_PG_ADMIN_URL: adminUrl,
  LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
};
const steps = [];
function step(name, cmd, args, extraEnv = {}) {
  const t0 = Date.now();
  log(`${name}…`);
  const result = spawnSync(cmd, args, { stdio: 'inherit', env: { ...env, ...extraEnv } });
  const seconds = ((Date.now() - t0) / 1000).toFixed(1);
  steps.push(`${result.status === 0 ? 'ok  ' : 'FAIL'} ${name} (${seconds} s)`);
  return result.status === 0;
}

let ok = true;
let counts = null;
try {
  if (vitestArgs.length === 0) {
    ok = step('lint (biome)', 'npx', ['biome', 'check', '.']) && ok;
    ok = step('type-check (tsc)', 'npx', ['tsc', '--noEmit', '-p', '.']) && ok;
    ensureDatabase(bin, port, 'coppice');
    ok =
      step('migrations match the entities', 'npx', ['tsx', 'scripts/migration-check.ts'], {
        DATABASE_URL: `postgres://coppice@127.0.0.1:${port}/coppice`,
      }) && ok;
    ok = step('build the web app (vite)', 'npx', ['vite', 'build', '--logLevel', 'warn']) && ok;
  }
  // The tests that start Coppice processes (scale-out) run the server as production does.
  ok = step('build the server (esbuild)', process.execPath, ['scripts/build-server.mjs']) && ok;
  const report = path.join(path.dirname(dir), 'vitest-report.json');
  ok =
    step('tests (vitest: node, web, e2e)', 'npx', [
      'vitest',
      'run',
      '--reporter=default',
      '--reporter=json',
      `--outputFile.json=${report}`,
      ...vitestArgs,
    ]) && ok;
  if (existsSync(report)) {
    const results = JSON.parse(readFileSync(report, 'utf8'));
    counts = {
      passed: results.numPassedTests,
      failed: results.numFailedTests,
      skipped: results.numPendingTests + results.numTodoTests,
    };
  }
} finally {
  removeCluster(bin, dir);
}
log(
  `summary after ${((Date.now() - started) / 1000).toFixed(0)} s:\n${steps.map((s) => `  ${s}`).join('\n')}`,
);
if (counts)
  process.stdout.write(`${counts.passed} passed, ${counts.failed} failed, ${counts.skipped} skipped\n`);
process.exit(ok ? 0 : 1);

// `npm start`: everything from a fresh clone to a running Coppice, with no other step.
// Dependency-free on purpose: it runs before node_modules exists.
import { spawn, spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  ensureDatabase,
  ensureNodeModules,
  ensurePostgres,
  initCluster,
  log,
  startCluster,
  stopCluster,
} from './lib/pg.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const started = Date.now();

ensureNodeModules(root);
const production = process.env.NODE_ENV === 'production';
let bin = null;
let dataDir = null;
let weStartedPg = false;
const env = { ...process.env };

if (!process.env.DATABASE_URL) {
  if (production) {
    console.error(
      'NODE_ENV=production needs DATABASE_URL; npm start only runs a local PostgreSQL outside production.',
    );
    process.exit(78);
  }
  const port = Number(process.env.PGPORT ?? 55432);
  bin = ensurePostgres();
  dataDir = path.join(root, '.data', 'pg');
  if (initCluster(bin, dataDir)) log(`created a PostgreSQL cluster in .data/pg`);
  weStartedPg = startCluster(bin, dataDir, port);
  log(
    weStartedPg
      ? `PostgreSQL started on 127.0.0.1:${port}`
      : `PostgreSQL already running on 127.0.0.1:${port}`,
  );
  ensureDatabase(bin, port, 'coppice');
  env.DATABASE_URL = `postgres://coppice@127.0.0.1:${port}/coppice`;
}

if (process.env.SKIP_BUILD !== '1') {
  log('building the web app');
  const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit', env });
  if (build.status !== 0) process.exit(build.status ?? 1);
}
// The server runs as built JavaScript, as in production (a fraction of a second to build).
const serverBuild = spawnSync(process.execPath, ['scripts/build-server.mjs'], { stdio: 'inherit', env });
if (serverBuild.status !== 0) process.exit(serverBuild.status ?? 1);

log(`set-up took ${((Date.now() - started) / 1000).toFixed(1)} s; starting the server`);
const server = spawn(process.execPath, ['--enable-source-maps', 'dist/server/server.js'], {
  stdio: 'inherit',
  env,
});

let stopping = false;
function stop(signal) {
  if (stopping) return;
  stopping = true;
  if (server.exitCode === null) server.kill(signal);
}
process.on('SIGINT', () => stop('SIGINT'));
process.on('SIGTERM', () => stop('SIGTERM'));

server.on('exit', (code) => {
  if (weStartedPg && bin && dataDir) {
    log('stopping PostgreSQL');
    try {
      stopCluster(bin, dataDir);
    } catch (error) {
      console.error(error.message);
    }
  }
  process.exit(code ?? 0);
});

// Dependency-free helpers that install, create, start and stop a project-local PostgreSQL cluster.
// Used by `npm start`, `npm test` and the migration script; plain Node so they run before `npm ci`.
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

export function log(message) {
  process.stdout.write(`[coppice] ${message}\n`);
}

function run(cmd, args, options = {}) {
  const result = spawnSync(cmd, args, {
    stdio: options.quiet ? 'pipe' : 'inherit',
    encoding: 'utf8',
    ...options,
  });
  if (result.status !== 0) {
    const output = options.quiet ? `\n${result.stdout ?? ''}${result.stderr ?? ''}` : '';
    throw new Error(`${cmd} ${args.join(' ')} failed (exit ${result.status})${output}`);
  }
  return result.stdout ?? '';
}

export function isRoot() {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

/** The newest PostgreSQL server binary folder from Debian's packages, or null. */
export function findPgBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

let aptUpdated = false;
/** Installs Debian packages that are missing (needs root). */
export function aptInstall(packages) {
  if (!isRoot()) throw new Error(`Please install these Debian packages first: ${packages.join(' ')}`);
  if (!aptUpdated) {
    log('apt-get update');
    run('apt-get', ['update', '-qq']);
    aptUpdated = true;
  }
  log(`apt-get install ${packages.join(' ')}`);
  run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], {
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

export function ensurePostgres() {
  let bin = findPgBin();
  if (!bin) {
    log('PostgreSQL server binaries not found: installing Debian package postgresql');
    aptInstall(['postgresql']);
    bin = findPgBin();
    if (!bin) throw new Error('PostgreSQL was installed but no initdb was found under /usr/lib/postgresql');
  }
  return bin;
}

function asPostgres(cmd, args, options = {}) {
  if (isRoot()) return run('runuser', ['-u', 'postgres', '--', cmd, ...args], options);
  return run(cmd, args, options);
}

/** Creates the cluster folder (owned by the postgres user when we are root) if it has no cluster yet. */
export function initCluster(bin, dataDir) {
  if (existsSync(path.join(dataDir, 'PG_VERSION'))) return false;
  mkdirSync(dataDir, { recursive: true });
  if (isRoot()) {
    // The postgres system user must be able to reach the folder; its parents may be root-only.
    let dir = path.dirname(path.resolve(dataDir));
    while (dir !== '/' && dir.length > 1) {
      try {
        execFileSync('chmod', ['o+x', dir]);
      } catch {
        // A parent we cannot change: initdb will say so.
      }
      dir = path.dirname(dir);
    }
    run('chown', ['-R', 'postgres:postgres', dataDir]);
  }
  chmodSync(dataDir, 0o700);
  asPostgres(
    path.join(bin, 'initdb'),
    ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'],
    { quiet: true },
  );
  return true;
}

export function isRunning(bin, dataDir) {
  const result = isRoot()
    ? spawnSync('runuser', ['-u', 'postgres', '--', path.join(bin, 'pg_ctl'), '-D', dataDir, 'status'], {
        encoding: 'utf8',
      })
    : spawnSync(path.join(bin, 'pg_ctl'), ['-D', dataDir, 'status'], { encoding: 'utf8' });
  return result.status === 0;
}

export function startCluster(bin, dataDir, port, { fast = false } = {}) {
  if (isRunning(bin, dataDir)) return false;
  const opts = [`-c listen_addresses=127.0.0.1`, `-p ${port}`, '-k /tmp', '-c max_connections=200'];
  if (fast) opts.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
  asPostgres(
    path.join(bin, 'pg_ctl'),
    ['-D', dataDir, '-l', path.join(dataDir, 'server.log'), '-w', '-t', '60', '-o', opts.join(' '), 'start'],
    { quiet: true },
  );
  return true;
}

export function stopCluster(bin, dataDir) {
  if (!isRunning(bin, dataDir)) return;
  asPostgres(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { quiet: true });
}

export function psql(bin, port, sql, database = 'postgres') {
  return run(
    path.join(bin, 'psql'),
    [
      '-h',
      '127.0.0.1',
      '-p',
      String(port),
      '-U',
      'postgres',
      '-d',
      database,
      '-v',
      'ON_ERROR_STOP=1',
      '-tAc',
      sql,
    ],
    { quiet: true },
  ).trim();
}

/** Creates role and database `name` (owner of the database) unless they exist. */
export function ensureDatabase(bin, port, name) {
  if (psql(bin, port, `SELECT 1 FROM pg_roles WHERE rolname = '${name}'`) !== '1') {
    psql(bin, port, `CREATE ROLE ${name} LOGIN CREATEDB`);
  }
  if (psql(bin, port, `SELECT 1 FROM pg_database WHERE datname = '${name}'`) !== '1') {
    psql(bin, port, `CREATE DATABASE ${name} OWNER ${name}`);
  }
}

export function removeCluster(bin, dataDir) {
  try {
    stopCluster(bin, dataDir);
  } finally {
    rmSync(dataDir, { recursive: true, force: true });
  }
}

/** A TCP port nobody listens on right now (the kernel picks it). */
export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** Installs npm dependencies when node_modules is missing or older than the lock file. */
export function ensureNodeModules(root) {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  if (existsSync(marker)) return;
  log('installing npm dependencies (npm ci)');
  run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
}

import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { type Config, loadConfig } from '../../backend/src/lib/config';
import { type Running, startCoppice, startLocalServices } from '../../backend/src/runtime';
// @ts-expect-error: a plain JavaScript build script
import { buildServer } from '../../scripts/build-server.mjs';
import {
  ensureDatabase,
  ensurePostgres,
  freePort,
  initCluster,
  removeCluster,
  startCluster,
  stopCluster,
  // @ts-expect-error: plain JavaScript helpers shared with the npm scripts
} from '../../scripts/lib/pg.mjs';
import { type CoppiceProcess, spawnCoppice } from './processes';

export type OwnCluster = {
  running: Running;
  config: Config;
  /** stops PostgreSQL under the running app (an outage) */
  stopPostgres: () => void;
  /** starts it again on the same port */
  startPostgres: () => void;
  /** the postmaster's data directory (its postmaster.pid names the server process) */
  dataDir: string;
  /** stops the app and removes the cluster */
  stop: () => Promise<void>;
};

/**
 * A Coppice on a PostgreSQL cluster of its own, for tests that stop the database and for the
 * benchmarks: the shared test cluster must never go down under other files.
 */
export async function startOwnCluster(
  name: string,
  options: { listen?: boolean; env?: Record<string, string> } = {},
): Promise<OwnCluster> {
  const bin = ensurePostgres();
  const dataDir = path.join(mkdtempSync(path.join(os.tmpdir(), `coppice-${name}-`)), 'pg');
  const pgPort = await freePort();
  initCluster(bin, dataDir);
  startCluster(bin, dataDir, pgPort, { fast: true });
  ensureDatabase(bin, pgPort, 'coppice');
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: `postgres://coppice@127.0.0.1:${pgPort}/coppice`,
    PORT: String(await freePort()),
    IDP_PORT: String(await freePort()),
    SMTP_PORT: String(await freePort()),
    DATA_DIR: mkdtempSync(path.join(os.tmpdir(), `coppice-${name}-data-`)),
    ...options.env,
  });
  let running: Running;
  try {
    running = await startCoppice(config, { migrate: true, listen: options.listen ?? true });
  } catch (error) {
    removeCluster(bin, dataDir);
    throw error;
  }
  return {
    running,
    config,
    dataDir,
    stopPostgres: () => stopCluster(bin, dataDir),
    startPostgres: () => startCluster(bin, dataDir, pgPort, { fast: true }),
    stop: async () => {
      await running.stop();
      removeCluster(bin, dataDir);
    },
  };
}

/**
 * The built app server as a process of its own (as `npm run serve` runs it, freshly built) on a
 * PostgreSQL cluster of its own, for benchmarks that measure the server apart from the load they
 * put on it. As in production, the identity provider and the mail server are not part of the
 * measured process: the local ones run in the calling process, and the server is pointed at them.
 */
export async function spawnOnOwnCluster(
  name: string,
  env: Record<string, string> = {},
): Promise<{ url: string; server: CoppiceProcess; dataDir: string; stop: () => Promise<void> }> {
  await buildServer();
  const bin = ensurePostgres();
  const root = mkdtempSync(path.join(os.tmpdir(), `coppice-${name}-`));
  const dataDir = path.join(root, 'pg');
  const pgPort = await freePort();
  initCluster(bin, dataDir);
  startCluster(bin, dataDir, pgPort, { fast: true });
  ensureDatabase(bin, pgPort, 'coppice');
  const port = await freePort();
  const serverEnv = {
    NODE_ENV: 'development',
    DATABASE_URL: `postgres://coppice@127.0.0.1:${pgPort}/coppice`,
    PORT: String(port),
    IDP_PORT: String(await freePort()),
    SMTP_PORT: String(await freePort()),
    DATA_DIR: path.join(root, 'data'),
    LOG_LEVEL: 'warn',
    ...env,
  };
  // The same data folder gives both sides the same local secrets (client secret, cookie keys).
  const config = loadConfig(serverEnv);
  let local: Running['local'] = {};
  let server: CoppiceProcess;
  const stopLocal = async () => {
    await local.mailSink?.stop();
    await local.idp?.stop();
  };
  try {
    local = await startLocalServices(config);
    server = await spawnCoppice(
      'server',
      {
        ...serverEnv,
        OIDC_ISSUER: config.oidc.issuer,
        OIDC_CLIENT_SECRET: config.oidc.clientSecret,
        SMTP_URL: `smtp://127.0.0.1:${config.mail.sinkPort}`,
      },
      /Coppice is running at/,
      180_000,
    );
  } catch (error) {
    await stopLocal();
    removeCluster(bin, dataDir);
    throw error;
  }
  return {
    url: `http://127.0.0.1:${port}`,
    server,
    dataDir,
    stop: async () => {
      await server.stop();
      await stopLocal();
      removeCluster(bin, dataDir);
    },
  };
}

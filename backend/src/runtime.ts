import type { Server } from 'node:http';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { createApp } from './app';
import { seedDemo } from './demo/seed';
import { startLocalIdp } from './idp/local-idp';
import { boss, startBoss, stopBoss } from './jobs/boss';
import { QUEUES, registerWorkers } from './jobs/registry';
import { type Config, localIdpCookieKey } from './lib/config';
import { createDataSource, setDataSource } from './lib/db';
import { createHttpServer } from './lib/http-server';
import { logger } from './lib/logger';
import { startMailSink } from './mail/mail-sink';
import { configureMailer } from './mail/mailer';

export type Running = {
  config: Config;
  app: ReturnType<typeof createApp>;
  dataSource: DataSource;
  url: string;
  /** The local identity provider and mail sink, when this process runs them (fault tests stop them). */
  local: { idp?: { stop: () => Promise<void> }; mailSink?: { stop: () => Promise<void> } };
  stop: () => Promise<void>;
};

export type StartOptions = {
  /** Run migrations before serving (with an advisory lock, so several processes may start at once). */
  migrate?: boolean;
  /** Seed the invented demo organisation (development and demo only). */
  seed?: boolean;
  /** Listen on config.port; false for supertest-only use. */
  listen?: boolean;
  /** Start the local identity provider and mail sink where the config asks for them. */
  localServices?: boolean;
};

const MIGRATION_LOCK = 7_460_312;

const SEED_LOCK = 7_460_313;

/** Runs `work` while holding a PostgreSQL advisory lock, so that processes starting together take turns. */
async function withAdvisoryLock(dataSource: DataSource, lock: number, work: () => Promise<void>) {
  const runner = dataSource.createQueryRunner();
  await runner.connect();
  try {
    await runner.query('SELECT pg_advisory_lock($1)', [lock]);
    await work();
  } finally {
    await runner.query('SELECT pg_advisory_unlock($1)', [lock]).catch(() => {});
    await runner.release();
  }
}

export async function runMigrations(dataSource: DataSource): Promise<void> {
  await withAdvisoryLock(dataSource, MIGRATION_LOCK, async () => {
    await dataSource.runMigrations({ transaction: 'each' });
  });
}

/**
 * The local identity provider and mail sink, where the config asks for them (development, tests
 * and the demo; never in production). Benchmarks run them outside the server they measure.
 */
export async function startLocalServices(config: Config): Promise<Running['local']> {
  const local: Running['local'] = {};
  if (config.localIdp) {
    local.idp = await startLocalIdp({
      port: config.localIdp.port,
      clientId: config.oidc.clientId,
      clientSecret: config.oidc.clientSecret,
      redirectUris: [`${config.appUrl}/auth/callback`],
      postLogoutRedirectUris: [`${config.appUrl}/`],
      password: config.localIdp.demoPassword,
      cookieKey: localIdpCookieKey(config),
      dataDir: config.dataDir,
    });
  }
  if (config.mail.sinkPort !== null) {
    try {
      local.mailSink = await startMailSink(config.mail.sinkPort);
    } catch (error) {
      await local.idp?.stop();
      throw error;
    }
  }
  return local;
}

/** Starts everything one Coppice process needs, in order, and returns a handle that stops it all. */
export async function startCoppice(config: Config, options: StartOptions = {}): Promise<Running> {
  const { migrate = true, seed = false, listen = true, localServices = true } = options;
  const stops: Array<() => Promise<void>> = [];
  const stopAll = async () => {
    for (const stop of stops.reverse()) {
      await stop().catch((error) => logger.warn({ err: error }, 'stopping a part failed'));
    }
  };

  const local: Running['local'] = {};
  try {
    let mailSink = false;
    if (localServices) {
      Object.assign(local, await startLocalServices(config));
      if (local.idp) stops.push(local.idp.stop);
      if (local.mailSink) {
        stops.push(local.mailSink.stop);
        mailSink = true;
      }
    }
    configureMailer(config);

    const dataSource = createDataSource(config.databaseUrl);
    await dataSource.initialize();
    setDataSource(dataSource);
    stops.push(async () => {
      setDataSource(null);
      await dataSource.destroy();
    });
    if (migrate) await runMigrations(dataSource);

    await startBoss(config.databaseUrl, QUEUES);
    stops.push(stopBoss);
    if (config.runWorkers) await registerWorkers(boss());

    if (seed) await withAdvisoryLock(dataSource, SEED_LOCK, () => seedDemo(config));

    const sessionPool = new pg.Pool({
      connectionString: config.databaseUrl,
      max: 10,
      connectionTimeoutMillis: 5000,
    });
    sessionPool.on('error', (error) => logger.warn({ err: error }, 'session pool error'));
    stops.push(() => sessionPool.end());

    const app = createApp({ config, sessionPool, mailSink });
    let url = config.appUrl;
    if (listen) {
      const server: Server = await new Promise((resolve, reject) => {
        const s = createHttpServer(app);
        s.on('error', reject);
        s.listen(config.port, config.host, () => resolve(s));
      });
      server.keepAliveTimeout = 65_000;
      stops.push(
        () =>
          new Promise<void>((resolve) => {
            server.close(() => resolve());
            server.closeIdleConnections();
            setTimeout(() => server.closeAllConnections(), 5000).unref();
          }),
      );
      const address = server.address();
      if (address && typeof address === 'object') url = `http://${config.host}:${address.port}`;
    }
    return { config, app, dataSource, url, local, stop: stopAll };
  } catch (error) {
    await stopAll();
    throw error;
  }
}

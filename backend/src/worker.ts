import { boss, startBoss, stopBoss } from './jobs/boss';
import { QUEUES, registerWorkers } from './jobs/registry';
import { ConfigError, loadConfig } from './lib/config';
import { createDataSource, setDataSource } from './lib/db';
import { logger } from './lib/logger';
import { configureMailer } from './mail/mailer';
import { runMigrations } from './runtime';

// `npm run worker`: a process that only runs background jobs (model runs, briefs, e-mail), for
// scale-out beside one or more app processes against the same PostgreSQL. A job runs exactly once.
async function main() {
  const config = loadConfig();
  configureMailer(config);
  const dataSource = createDataSource(config.databaseUrl);
  await dataSource.initialize();
  setDataSource(dataSource);
  await runMigrations(dataSource);
  await startBoss(config.databaseUrl, QUEUES);
  await registerWorkers(boss());
  logger.info('worker started');
  const shutdown = async () => {
    await stopBoss();
    await dataSource.destroy();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown());
  process.on('SIGTERM', () => void shutdown());
}

main().catch((error) => {
  if (error instanceof ConfigError) process.stderr.write(`${error.message}\n`);
  else logger.fatal({ err: error }, 'worker could not start');
  process.exit(1);
});

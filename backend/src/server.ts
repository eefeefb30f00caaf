import { DEMO_ACCOUNTS } from './idp/local-idp';
import { ConfigError, loadConfig } from './lib/config';
import { logger } from './lib/logger';
import { startCoppice } from './runtime';

// The process entry: `npm start` runs it after preparing PostgreSQL; production runs it directly.
async function main() {
  let config: ReturnType<typeof loadConfig>;
  try {
    config = loadConfig();
  } catch (error) {
    if (error instanceof ConfigError) {
      process.stderr.write(`${error.message}\n`);
      process.exit(78);
    }
    throw error;
  }
  const running = await startCoppice(config, { migrate: true, seed: !config.production, listen: true });

  const lines = [`Coppice is running at ${running.url}`];
  if (config.localIdp) {
    lines.push(
      `Local sign-in service: ${config.oidc.issuer} (development only)`,
      `Demo accounts (password "${config.localIdp.demoPassword}"), all invented:`,
      ...DEMO_ACCOUNTS.map((a) => `  ${a.email.padEnd(34)} ${a.groups.join(', ')}`),
    );
  }
  if (config.mail.sinkPort !== null)
    lines.push(`Mail sink: smtp://127.0.0.1:${config.mail.sinkPort}, read it at ${running.url}/dev/mailbox`);
  process.stdout.write(`\n${lines.join('\n')}\n\nPress Ctrl-C to stop.\n`);

  let stopping = false;
  const shutdown = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down');
    const timer = setTimeout(() => process.exit(1), 20_000);
    timer.unref();
    await running.stop();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
}

main().catch((error) => {
  logger.fatal({ err: error }, 'Coppice could not start');
  process.stderr.write(`Coppice could not start: ${(error as Error).message}\n`);
  process.exit(1);
});

import type { Config } from '../lib/config';
import { logger } from '../lib/logger';
import { seedDemoDataset } from './seed-demo-dataset';

/**
 * Seeds the invented demo organisation ("Quillfern Community Care") on a development database.
 * Demo accounts live in config/demo-accounts.json and are known to the local identity provider;
 * each person's user row is created at their first sign-in.
 */
export async function seedDemo(config: Config): Promise<void> {
  await seedDemoDataset(config);
  logger.debug('demo seed done');
}

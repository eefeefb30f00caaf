import type { Config } from '../lib/config';
import { logger } from '../lib/logger';

/**
 * Seeds the invented demo organisation ("Quillfern Community Care") on a development database.
 * Demo accounts live in config/demo-accounts.json and are known to the local identity provider;
 * each person's user row is created at their first sign-in.
 */
export async function seedDemo(_config: Config): Promise<void> {
  logger.debug('demo seed: nothing to add yet');
}

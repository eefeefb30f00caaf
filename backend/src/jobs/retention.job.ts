import type PgBoss from 'pg-boss';
import { logger } from '../lib/logger';
import { runRetention } from '../modules/policy/retention.service';

export const RETENTION_QUEUE = 'privacy.retention';

/** Every night at 02:30 (server time) the retention job deletes what the policy says is due. */
export const RETENTION_SCHEDULE = '30 2 * * *';

export async function registerRetentionWorker(b: PgBoss): Promise<void> {
  await b.work(RETENTION_QUEUE, { pollingIntervalSeconds: 30 }, async () => {
    const result = await runRetention();
    if (result.deleted.length > 0) logger.info(result, 'retention: datasets deleted');
  });
  await b.schedule(RETENTION_QUEUE, RETENTION_SCHEDULE);
}

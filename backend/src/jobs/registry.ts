import type PgBoss from 'pg-boss';
import { BRIEFS_QUEUE, registerBriefsWorker } from './briefs.job';
import { MAIL_QUEUE, registerMailWorker } from './mail.job';
import { MODEL_RUN_QUEUE, registerModelRunWorker } from './model-run.job';
import { RETENTION_QUEUE, registerRetentionWorker } from './retention.job';

/** Every queue and its worker. A job module adds its queue name and its register function here. */
export const QUEUES = [MAIL_QUEUE, RETENTION_QUEUE, MODEL_RUN_QUEUE, BRIEFS_QUEUE];

export async function registerWorkers(b: PgBoss): Promise<void> {
  await registerMailWorker(b);
  await registerRetentionWorker(b);
  await registerModelRunWorker(b);
  await registerBriefsWorker(b);
}

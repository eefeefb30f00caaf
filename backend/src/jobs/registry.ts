import type PgBoss from 'pg-boss';
import { BRIEFS_QUEUE, registerBriefsWorker } from './briefs.job';
import { MAIL_QUEUE, registerMailWorker } from './mail.job';

/** Every queue and its worker. A job module adds its queue name and its register function here. */
export const QUEUES = [MAIL_QUEUE, BRIEFS_QUEUE];

export async function registerWorkers(b: PgBoss): Promise<void> {
  await registerMailWorker(b);
  await registerBriefsWorker(b);
}

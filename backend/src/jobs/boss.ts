import PgBoss from 'pg-boss';
import { logger } from '../lib/logger';

let current: PgBoss | null = null;

/** Starts pg-boss (jobs on PostgreSQL) and creates the queues named by the job modules. */
export async function startBoss(databaseUrl: string, queues: string[]): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: databaseUrl, schema: 'pgboss', max: 5 });
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
  await boss.start();
  for (const name of queues) {
    if (!(await boss.getQueue(name))) await boss.createQueue(name);
  }
  current = boss;
  return boss;
}

export function boss(): PgBoss {
  if (!current) throw new Error('The job queue is not started');
  return current;
}

export async function stopBoss(): Promise<void> {
  if (!current) return;
  const b = current;
  current = null;
  await b.stop({ graceful: true, timeout: 10_000 });
}

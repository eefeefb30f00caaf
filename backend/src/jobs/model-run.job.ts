import { hostname } from 'node:os';
import type PgBoss from 'pg-boss';
import type { EntityManager } from 'typeorm';
import { logger } from '../lib/logger';
import { failAbandonedRuns } from '../modules/models/models.repository';
import { trainModelRun } from '../modules/models/train-run';
import { boss } from './boss';

export const MODEL_RUN_QUEUE = 'model-run.train';

/**
 * Queues a run's training. With `manager`, the job is written in that transaction, so it only
 * exists once the run it names does.
 */
export async function queueModelRun(runId: string, manager?: EntityManager): Promise<void> {
  await boss().send(
    MODEL_RUN_QUEUE,
    { runId },
    {
      // A run is claimed once (see claimModelRun); a retry would find it taken.
      retryLimit: 0,
      expireInSeconds: 60 * 60,
      ...(manager
        ? {
            db: {
              executeSql: async (text: string, values: unknown[]) => ({
                rows: await manager.query(text, values),
              }),
            },
          }
        : {}),
    },
  );
}

const localWorker: { boss: PgBoss; id: string } | null = null;

/** Wakes this process's worker (if it runs one) so a new run starts without waiting for its next poll. */
export function wakeModelRunWorker(): void {
  if (localWorker) localWorker.boss.notifyWorker(localWorker.id);
}

/** One training at a time per worker: the engine takes a core, and a machine has few. */
export async function registerModelRunWorker(
  b: PgBoss,
  workerName = `${hostname()}:${process.pid}`,
): Promise<string> {
  // Runs whose worker died mid-training are failed with a reason, by whichever worker looks first.
  const sweep = () =>
    failAbandonedRuns()
      .then((ids) => {
        if (ids.length)
          logger.warn({ runIds: ids }, 'model runs abandoned by a stopped worker marked failed');
      })
      .catch(() => {});
  void sweep();
  const timer = setInterval(sweep, 5000);
  timer.unref();
  b.once('stopped', () => clearInterval(timer));
  return b.work<{ runId: string }>(
    MODEL_RUN_QUEUE,
    { pollingIntervalSeconds: 1, batchSize: 1 },
    async (jobs) => {
      for (const job of jobs) await trainModelRun(job.data.runId, workerName);
    },
  );
}

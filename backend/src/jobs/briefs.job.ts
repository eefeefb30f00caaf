import type PgBoss from 'pg-boss';
import { type BriefsJob, computePublication } from '../modules/teams/publish-briefs';
import { boss } from './boss';

export const BRIEFS_QUEUE = 'briefs.compute';

/** Queues the computation of a publication's briefs (once; a failure marks the publication failed). */
export async function queueBriefs(job: BriefsJob): Promise<void> {
  await boss().send(BRIEFS_QUEUE, job, { retryLimit: 0, expireInSeconds: 15 * 60 });
}

export async function registerBriefsWorker(b: PgBoss): Promise<void> {
  await b.work<BriefsJob>(BRIEFS_QUEUE, { pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) await computePublication(job.data);
  });
}

import type PgBoss from 'pg-boss';
import { deliverMail, type OutgoingMail } from '../mail/mailer';
import { boss } from './boss';

export const MAIL_QUEUE = 'mail.send';

/** Queues an e-mail; a failed delivery is retried by the job queue and never blocks the caller. */
export async function queueMail(mail: OutgoingMail): Promise<void> {
  await boss().send(MAIL_QUEUE, mail, {
    retryLimit: 8,
    retryDelay: 5,
    retryBackoff: true,
    expireInSeconds: 60,
  });
}

export async function registerMailWorker(b: PgBoss): Promise<void> {
  // A batch, so that a publication's many e-mails do not wait a polling interval each; a failed
  // e-mail is failed on its own (and retried), the others of the batch complete.
  await b.work<OutgoingMail>(MAIL_QUEUE, { pollingIntervalSeconds: 1, batchSize: 20 }, async (jobs) => {
    for (const job of jobs) {
      try {
        await deliverMail(job.data);
      } catch (error) {
        await b.fail(MAIL_QUEUE, job.id, { message: error instanceof Error ? error.message : String(error) });
      }
    }
  });
}

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
  await b.work<OutgoingMail>(MAIL_QUEUE, { pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) await deliverMail(job.data);
  });
}

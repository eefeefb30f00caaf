import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_MANAGER_NORTH } from '../../../backend/src/demo/quillfern';
import { startMailSink } from '../../../backend/src/mail/mail-sink';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { useDemoRuns, waitForPublication } from './demo-sources';

let coppice: TestCoppice;
let restarted: { stop: () => Promise<void> } | null = null;

beforeAll(async () => {
  coppice = await startTestCoppice();
}, 30_000);

afterAll(async () => {
  await restarted?.stop();
  await coppice?.stop();
});

const until = async <T>(read: () => Promise<T>, done: (value: T) => boolean, seconds: number): Promise<T> => {
  for (let i = 0; i < seconds * 5; i++) {
    const value = await read();
    if (done(value)) return value;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('gave up waiting');
};

describe('publishing while the mail server is down', () => {
  it('still publishes, and the e-mails arrive once the mail server is back', async () => {
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const demo = await useDemoRuns(analyst, privacy, { rows: 300 });
    await coppice.local.mailSink!.stop();

    const run = await demo.requestedRun();
    expect((await privacy.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
    const publication = await waitForPublication(privacy, run);
    expect(publication.status).toBe('published');
    const north = await coppice.signIn(ACCOUNTS.managerNorth);
    expect(((await north.get('/api/teams')).body as unknown[]).length).toBe(3);

    // The first delivery failed and the job queue keeps the e-mail for another try.
    await until(
      () =>
        coppice.sql<{ n: number }>(
          `SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'mail.send' AND retry_count > 0`,
        ),
      (rows) => rows[0]!.n > 0,
      30,
    );

    restarted = await startMailSink(coppice.config.mail.sinkPort!);
    const mailbox = await until(
      async () =>
        (await request(coppice.app).get('/dev/mailbox')).body as { to: string[]; subject: string }[],
      (messages) => messages.some((m) => m.to.includes(DEMO_MANAGER_NORTH)),
      60,
    );
    expect(mailbox.find((m) => m.to.includes(DEMO_MANAGER_NORTH))!.subject).toBe(
      'Team briefs are ready in Coppice',
    );
  }, 120_000);
});

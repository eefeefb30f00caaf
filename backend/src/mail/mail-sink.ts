import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { logger } from '../lib/logger';

/**
 * A local SMTP sink for development, tests and the demo: it accepts every message on loopback and
 * keeps it in memory for `GET /dev/mailbox`. Never started in production (SMTP_URL is used there).
 */
export type SinkMessage = { to: string[]; subject: string; text: string; receivedAt: string };

const received: SinkMessage[] = [];
let running = false;

export function sinkMessages(): SinkMessage[] {
  return [...received].reverse();
}

export function mailSinkRunning(): boolean {
  return running;
}

export async function startMailSink(
  port: number,
  host = '127.0.0.1',
): Promise<{ stop: () => Promise<void> }> {
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    size: 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
          received.push({
            to,
            subject: mail.subject ?? '',
            text: (mail.text ?? '').trim(),
            receivedAt: new Date().toISOString(),
          });
          if (received.length > 1000) received.shift();
          callback();
        })
        .catch((error) => {
          logger.warn({ err: error }, 'mail sink could not read a message');
          callback(error);
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  running = true;
  return {
    stop: () =>
      new Promise<void>((resolve) => {
        running = false;
        server.close(() => resolve());
      }),
  };
}

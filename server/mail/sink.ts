/**
 * The development/test SMTP sink: when no SMTP_HOST is configured the app starts this server on
 * 127.0.0.1 (a free port) and stores every message it receives in the `outbox` table, which the
 * admin's Outbox page lists.
 */
import { SMTPServer } from 'smtp-server';
import { outbox } from '../../drizzle/schema';
import type { Db } from '../db';
import { readMessage } from './message';

const MAX_MESSAGE_BYTES = 1024 * 1024;

export interface MailSink {
  port: number;
  close(): Promise<void>;
}

export async function startMailSink(db: Db): Promise<MailSink> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        const m = readMessage(raw);
        // The message is accepted only once it is stored, so a sender that awaits delivery sees it in the outbox.
        db.insert(outbox)
          .values({ teamId: m.teamId, from: m.from, to: m.to, subject: m.subject, text: m.text, raw })
          .then(
            () => callback(),
            (err: Error) => callback(err),
          );
      });
    },
  });
  const port = await new Promise<number>((resolvePort, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.server.address();
      if (address && typeof address === 'object') resolvePort(address.port);
      else reject(new Error('SMTP sink did not get a port'));
    });
  });
  return { port, close: () => new Promise<void>((done) => server.close(() => done())) };
}

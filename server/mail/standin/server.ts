// A local SMTP server for `npm start` and the tests: it accepts every message, parses it with
// mailparser and keeps it in PostgreSQL (standin_mailbox), so nothing leaves the machine. SMTP_URL
// points the app at a real server instead. `refuseNext(n)` makes it refuse the next n messages
// with a temporary failure, as a busy server would, to exercise the queue's retries.
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface MailStandin {
  url: string;
  port: number;
  /** Refuse the next n messages with "451 try again later". */
  refuseNext(n: number): void;
  close(): Promise<void>;
}

export async function startMailStandin({ port, databaseUrl, host = '127.0.0.1' }: { port: number; databaseUrl: string; host?: string }): Promise<MailStandin> {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  pool.on('error', () => {});
  let refusals = 0;
  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Stackyard mail stand-in',
    size: 10 * 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        if (refusals > 0) {
          refusals--;
          const err = Object.assign(new Error('Mailbox busy, try again later'), { responseCode: 451 });
          return callback(err);
        }
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) =>
            pool.query('insert into standin_mailbox (envelope_from, envelope_to, message_id, subject, text, html, raw) values ($1, $2, $3, $4, $5, $6, $7)', [
              session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
              session.envelope.rcptTo.map((r) => r.address),
              mail.messageId ?? null,
              mail.subject ?? null,
              mail.text ?? null,
              typeof mail.html === 'string' ? mail.html : null,
              raw.toString('utf8'),
            ]),
          )
          .then(() => callback(), (e: Error) => callback(Object.assign(new Error(`Could not store the message: ${e.message}`), { responseCode: 451 })));
      });
    },
  });
  server.on('error', () => {});
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const actual = (server.server.address() as AddressInfo).port;
  return {
    url: `smtp://${host}:${actual}`,
    port: actual,
    refuseNext(n) {
      refusals = n;
    },
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await pool.end();
    },
  };
}

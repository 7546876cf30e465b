// Sends the outbox through a pg-boss queue with retries, on the same pg-boss instance as the other
// scheduled work. Outbox rows announce themselves with NOTIFY, which PostgreSQL delivers only when
// their transaction commits; a sweep every minute picks up any row whose notification was missed.
import pg from 'pg';
import type PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { Transporter } from 'nodemailer';
import { MAIL_CHANNEL, type MailService } from '../services/mail.ts';

export const MAIL_QUEUE = 'mail-send';
export const MAIL_SWEEP_QUEUE = 'mail-sweep';
export const LOW_STOCK_DIGEST_QUEUE = 'low-stock-digest';

export interface MailQueueOptions {
  boss: PgBoss;
  /** For the LISTEN connection (a pool's connections cannot hold a LISTEN). */
  connectionString: string;
  mail: Pick<MailService, 'deliver' | 'stranded' | 'lowStockDigest'>;
  transport: Transporter;
  logger: Pick<Logger, 'info' | 'error' | 'warn'>;
  /** Attempts after the first; pg-boss waits retryDelaySeconds, doubling each time. */
  retryLimit?: number;
  retryDelaySeconds?: number;
  pollingIntervalSeconds?: number;
  /** When purchasing hears about low stock (Melbourne time). */
  digestCron?: string;
}

export async function startMailQueue({ boss, connectionString, mail, transport, logger, retryLimit = 6, retryDelaySeconds = 30, pollingIntervalSeconds = 2, digestCron = '0 7 * * 1-5' }: MailQueueOptions) {
  const policy = { name: MAIL_QUEUE, retryLimit, retryDelay: retryDelaySeconds, retryBackoff: true, expireInSeconds: 120 };
  await boss.createQueue(MAIL_QUEUE, policy);
  await boss.updateQueue(MAIL_QUEUE, policy); // a queue made by an earlier version keeps its old settings otherwise
  await boss.createQueue(MAIL_SWEEP_QUEUE);
  await boss.createQueue(LOW_STOCK_DIGEST_QUEUE);
  const enqueue = (id: string) => boss.send(MAIL_QUEUE, { id });

  await boss.work<{ id: string }>(MAIL_QUEUE, { pollingIntervalSeconds }, async ([job]) => {
    const result = await mail.deliver(transport, job!.data.id, retryLimit + 1);
    if ('failed' in result) logger.error({ outboxId: job!.data.id }, 'mail given up after its last attempt; it stays in the outbox as failed');
    return result;
  });
  await boss.schedule(MAIL_SWEEP_QUEUE, '* * * * *', {}, { tz: 'UTC' });
  await boss.work(MAIL_SWEEP_QUEUE, { pollingIntervalSeconds }, async () => {
    const ids = await mail.stranded(new Date(Date.now() - 60_000));
    for (const id of ids) await enqueue(id);
    return { requeued: ids.length };
  });
  await boss.schedule(LOW_STOCK_DIGEST_QUEUE, digestCron, {}, { tz: 'Australia/Melbourne' });
  await boss.work(LOW_STOCK_DIGEST_QUEUE, { pollingIntervalSeconds }, async () => ({ messages: (await mail.lowStockDigest()).length }));

  // LISTEN on its own connection; if it drops, the sweep still sends (a minute later) and we reconnect.
  let listener: pg.Client | null = null;
  let stopped = false;
  const listen = async () => {
    const client = new pg.Client({ connectionString });
    client.on('notification', (n) => {
      if (n.channel === MAIL_CHANNEL && n.payload) enqueue(n.payload).catch((err: Error) => logger.error({ err }, 'mail not queued; the sweep will retry it'));
    });
    client.on('error', (err) => {
      logger.warn({ err }, 'mail listener lost its connection; reconnecting');
      listener = null;
      if (!stopped) setTimeout(() => void listen().catch(() => {}), 2_000).unref();
    });
    await client.connect();
    await client.query(`listen ${MAIL_CHANNEL}`);
    listener = client;
  };
  await listen();

  return {
    enqueue,
    async stop() {
      stopped = true;
      await listener?.end().catch(() => {});
    },
  };
}

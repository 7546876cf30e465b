// Quote holds lapse on a schedule run by pg-boss, in the application's own PostgreSQL.
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { JobService } from '../services/jobs.ts';

export const QUOTE_EXPIRY_QUEUE = 'quote-hold-expiry';

export interface SchedulerOptions {
  connectionString: string;
  jobs: Pick<JobService, 'expireQuoteHolds'>;
  logger: Pick<Logger, 'info' | 'error'>;
  /** Cron for the sweep (pg-boss checks schedules every 30 s). */
  cron?: string;
  /** How often a worker asks for queued work. */
  pollingIntervalSeconds?: number;
}

/**
 * Starts pg-boss (it creates its own schema on first start), schedules the sweep and works the
 * queue. Several instances may start it: pg-boss hands each scheduled run to one worker.
 */
export async function startScheduler({ connectionString, jobs, logger, cron = '*/10 * * * *', pollingIntervalSeconds = 2 }: SchedulerOptions) {
  const boss = new PgBoss({ connectionString, schema: 'pgboss', max: 3 });
  boss.on('error', (err) => logger.error({ err }, 'scheduler error'));
  await boss.start();
  await boss.createQueue(QUOTE_EXPIRY_QUEUE);
  await boss.schedule(QUOTE_EXPIRY_QUEUE, cron, {}, { tz: 'UTC' });
  await boss.work(QUOTE_EXPIRY_QUEUE, { pollingIntervalSeconds }, async () => {
    const done = await jobs.expireQuoteHolds();
    if (done.units > 0) logger.info(`quote holds lapsed: ${done.units} units released from ${done.jobs} jobs`);
    return done;
  });
  return boss;
}

import cluster from 'node:cluster';
import { readEnv } from './env.ts';
import { createDb, migrateDb } from './db/client.ts';
import { buildContext } from './context.ts';
import { createApp, createServices } from './app.ts';
import { createHttpServer } from './http/server.ts';
import { startScheduler } from './jobs/quote-expiry.ts';
import { startMailQueue } from './jobs/mail-queue.ts';
import { createMailTransport } from './mail/transport.ts';
import { smtpUrl } from './context.ts';
import { createPartsIndex } from './search/parts-index.ts';

const env = readEnv();
const context = buildContext(env);

if (cluster.isPrimary) {
  // Start-up work happens once, before any worker serves.
  await migrateDb(context.db);
  // The search engine may have restarted empty (the local stand-in keeps its index in memory).
  const index = await createPartsIndex(context.search).ensure(context.db).catch((e: Error) => {
    context.logger.error({ err: e }, 'search index not ready: catalogue search will fail until the search server answers');
    return null;
  });
  if (index?.rebuilt) context.logger.info(`search index rebuilt with ${index.documents} parts`);
  // Scheduled work (quote holds lapsing) runs in the primary, on the same PostgreSQL, with its own
  // small pool (the primary's is closed when workers serve).
  const background = createServices({ ...context, db: createDb(env.DATABASE_URL, { max: 3 }) });
  const scheduler = await startScheduler({ connectionString: env.DATABASE_URL, jobs: background.jobs, logger: context.logger }).catch((e: Error) => {
    context.logger.error({ err: e }, 'scheduler not started: quote holds will not lapse until it runs');
    return null;
  });
  // Mail goes out through the same pg-boss instance; messages wait in the outbox while it is down.
  const mailQueue = scheduler
    ? await startMailQueue({ boss: scheduler, connectionString: env.DATABASE_URL, mail: background.mail, transport: createMailTransport(smtpUrl(env)), logger: context.logger }).catch((e: Error) => {
        context.logger.error({ err: e }, 'mail queue not started: messages wait in the outbox');
        return null;
      })
    : null;
  const stopScheduler = () => {
    void mailQueue?.stop();
    void scheduler?.stop({ graceful: false, close: true });
  };
  process.once('SIGTERM', stopScheduler);
  process.once('SIGINT', stopScheduler);
}

if (cluster.isPrimary && env.WEB_CONCURRENCY > 1) {
  // Several workers share the port; each is a stateless instance like those behind a balancer.
  await context.db.$client.end();
  for (let i = 0; i < env.WEB_CONCURRENCY; i++) cluster.fork();
  let stopping = false;
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
    } else if (code !== 0) {
      context.logger.error(`worker ${worker.process.pid} stopped (${signal ?? code}); starting another`);
      cluster.fork();
    }
  });
  const stopAll = () => {
    stopping = true;
    for (const w of Object.values(cluster.workers ?? {})) w?.kill('SIGTERM');
  };
  for (const signal of ['SIGTERM', 'SIGINT', 'SIGHUP'] as const) process.on(signal, stopAll);
} else {
  serve();
}

function serve() {
  const app = createApp(context);
  const server = createHttpServer(app).listen(env.PORT, env.HOST, () => {
    if (cluster.isPrimary || cluster.worker?.id === 1) context.logger.info(`Stackyard listening on ${context.trustedOrigins[0]}`);
  });
  let stopped = false;
  const stop = () => {
    if (stopped) return;
    stopped = true;
    server.close(() => void context.db.$client.end().finally(() => process.exit(0)));
    // Keep-alive connections would hold close() open; a moment's grace, then go.
    setTimeout(() => process.exit(0), 2_000).unref();
    server.closeIdleConnections();
  };
  for (const signal of ['SIGTERM', 'SIGINT', 'SIGHUP'] as const) process.on(signal, stop);
}

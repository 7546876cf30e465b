import { readEnv } from './env.ts';
import { migrateDb } from './db/client.ts';
import { buildContext } from './context.ts';
import { createApp, createServices } from './app.ts';

const env = readEnv();
const context = buildContext(env);
await migrateDb(context.db);
const app = createApp(context);
// The search engine may have restarted empty (the local stand-in keeps its index in memory).
const index = await createServices(context).partsIndex.ensure(context.db).catch((e: Error) => {
  context.logger.error({ err: e }, 'search index not ready: catalogue search will fail until the search server answers');
  return null;
});
if (index?.rebuilt) context.logger.info(`search index rebuilt with ${index.documents} parts`);

const server = app.listen(env.PORT, env.HOST, () => context.logger.info(`Stackyard listening on ${context.trustedOrigins[0]}`));
// Longer than a load balancer's idle timeout, so the balancer (not us) closes idle connections.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
const stop = () => {
  server.close();
  void context.db.$client.end();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);

// Runs the search stand-in as a process: `tsx server/search/standin/main.ts`. SEARCH_PORT picks
// the port (default 7701, beside Meilisearch's 7700); MEILI_MASTER_KEY, when set, is required as
// the bearer token, as a real server started with that key would require it.

import { startSearchStandin } from './server.ts';

const standin = await startSearchStandin({ port: Number(process.env.SEARCH_PORT ?? 7701), apiKey: process.env.MEILI_MASTER_KEY || undefined });
console.log(`search stand-in listening on ${standin.url}`);

const shutdown = () =>
  standin.close().then(
    () => process.exit(0),
    (error: unknown) => {
      console.error('search stand-in: failed to close', error);
      process.exit(1);
    },
  );
process.once('SIGTERM', shutdown);
process.once('SIGINT', shutdown);
process.once('SIGHUP', shutdown);

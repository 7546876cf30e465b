// A reduced `npm start` for the shutdown test: the same bootstrap (onShutdown, spawnTs) starting
// the real search stand-in as its child; "cleanup" stands in for stopping PostgreSQL and leaves
// a marker file. Prints one JSON line with the child's pid once the stand-in answers.
import { writeFileSync } from 'node:fs';
import { onShutdown, spawnTs, waitForHttp } from '../../server/cli/bootstrap.mjs';

const [port, marker] = process.argv.slice(2);
onShutdown(() => writeFileSync(marker, 'cleaned up'));
const child = spawnTs('server/search/standin/main.ts', { name: 'search stand-in', env: { SEARCH_PORT: port } });
await waitForHttp(`http://127.0.0.1:${port}/health`, 60_000);
process.stdout.write(`${JSON.stringify({ ready: true, child: child.pid, self: process.pid })}\n`);

// `npm run bench`: a large generated catalogue in its own database, then the benchmarks of
// tests/bench/run.ts. Figures go to bench-results/bench.json; nothing here is a test.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { ensureNodeModules, ensurePostgres, fail, log, root } from './bootstrap.mjs';

ensureNodeModules();
const pg = ensurePostgres({ name: 'pg-bench', port: Number(process.env.BENCH_PG_PORT ?? 54340), databases: ['stackyard_bench'] });
log('building the client (for the bundle-size figure)…');
const build = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
if (build.status !== 0) fail('the client build failed.');
const run = spawnSync(process.execPath, ['--import', 'tsx', 'tests/bench/run.ts', ...process.argv.slice(2)], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, DATABASE_URL: pg.url('stackyard_bench'), PG_ADMIN_URL: pg.url('postgres') },
});
if (pg.started) pg.stop();
process.exit(run.status ?? 1);

// `npm run db:migrate | db:seed | db:reset | search:reindex` against the local cluster (or DATABASE_URL).
import { spawnSync } from 'node:child_process';
import { ensureNodeModules, ensurePostgres, root } from './bootstrap.mjs';
import { DEV_PG_PORT } from './settings.mjs';

ensureNodeModules();
if (!process.env.DATABASE_URL) {
  const pg = ensurePostgres({ name: 'pg', port: Number(process.env.PG_PORT ?? DEV_PG_PORT), databases: ['stackyard'] });
  process.env.DATABASE_URL = pg.url('stackyard');
}
const result = spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/db-tasks.ts', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' });
process.exit(result.status ?? 1);

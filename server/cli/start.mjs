// `npm start` (and `npm run dev` with --dev): install what is missing, start PostgreSQL and the
// local stand-ins, migrate, seed once, build the client, serve everything on one port.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { ensureNodeModules, ensurePostgres, fail, log, newestMtime, onShutdown, root, spawnChild, spawnTs, waitForHttp, waitForPort } from './bootstrap.mjs';
import { DEV_PAY_PORT, DEV_PG_PORT, DEV_SEARCH_PORT, DEV_SMTP_PORT, DEMO_SIGN_INS, STANDIN_NODE_OPTIONS } from './settings.mjs';

const dev = process.argv.includes('--dev');
const port = Number(process.env.PORT ?? 3000);
const apiPort = dev ? Number(process.env.API_PORT ?? port + 1) : port;

ensureNodeModules();

let pg = null;
if (!process.env.DATABASE_URL) {
  pg = ensurePostgres({ name: 'pg', port: Number(process.env.PG_PORT ?? DEV_PG_PORT), databases: ['stackyard'] });
  process.env.DATABASE_URL = pg.url('stackyard');
}
onShutdown(() => {
  if (pg?.started) {
    log('stopping PostgreSQL');
    pg.stop();
  }
});

const tsx = (args) => spawnSync(process.execPath, ['--import', 'tsx', ...args], { cwd: root, stdio: 'inherit', env: process.env });
if (tsx(['server/cli/db-tasks.ts', 'migrate', 'seed']).status !== 0) fail('migrating or seeding the database failed.');

if (!process.env.MEILI_HOST) {
  const searchPort = Number(process.env.SEARCH_PORT ?? DEV_SEARCH_PORT);
  process.env.MEILI_HOST = `http://127.0.0.1:${searchPort}`;
  spawnTs('server/search/standin/main.ts', { name: 'search stand-in', env: { SEARCH_PORT: String(searchPort), NODE_OPTIONS: STANDIN_NODE_OPTIONS } });
  await waitForHttp(`${process.env.MEILI_HOST}/health`);
}

// Mail: the SMTP stand-in keeps every message in PostgreSQL unless SMTP_URL names a real server.
if (!process.env.SMTP_URL) {
  const smtpPort = Number(process.env.SMTP_PORT ?? DEV_SMTP_PORT);
  process.env.SMTP_PORT = String(smtpPort);
  spawnTs('server/mail/standin/main.ts', { name: 'mail stand-in' });
  await waitForPort(smtpPort);
}

// Card payments: the provider stand-in unless real keys are set (STRIPE_SECRET_KEY without STRIPE_API_BASE).
if (!process.env.STRIPE_SECRET_KEY || process.env.STRIPE_API_BASE) {
  const payPort = Number(process.env.PAY_PORT ?? DEV_PAY_PORT);
  process.env.STRIPE_API_BASE ??= `http://127.0.0.1:${payPort}`;
  spawnTs('server/payments/standin/main.ts', { name: 'payment stand-in', env: { PAY_PORT: String(payPort), PAY_WEBHOOK_URL: `http://127.0.0.1:${apiPort}/api/payments/webhook` } });
  await waitForPort(payPort);
}

if (dev) {
  // The API restarts on change (tsx watch); Vite serves the client with HMR and proxies /api to it.
  spawnTs('server/index.ts', { name: 'API', watch: true, env: { PORT: String(apiPort), NODE_ENV: 'development', PUBLIC_URL: `http://127.0.0.1:${port}` } });
  spawnChild(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), '--port', String(port), '--strictPort'], { name: 'Vite', env: { API_PORT: String(apiPort) } });
  log(`development: http://127.0.0.1:${port} (API on :${apiPort}); Ctrl-C stops everything.`);
} else {
  await serveBuilt();
}

/** Production-like: build the client when its sources changed, then API and client on one port. */
async function serveBuilt() {
  const built = path.join(root, 'dist/client/index.html');
  const sourcesChanged = !existsSync(built) || newestMtime(['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public']) > statSync(built).mtimeMs;
  if (sourcesChanged) {
    log('building the client…');
    const build = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
    if (build.status !== 0) fail('the client build failed.');
  }

  spawnTs('server/index.ts', { name: 'server', env: { PORT: String(port), NODE_ENV: process.env.NODE_ENV ?? 'production', LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn' } });
  await waitForHttp(`http://127.0.0.1:${port}/api/health`, 60_000).catch(() => fail('the server did not come up.'));

  log('');
  log(`Stackyard is running at http://127.0.0.1:${port}`);
  log('Demo sign-ins (password: stackyard-demo):');
  for (const u of DEMO_SIGN_INS) log(`  ${u.role.padEnd(11)} ${u.email}`);
  log('Press Ctrl-C to stop.');
}

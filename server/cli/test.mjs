// `npm test`: a throwaway PostgreSQL cluster, Chromium, the built client, then every test
// (unit, API, browser) in one vitest run, ending with one line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { ensureChromium, ensureNodeModules, ensurePostgres, fail, log, newestMtime, root } from './bootstrap.mjs';
import { TEST_PG_PORT } from './settings.mjs';

ensureNodeModules();
ensureChromium();
const pg = ensurePostgres({ name: 'pg-test', port: Number(process.env.TEST_PG_PORT ?? TEST_PG_PORT) });

const built = path.join(root, 'dist/client/index.html');
if (!existsSync(built) || newestMtime(['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public']) > statSync(built).mtimeMs) {
  log('building the client for the browser tests…');
  const build = spawnSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  if (build.status !== 0) fail('the client build failed.');
}

const resultsDir = path.join(root, 'test-results');
mkdirSync(resultsDir, { recursive: true });
const report = path.join(resultsDir, 'vitest.json');
rmSync(report, { force: true });
const vitest = spawnSync(
  process.execPath,
  [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
  { cwd: root, stdio: 'inherit', env: { ...process.env, TEST_PG_URL: pg.url('postgres'), NODE_ENV: 'test' } },
);
if (pg.started) pg.stop();

let passed = 0;
let failed = 0;
let skipped = 0;
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8'));
  passed = r.numPassedTests;
  failed = r.numFailedTests + filesThatFailedToRun(r);
  skipped = r.numPendingTests + r.numTodoTests;
} else {
  failed = 1;
}
if (vitest.status !== 0 && failed === 0) failed = 1;
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);

/** A test file that failed without a failing test (it did not load, or a hook threw) counts as one failure. */
function filesThatFailedToRun(r) {
  return r.testResults.filter((f) => f.status === 'failed' && !f.assertionResults.some((a) => a.status === 'failed')).length;
}

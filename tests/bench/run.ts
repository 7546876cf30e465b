// The benchmarks behind `npm run bench`. Each figure is printed beside its target and written to
// bench-results/bench.json. One function per benchmark: add a new one beside the others and call
// it from the list at the bottom.
import { spawn, type ChildProcess } from 'node:child_process';
import { gzipSync } from 'node:zlib';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { asc } from 'drizzle-orm';
import { Pool } from 'undici';
import { readEnv } from '../../server/env.ts';
import { buildContext } from '../../server/context.ts';
import { migrateDb } from '../../server/db/client.ts';
import { parts } from '../../server/db/schema/index.ts';
import { seedDemo } from '../../seed/demo.ts';
import { createPartsIndex, PARTS_INDEX } from '../../server/search/parts-index.ts';
import { createSearchClient } from '../../server/search/client.ts';
import { catalogueSearches } from '../../server/services/catalogue.ts';
import { PartListQuerySchema } from '../../shared/contracts/parts.ts';
import { BENCH_PARTS, generateBenchCatalogue } from './generate.ts';
import { benchReservations, generateBenchJobs } from './reservations.ts';
import { benchLabels } from './labels.ts';
import { benchPriceList } from './price-list.ts';

const API_PORT = Number(process.env.BENCH_API_PORT ?? 3390);
const SEARCH_PORT = Number(process.env.BENCH_SEARCH_PORT ?? 7790);
const base = `http://127.0.0.1:${API_PORT}`;

// --- measuring ----------------------------------------------------------------------------------
type Latency = { p50: number; p95: number };
/** One printed line: a figure beside its target (null: reported without a target). */
type Line = { what: string; figure: string; target: string; met: boolean | null };

function percentile(values: number[], p: number) {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]!;
}
const ms = (n: number) => Math.round(n * 100) / 100;
const latency = (values: number[]): Latency => ({ p50: ms(percentile(values, 50)), p95: ms(percentile(values, 95)) });

/**
 * `concurrency` clients each sending requests until `total` have been sent; latencies in ms.
 * With `everyMs`, each client sends at most one request per `everyMs` (a person typing: one
 * search per keystroke), starting staggered; without it, the next as soon as the last is answered.
 * A failed request counts with the time it took to fail, and in `failed`.
 */
async function load(concurrency: number, total: number, send: (i: number) => Promise<void>, everyMs = 0): Promise<Latency & { perSecond: number; failed: number }> {
  const latencies: number[] = [];
  let failed = 0;
  let next = 0;
  const started = performance.now();
  const pause = (until: number) => new Promise((resolve) => setTimeout(resolve, Math.max(0, until - performance.now())));
  await Promise.all(
    Array.from({ length: concurrency }, async (_, client) => {
      let slot = started + (everyMs * client) / concurrency;
      while (next < total) {
        if (everyMs) await pause(slot);
        const i = next++;
        const t0 = performance.now();
        await send(i).catch(() => failed++);
        latencies.push(performance.now() - t0);
        slot = Math.max(slot + everyMs, performance.now());
      }
    }),
  );
  return { ...latency(latencies), perSecond: Math.round(total / ((performance.now() - started) / 1000)), failed };
}

function child(entry: string, env: Record<string, string>): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', entry], { env: { ...process.env, ...env }, stdio: ['ignore', 'ignore', 'inherit'] });
}

async function waitFor(check: () => Promise<boolean>, what: string, timeoutMs = 300_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`${what} did not happen in time`);
}

function rssMb(pid: number) {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Math.round(Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024);
}

// --- the system under test ------------------------------------------------------------------------
const env = readEnv({ ...process.env, PORT: String(API_PORT), LOG_LEVEL: 'silent' });
const context = buildContext(env);
await migrateDb(context.db);
await seedDemo(context.db, context.auth);
console.log('generating the benchmark catalogue (first run only)…');
const t0 = performance.now();
if (await generateBenchCatalogue(context.db)) console.log(`  generated in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
if (await generateBenchJobs(context.db)) console.log('  and 10,000 jobs');

// With the bounded heap `npm start` gives it (STANDIN_NODE_OPTIONS in server/cli/settings.mjs).
const standin = child('server/search/standin/main.ts', { SEARCH_PORT: String(SEARCH_PORT), NODE_OPTIONS: '--max-old-space-size=256' });
// The engine is reached the way the API reaches it: the meilisearch client over the app's transport.
const search = createSearchClient({ host: `http://127.0.0.1:${SEARCH_PORT}` });
const partsIndex = createPartsIndex(search);
await waitFor(() => search.healthy(), 'search stand-in start');
// One API process, as `npm start` runs it; on this 2-core machine the stand-in needs the other core.
const api = child('server/index.ts', {
  PORT: String(API_PORT),
  DATABASE_URL: env.DATABASE_URL,
  MEILI_HOST: `http://127.0.0.1:${SEARCH_PORT}`,
  LOG_LEVEL: 'silent',
  NODE_ENV: 'production',
  SIGN_IN_LIMIT_PER_MINUTE: '1000',
  WEB_CONCURRENCY: '1',
});
const allParts = BENCH_PARTS + 165;
console.log('indexing the catalogue through the API server…');
const t1 = performance.now();
await waitFor(async () => (await partsIndex.index.getStats()).numberOfDocuments >= allParts, 'indexing');
await waitFor(() => fetch(`${base}/api/health`).then((r) => r.ok), 'API start');
const indexing = { documents: allParts, seconds: Math.round((performance.now() - t1) / 100) / 10 };

const signIn = await fetch(`${base}/api/auth/sign-in/email`, {
  method: 'POST',
  headers: { 'content-type': 'application/json', origin: base },
  body: JSON.stringify({ email: 'sales@stackyard.test', password: 'stackyard-demo' }),
});
const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
if (!signIn.ok || !cookie) throw new Error(`bench sign-in failed: ${signIn.status}`);
const headers = { cookie, origin: base, 'content-type': 'application/json' };
// The clients: one keep-alive connection each, driven by undici (as a load tool would).
const clients = new Pool(base, { connections: 16 });
async function call(path: string, body?: unknown) {
  const r = await clients.request({ path, method: body === undefined ? 'GET' : 'POST', headers, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await r.body.text();
  if (r.statusCode !== 200) throw new Error(`${path} answered ${r.statusCode}: ${text.slice(0, 200)}`);
  return text;
}

// --- catalogue searches -----------------------------------------------------------------------------
const QUERIES = ['cab', 'cable se', 'galv', 'bracet', 'weatherpro', 'BN-012', 'earth lead 50', 'insul', 'slimline foot', 'marine', 'armoured cable', 'termin', 'compact end cap', 'flexble', 'low-profile', 'heavy-duty wall', 'controller', 'module', 'BN-04999', 'cover 120'];
const CATEGORIES = ['', 'cable-set', 'wall-bracket', ''];
/** What people type, keystroke by keystroke: every prefix of every query (the page searches after each). */
const KEYSTROKES = QUERIES.flatMap((q) => Array.from({ length: q.length }, (_, n) => q.slice(0, n + 1)).filter((p) => !p.endsWith(' ')));
const apiQuery = (q: string, i: number) => ({ q, pageSize: '50', ...(CATEGORIES[i % CATEGORIES.length] ? { category: CATEGORIES[i % CATEGORIES.length]! } : {}) });
const searchPath = (q: string, i: number) => `/api/parts?${new URLSearchParams(apiQuery(q, i))}`;
// The engine searches behind one API request, from the app's own code (the bench signs in as sales).
const engineSearches = (q: string, i: number) => catalogueSearches(PartListQuerySchema.parse(apiQuery(q, i)), { supplierData: true }).searches;

/** (a) What the API adds: the same searches through the API and straight to the engine over HTTP, taking turns. */
async function searchOverhead() {
  const viaApi: number[] = [];
  const direct: number[] = [];
  let failed = 0;
  for (let i = 0; i < 700; i++) {
    const q = QUERIES[i % QUERIES.length]!;
    const a = performance.now();
    const answered = await call(searchPath(q, i)).then(() => true, () => false);
    const b = performance.now();
    const answeredDirect = await search.client.multiSearch({ queries: engineSearches(q, i).map((s) => ({ ...s, indexUid: PARTS_INDEX })) }).then(() => true, () => false);
    const c = performance.now();
    if (!answered || !answeredDirect) failed++;
    if (i < 100 || !answered || !answeredDirect) continue; // warm-up
    viaApi.push(b - a);
    direct.push(c - b);
  }
  const result = { api: latency(viaApi), engineOverHttp: latency(direct), addedAtP95: ms(percentile(viaApi, 95) - percentile(direct, 95)), failed };
  const line: Line = {
    what: `API's own overhead, ${allParts} parts`,
    figure: `API p50 ${result.api.p50} / p95 ${result.api.p95} ms; engine over HTTP p50 ${result.engineOverHttp.p50} / p95 ${result.engineOverHttp.p95} ms: adds ${result.addedAtP95} ms at p95`,
    target: 'adds ≤ 5 ms at p95',
    met: result.addedAtP95 <= 5 && failed === 0,
  };
  return { key: 'searchOverhead', result: { ...result, parts: allParts, target: line.target, met: line.met }, lines: [line] };
}

/** (b) Four people typing, one search per keystroke every 150 ms each, through the API. */
async function typing(partsIndexed: number, target: number | null) {
  const TYPING_MS = 150;
  await load(4, 40, (i) => call(searchPath(KEYSTROKES[i % KEYSTROKES.length]!, i)).then(() => {}));
  const result = await load(4, partsIndexed > 10_000 ? 300 : 600, (i) => call(searchPath(KEYSTROKES[i % KEYSTROKES.length]!, i)).then(() => {}), TYPING_MS);
  const line: Line = {
    what: `4 people typing (1 search / ${TYPING_MS} ms each), ${partsIndexed} parts`,
    figure: `API p50 ${result.p50} / p95 ${result.p95} ms${result.failed ? `, ${result.failed} of the searches failed (no answer within the API's 5 s)` : ''}`,
    target: target === null ? '— (reported)' : `p95 ≤ ${target} ms`,
    met: target === null ? null : result.p95 <= target && result.failed === 0,
  };
  return { key: `typing${partsIndexed}`, result: { ...result, everyMs: TYPING_MS, clients: 4, parts: partsIndexed, target: line.target, met: line.met }, lines: [line] };
}

/** (c) Memory of the API server and the search stand-in with the big catalogue indexed and searched. */
async function memory() {
  const result = { apiServerRssMb: rssMb(api.pid!), searchStandinRssMb: rssMb(standin.pid!), parts: allParts, target: '≤ 400 MB each' };
  const lines: Line[] = [
    { what: `API server memory, ${allParts} parts`, figure: `${result.apiServerRssMb} MB RSS`, target: result.target, met: result.apiServerRssMb <= 400 },
    { what: `search stand-in memory, ${allParts} parts`, figure: `${result.searchStandinRssMb} MB RSS`, target: result.target, met: result.searchStandinRssMb <= 400 },
  ];
  return { key: 'memory', result: { ...result, met: lines.every((l) => l.met) }, lines };
}

/** The stack planner with live availability: latency at 4 clients, throughput at 16. */
async function stackPlans() {
  const bodies = [
    { rangeId: 'QRB-HEARTH', modules: 3 },
    { rangeId: 'HLM-TOR', modules: 5, inverterSku: 'HLM-INV-10HV3' },
    { rangeId: 'TVP-SL48', modules: 7, stacks: 2 },
    { rangeId: 'QRB-RIDGE', targetUsableKwh: 9, inverterSku: 'HLM-INV-6HV1' },
    { rangeId: 'QRB-HEARTH', targetUsableKwh: 20, inverterSku: 'QRB-INV-5LV' },
  ];
  const checkedPlan = (i: number) => call('/api/stack-plans', bodies[i % bodies.length]).then(() => {});
  await load(16, 300, checkedPlan);
  const latency4Clients = await load(4, 3000, checkedPlan);
  const saturation16Clients = await load(16, 5000, checkedPlan);
  const line: Line = {
    what: 'stack plan incl. availability',
    figure: `p95 ${latency4Clients.p95} ms at 4 clients; ${saturation16Clients.perSecond} req/s at 16 (p95 ${saturation16Clients.p95} ms)`,
    target: 'p95 ≤ 15 ms and ≥ 400 req/s',
    met: latency4Clients.p95 <= 15 && saturation16Clients.perSecond >= 400,
  };
  return { key: 'stackPlan', result: { latency4Clients, saturation16Clients, target: line.target, met: line.met }, lines: [line] };
}

/** The gzip size of what the first route loads. */
/** Concurrent reservations on scarce parts beside single-row UPDATE transactions on the same server. */
async function reservations() {
  const r = await benchReservations(env.DATABASE_URL);
  const line: Line = {
    what: 'reservations on scarce parts, 16 clients',
    figure: `${r.reservationsPerSecond} jobs/s vs single-row UPDATE ${r.singleRowUpdatesPerSecond} tx/s (ratio ${r.ratio}; transaction alone ${r.transactionRatio}); oversold ${r.oversoldRows}; load ${r.loadAverage}`,
    target: '≥ 40 % of reference, 0 oversold',
    met: r.met,
  };
  return { key: 'reservations', result: r, lines: [line] };
}

/** A 100,000-row price list end to end through the API, beside a bulk insert of the same rows; the API's peak RSS. */
async function priceList() {
  const r = await benchPriceList(context.db, base, api.pid!);
  const line: Line = {
    what: 'price-list import, 100,000 rows',
    figure: `${r.importSeconds} s end to end vs ${r.referenceSeconds} s ${r.reference} (ratio ${r.ratio}); API peak ${r.apiPeakRssMb} MB RSS`,
    target: '≤ 4× reference, ≤ 400 MB',
    met: r.met,
  };
  return { key: 'priceList', result: r, lines: [line] };
}

async function bundle() {
  const dist = path.resolve('dist/client');
  const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
  const assets = [...html.matchAll(/(?:src|href)="(\/assets\/[^"]+\.(?:js|css))"/g)].map((m) => m[1]!);
  const signInChunk = readFileSync(path.join(dist, assets.find((a) => a.endsWith('.js'))!), 'utf8').match(/assets\/sign-in-[\w-]+\.js/);
  const files = [...new Set([...assets.map((a) => a.slice(1)), ...(signInChunk ? [signInChunk[0]] : [])])];
  const firstRouteGzipKb = Math.round(files.reduce((s, f) => s + gzipSync(readFileSync(path.join(dist, f))).length, 0) / 102.4) / 10;
  const line: Line = { what: 'client bundle, first route', figure: `${firstRouteGzipKb} KB gzip`, target: '≤ 200 KB', met: firstRouteGzipKb <= 200 };
  return { key: 'bundle', result: { firstRouteGzipKb, files, target: line.target, met: line.met }, lines: [line] };
}

/** The index cut down to a large wholesaler's whole range: the first `count` parts, re-sent by the app's own sync. */
async function indexOnly(count: number) {
  const ids = (await context.db.select({ id: parts.id }).from(parts).orderBy(asc(parts.sku)).limit(count)).map((r) => r.id);
  await partsIndex.index.delete().waitTask();
  await partsIndex.configure();
  await partsIndex.sync(context.db, ids);
  return ids.length;
}

// --- the run ------------------------------------------------------------------------------------------
// The load average beside the figures: on a shared machine other work slows every figure down.
const results: Record<string, unknown> = { machine: { node: process.version, cpus: os.cpus().length, loadAverageAtStart: os.loadavg()[0] }, at: new Date().toISOString(), indexing };
const lines: Line[] = [];
try {
  const run = async (bench: Promise<{ key: string; result: unknown; lines: Line[] }>) => {
    const done = await bench;
    // Each figure as soon as it is known, so a later benchmark that fails or is stopped loses nothing.
    console.log(`  ${new Date().toISOString().slice(11, 19)} ${done.key} done: ${done.lines.map((l) => `${l.figure} (target ${l.target})`).join('; ')}`);
    results[done.key] = done.result;
    lines.push(...done.lines);
  };
  // `npm run bench -- --only=stackPlan,reservations` runs some of them (names as printed when done).
  const only = process.argv.find((a) => a.startsWith('--only='))?.slice('--only='.length).split(',');
  const wanted = (name: string) => !only || only.includes(name);
  if (wanted('searchOverhead')) await run(searchOverhead());
  if (wanted('typing50k')) await run(typing(allParts, null));
  if (wanted('memory')) await run(memory());
  if (wanted('stackPlan')) await run(stackPlans());
  if (wanted('bundle')) await run(bundle());
  if (wanted('typing10k')) await run(typing(await indexOnly(10_000), 50));
  if (wanted('reservations')) await run(reservations());
  if (wanted('labels')) await run(benchLabels());
  if (wanted('priceList')) await run(priceList());
} finally {
  await clients.close();
  await search.close();
  api.kill('SIGTERM');
  standin.kill('SIGTERM');
  await context.db.$client.end();
}

Object.assign(results.machine as object, { loadAverageAtEnd: os.loadavg()[0] });
mkdirSync('bench-results', { recursive: true });
writeFileSync('bench-results/bench.json', `${JSON.stringify(results, null, 2)}\n`);
const mark = (met: boolean | null) => (met === null ? '' : met ? 'met' : 'NOT MET');
const width = Math.max(...lines.map((l) => l.what.length));
console.log('');
for (const l of lines) console.log(`${l.what.padEnd(width)}  ${l.figure}   target ${l.target}  ${mark(l.met)}`);
console.log(`load average (1 min) ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} cores: other work on this machine slows every figure`);
console.log('written to bench-results/bench.json');

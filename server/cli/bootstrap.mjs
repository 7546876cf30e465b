// Bootstrapping shared by `npm start` and `npm test`. Plain Node with built-ins only:
// it runs before node_modules exists.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, statSync, chownSync, writeFileSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const isRoot = process.getuid?.() === 0;

export function log(message) {
  process.stdout.write(`[stackyard] ${message}\n`);
}

export function fail(message) {
  process.stderr.write(`\n[stackyard] ${message}\n`);
  process.exit(1);
}

function run(cmd, args, options = {}) {
  const result = spawnSync(cmd, args, { stdio: 'inherit', ...options });
  if (result.status !== 0) fail(`"${cmd} ${args.join(' ')}" failed (exit ${result.status}).`);
  return result;
}

function capture(cmd, args, options = {}) {
  return spawnSync(cmd, args, { encoding: 'utf8', ...options });
}

let aptUpdated = false;
export function aptInstall(pkg, why) {
  if (!isRoot) {
    fail(`${why} is missing. Install Debian's "${pkg}" package (sudo apt-get install -y --no-install-recommends ${pkg}) and run again.`);
  }
  log(`installing Debian package ${pkg} (${why})…`);
  if (!aptUpdated) {
    run('apt-get', ['update', '-q'], { stdio: ['ignore', 'ignore', 'inherit'] });
    aptUpdated = true;
  }
  run('apt-get', ['install', '-y', '-q', '--no-install-recommends', pkg], {
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
}

export function ensureNodeModules() {
  const lock = path.join(root, 'package-lock.json');
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  log('installing npm packages (npm ci)…');
  run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
}

export function ensureChromium() {
  if (!existsSync('/usr/bin/chromium')) aptInstall('chromium', 'Chromium for the browser tests');
}

function findPgBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const majors = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return majors.length ? path.join(base, majors[0], 'bin') : null;
}

// initdb and pg_ctl refuse to run as root; as root they run as Debian's postgres user.
function asDbUser(cmd, args, options = {}) {
  return isRoot ? capture('runuser', ['-u', 'postgres', '--', cmd, ...args], options) : capture(cmd, args, options);
}

function postgresCanReach(dir) {
  if (!isRoot) return true;
  return capture('runuser', ['-u', 'postgres', '--', 'test', '-w', dir]).status === 0;
}

/** The data folder lives in the project's git-ignored .data/, unless the postgres user cannot reach it. */
function dataDirFor(name) {
  const local = path.join(root, '.data');
  mkdirSync(local, { recursive: true });
  const dir = path.join(local, name);
  mkdirSync(dir, { recursive: true });
  if (isRoot) chownSync(dir, uidOf('postgres'), gidOf('postgres'));
  if (postgresCanReach(dir)) return dir;
  const hash = createHash('sha1').update(root).digest('hex').slice(0, 10);
  const fallback = `/var/lib/postgresql/stackyard-${hash}/${name}`;
  capture('runuser', ['-u', 'postgres', '--', 'mkdir', '-p', fallback]);
  writeFileSync(path.join(local, `${name}.location`), `${fallback}\n`);
  return fallback;
}

function uidOf(user) {
  return Number(capture('id', ['-u', user]).stdout.trim());
}
function gidOf(user) {
  return Number(capture('id', ['-g', user]).stdout.trim());
}

/**
 * Makes sure a PostgreSQL cluster called `name` runs on 127.0.0.1:`port` and that `databases` exist.
 * Returns { url(db), started, stop() }: `started` says whether this call started the server.
 */
export function ensurePostgres({ name, port, databases = [] }) {
  let bin = findPgBin();
  if (!bin) {
    aptInstall('postgresql', 'the PostgreSQL server');
    bin = findPgBin();
    if (!bin) fail('PostgreSQL was installed but no server binaries were found under /usr/lib/postgresql.');
  }
  const dataDir = dataDirFor(name);
  const user = 'stackyard';
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`creating PostgreSQL cluster in ${path.relative(root, dataDir) || dataDir}…`);
    const init = asDbUser(path.join(bin, 'initdb'), ['-D', dataDir, '-U', user, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    if (init.status !== 0) fail(`initdb failed:\n${init.stderr || init.stdout}`);
  }
  const logFile = path.join(dataDir, 'server.log');
  let started = false;
  const status = asDbUser(path.join(bin, 'pg_ctl'), ['status', '-D', dataDir]);
  if (status.status !== 0) {
    log(`starting PostgreSQL on 127.0.0.1:${port}…`);
    const opts = `-c listen_addresses=127.0.0.1 -p ${port} -k ${dataDir} -c fsync=${name.includes('test') ? 'off' : 'on'} -c max_connections=200`;
    const start = asDbUser(path.join(bin, 'pg_ctl'), ['start', '-w', '-t', '60', '-D', dataDir, '-l', logFile, '-o', opts]);
    if (start.status !== 0) {
      const tail = existsSync(logFile) ? readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
      fail(`PostgreSQL did not start:\n${start.stderr || start.stdout}\n${tail}`);
    }
    started = true;
  }
  const psql = (sql, db = 'postgres') =>
    capture(path.join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(port), '-U', user, '-d', db, '-tAc', sql]);
  for (const db of databases) {
    const exists = psql(`select 1 from pg_database where datname = '${db}'`);
    if (exists.status !== 0) fail(`cannot reach PostgreSQL on port ${port}:\n${exists.stderr}`);
    if (exists.stdout.trim() !== '1') {
      const created = psql(`create database "${db}"`);
      if (created.status !== 0) fail(`could not create database ${db}:\n${created.stderr}`);
    }
  }
  return {
    url: (db) => `postgres://${user}@127.0.0.1:${port}/${db}`,
    started,
    stop() {
      asDbUser(path.join(bin, 'pg_ctl'), ['stop', '-D', dataDir, '-m', 'fast', '-w']);
    },
  };
}

/** Starts a TypeScript entry point under tsx (restarting on change with `watch`) as a child that ends with us. */
export function spawnTs(entry, { env = {}, name, watch = false } = {}) {
  const args = watch
    ? [path.join(root, 'node_modules/tsx/dist/cli.mjs'), 'watch', '--clear-screen=false', path.join(root, entry)]
    : ['--import', 'tsx', path.join(root, entry)];
  return spawnChild(process.execPath, args, { env, name: name ?? entry });
}

/** Preloaded into Node children so they stop when we are gone, however we went. */
const DIE_WITH_PARENT = `--import=${new URL('./die-with-parent.mjs', import.meta.url).href}`;

/** A child process that ends with us (even if we are killed outright); if it stops on its own, so do we. */
export function spawnChild(cmd, args, { env = {}, name } = {}) {
  const nodeOptions = [process.env.NODE_OPTIONS, env.NODE_OPTIONS, DIE_WITH_PARENT].filter(Boolean).join(' ');
  const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env, NODE_OPTIONS: nodeOptions }, stdio: 'inherit' });
  child.on('exit', (code, signal) => {
    if (!shuttingDown && code !== 0) fail(`${name ?? cmd} stopped unexpectedly (${signal ?? code}).`);
  });
  children.push(child);
  return child;
}

const children = [];
let shuttingDown = false;
/**
 * Whatever ends us — Ctrl-C, SIGTERM, SIGHUP (the terminal closed), or our parent going away
 * (npm killed, which does not always pass the signal on) — stop the children we started
 * (SIGKILL for any still running after 10 s), then run `cleanup` (stopping PostgreSQL).
 */
export function onShutdown(cleanup) {
  const shutdown = async (why) => {
    if (shuttingDown) return;
    shuttingDown = true;
    log(`stopping (${why})…`);
    for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
    const force = setTimeout(() => {
      for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    }, 10_000);
    await Promise.all(children.map((c) => (c.exitCode === null && c.signalCode === null ? new Promise((r) => c.once('exit', r)) : null)));
    clearTimeout(force);
    try {
      cleanup?.();
    } finally {
      process.exit(0);
    }
  };
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => void shutdown(signal));
  const parent = process.ppid;
  // Under npm the chain is npm → sh -c → us, and the shell may outlive npm: watch npm too.
  const watched = [parent, ...(process.env.npm_lifecycle_event ? [parentOf(parent)].filter((p) => p > 1) : [])];
  setInterval(() => {
    let gone = process.ppid !== parent;
    for (const pid of watched) {
      try {
        if (!gone) process.kill(pid, 0);
      } catch {
        gone = true;
      }
    }
    if (gone) void shutdown('parent process gone');
  }, 500).unref();
}

/** A process's parent id, from /proc (Linux); 0 when it cannot be read. */
function parentOf(pid) {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) || 0;
  } catch {
    return 0;
  }
}

/** Newest modification time under the given paths (files or folders). */
export function newestMtime(paths) {
  let newest = 0;
  const visit = (p) => {
    if (!existsSync(p)) return;
    const s = statSync(p);
    if (s.isDirectory()) for (const entry of readdirSync(p)) visit(path.join(p, entry));
    else newest = Math.max(newest, s.mtimeMs);
  };
  for (const p of paths) visit(path.join(root, p));
  return newest;
}

export function waitForHttp(url, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  return new Promise((resolve, reject) => {
    const attempt = () => {
      fetch(url)
        .then((r) => (r.ok ? resolve() : retry()))
        .catch(retry);
    };
    const retry = () => (Date.now() > deadline ? reject(new Error(`${url} did not answer`)) : setTimeout(attempt, 150));
    attempt();
  });
}

/** Resolves once something accepts TCP connections on the loopback port (the SMTP stand-in). */
export function waitForPort(port, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  return new Promise((resolve, reject) => {
    const attempt = () => {
      const socket = net.connect(port, '127.0.0.1');
      socket.once('connect', () => {
        socket.destroy();
        resolve();
      });
      socket.once('error', () => {
        socket.destroy();
        if (Date.now() > deadline) reject(new Error(`nothing answered on port ${port}`));
        else setTimeout(attempt, 150);
      });
    };
    attempt();
  });
}

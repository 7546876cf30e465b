// Whatever ends `npm start` stops everything it started: signals to the start script, its parent
// (npm) going away without passing a signal on, and the start script itself killed outright.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

const fixture = fileURLToPath(new URL('../support/start-fixture.mjs', import.meta.url));
const root = fileURLToPath(new URL('../..', import.meta.url));

async function freePort(): Promise<number> {
  const server = net.createServer().listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((r) => server.close(r));
  return port;
}

/** Everything a test started, so a failing test leaves nothing running behind it. */
const started: number[] = [];
afterAll(() => {
  for (const pid of started) if (alive(pid)) process.kill(pid, 'SIGKILL');
});

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

const portOpen = (port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('error', () => resolve(false));
  });

/** Starts the fixture, directly or under a stand-in for npm that passes no signal on; resolves once its child serves. */
/** package.json's own start script, aimed at the fixture: run by the real npm, as `npm start` is. */
function npmProject(port: number, marker: string) {
  const script = (JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8')) as { scripts: { start: string } }).scripts.start;
  expect(script).toContain('server/cli/start.mjs');
  const dir = path.dirname(marker);
  writeFileSync(path.join(dir, 'package.json'), JSON.stringify({ name: 'stop-check', private: true, scripts: { start: script.replace('server/cli/start.mjs', `${fixture} ${port} ${marker}`) } }));
  return dir;
}

async function start(via: 'direct' | 'parent' | 'npm-shell' | 'npm') {
  const port = await freePort();
  const marker = path.join(mkdtempSync(path.join(os.tmpdir(), 'stackyard-stop-')), 'cleaned');
  const command = [process.execPath, fixture, String(port), marker];
  if (via === 'npm') {
    const proc = spawn('npm', ['start', '--silent'], { cwd: npmProject(port, marker), stdio: ['ignore', 'pipe', 'inherit'] });
    return ready(proc, port, marker);
  }
  // 'npm-shell' is npm's own chain: npm → sh -c "node …" → the start script; the shell outlives npm.
  const spawnIt = via === 'npm-shell' ? `spawn('sh', ['-c', ${JSON.stringify(command.join(' '))}], { stdio: 'inherit', env: { ...process.env, npm_lifecycle_event: 'start' } })` : `spawn(${JSON.stringify(command[0])}, ${JSON.stringify(command.slice(1))}, { stdio: 'inherit' })`;
  const args = via === 'direct' ? command.slice(1) : ['-e', `const { spawn } = require('node:child_process'); ${spawnIt}; setInterval(() => {}, 1000);`];
  return ready(spawn(process.execPath, args, { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] }), port, marker);
}

async function ready(proc: ChildProcess, port: number, marker: string) {
  const line = await new Promise<string>((resolve, reject) => {
    let out = '';
    proc.stdout!.on('data', (c) => {
      out += c;
      const ready = out.split('\n').find((l) => l.startsWith('{"ready"'));
      if (ready) resolve(ready);
    });
    proc.once('exit', (code) => reject(new Error(`fixture ended early (${code}): ${out}`)));
  });
  const { child, self } = JSON.parse(line) as { child: number; self: number };
  started.push(child, self, proc.pid!);
  expect(await portOpen(port)).toBe(true);
  return { proc, port, marker, child };
}

async function expectAllStopped(s: Awaited<ReturnType<typeof start>>, { cleanedUp = true } = {}) {
  await expect.poll(() => alive(s.child), { timeout: 15_000, interval: 100 }).toBe(false);
  await expect.poll(() => portOpen(s.port), { timeout: 5_000, interval: 100 }).toBe(false);
  if (cleanedUp) await expect.poll(() => existsSync(s.marker), { timeout: 5_000, interval: 100 }).toBe(true);
}

describe('stopping npm start', () => {
  it.each(['SIGTERM', 'SIGINT', 'SIGHUP'] as const)('%s to the start script stops its children and cleans up', async (signal) => {
    const s = await start('direct');
    s.proc.kill(signal);
    await expectAllStopped(s);
  }, 60_000);

  it.each(['SIGINT', 'SIGTERM', 'SIGHUP'] as const)('%s to npm itself (npm start run by the real npm) stops everything', async (signal) => {
    const s = await start('npm');
    s.proc.kill(signal);
    await expectAllStopped(s);
  }, 60_000);

  it.each(['parent', 'npm-shell'] as const)('its %s ending without passing the signal on stops everything too', async (via) => {
    const s = await start(via);
    s.proc.kill('SIGTERM'); // npm goes; the start script (or the shell between) is now an orphan and must notice
    await expectAllStopped(s);
  }, 60_000);

  it('the start script killed outright still takes its children with it', async () => {
    const s = await start('direct');
    s.proc.kill('SIGKILL');
    // Nothing can run in a killed process, so no cleanup: but its children notice and stop.
    await expectAllStopped(s, { cleanedUp: false });
  }, 60_000);
});

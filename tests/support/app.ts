// A real app for a test file: its own cloned database, its own search stand-in, the real auth.
import path from 'node:path';
import type { Logger } from 'pino';
import { createLogger } from '../../server/logger.ts';
import supertest from 'supertest';
import type { Express } from 'express';
import { createApp, createServices, type AppDeps } from '../../server/app.ts';
import { createAuth, type Auth } from '../../server/auth.ts';
import { createSearchClient } from '../../server/search/client.ts';
import { startSearchStandin } from '../../server/search/standin/server.ts';
import type { Db } from '../../server/db/client.ts';
import type { Role } from '../../shared/roles.ts';
import { DEMO_PASSWORD, makeUser } from '../../seed/factories.ts';
import { createTestDb } from './db.ts';
import { createLocalFileStore } from '../../server/storage/files.ts';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';

export const TEST_ORIGIN = 'http://127.0.0.1:3999';

export interface TestApp {
  app: Express;
  db: Db;
  auth: Auth;
  dbUrl: string;
  searchUrl: string;
  /** The same services the app uses (catalogue, search index, …), for arranging test data. */
  services: AppDeps;
  filesDir: string;
  /** Stops this app's search stand-in, to see how the app copes. */
  stopSearch(): Promise<void>;
  /** A supertest agent signed in as a new user of that role (installers get a new company unless given one). */
  signIn(role: Role, options?: { companyId?: string; email?: string }): Promise<supertest.Agent & { userId: string; companyId: string | null }>;
  close(): Promise<void>;
}

export async function createTestApp(options: { signInLimitPerMinute?: number; clientDir?: string; baseURL?: string; logger?: Logger; trustProxy?: string | number | boolean; connectVia?: (url: string) => string; now?: () => Date } = {}): Promise<TestApp> {
  const { db, url, drop } = await createTestDb(options.connectVia);
  const standin = await startSearchStandin({ port: 0 });
  const baseURL = options.baseURL ?? TEST_ORIGIN;
  const trustedOrigins = [baseURL];
  const logger = options.logger ?? createLogger(process.env.TEST_LOG_LEVEL ?? 'silent');
  const auth = createAuth({ db, baseURL, secret: 'test-secret-test-secret-test-secret-0123', trustedOrigins, signInLimitPerMinute: options.signInLimitPerMinute ?? 1000, logger });
  const search = createSearchClient({ host: standin.url });
  let searchStopped = false;
  const filesDir = mkdtempSync(path.join(os.tmpdir(), 'stackyard-files-'));
  const appOptions = {
    db,
    auth,
    search,
    files: createLocalFileStore(filesDir),
    logger,
    trustProxy: options.trustProxy,
    trustedOrigins,
    clientDir: options.clientDir ? path.resolve(options.clientDir) : undefined,
    now: options.now,
  };
  // One set of services: the app serves with them and tests arrange data through the same ones.
  const services = createServices(appOptions);
  const app = createApp(appOptions, services);
  await services.partsIndex.configure();

  return {
    app,
    db,
    auth,
    dbUrl: url,
    searchUrl: standin.url,
    services,
    filesDir,
    async signIn(role, { companyId, email } = {}) {
      const u = await makeUser(db, auth, { role, companyId, email });
      const agent = supertest.agent(app);
      const res = await agent.post('/api/auth/sign-in/email').set('origin', baseURL).send({ email: u.email, password: DEMO_PASSWORD });
      if (res.status !== 200) throw new Error(`test sign-in failed: ${res.status} ${res.text}`);
      return Object.assign(agent, { userId: u.id, companyId: u.companyId });
    },
    async stopSearch() {
      if (!searchStopped) await standin.close();
      searchStopped = true;
    },
    async close() {
      await search.close();
      if (!searchStopped) await standin.close();
      await drop();
    },
  };
}

// A real app for a test file: its own cloned database, its own search stand-in, the real auth.
import path from 'node:path';
import type { Logger } from 'pino';
import { createLogger } from '../../server/logger.ts';
import supertest from 'supertest';
import { sql } from 'drizzle-orm';
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
import PgBoss from 'pg-boss';
import { startPaymentStandin, type PaymentStandin } from '../../server/payments/standin/server.ts';
import { createPaymentProvider } from '../../server/payments/provider.ts';
import { startMailStandin, type MailStandin } from '../../server/mail/standin/server.ts';
import { startMailQueue } from '../../server/jobs/mail-queue.ts';
import { createMailTransport } from '../../server/mail/transport.ts';

export const TEST_PAY_KEY = 'sk_test_stackyard_tests';
export const TEST_WEBHOOK_SECRET = 'whsec_stackyard_tests';

export interface TestMail {
  standin: MailStandin;
  boss: PgBoss;
  /** Waits until the outbox has no message left to send (sent or failed), or throws after `ms`. */
  settled(ms?: number): Promise<void>;
  stop(): Promise<void>;
}

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
  /** This app's payment stand-in (the SDK is pointed at it); set `webhookUrl` to have it post paid events. */
  pay: PaymentStandin;
  /**
   * Starts the SMTP stand-in and the mail queue on pg-boss for this app's database (mail tests
   * only; other tests leave messages waiting in the outbox). `retryDelaySeconds` keeps retries short.
   */
  startMail(options?: { retryLimit?: number; retryDelaySeconds?: number }): Promise<TestMail>;
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
  const pay = await startPaymentStandin({ secretKey: TEST_PAY_KEY, webhookSecret: TEST_WEBHOOK_SECRET });
  const mails: TestMail[] = [];
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
    payment: { provider: createPaymentProvider({ secretKey: TEST_PAY_KEY, webhookSecret: TEST_WEBHOOK_SECRET, apiBase: pay.url }), webhookSecret: TEST_WEBHOOK_SECRET },
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
    pay,
    async startMail({ retryLimit = 3, retryDelaySeconds = 1 } = {}) {
      const mailStandin = await startMailStandin({ port: 0, databaseUrl: url });
      const boss = new PgBoss({ connectionString: url, schema: 'pgboss', max: 3 });
      boss.on('error', () => {});
      await boss.start();
      const queue = await startMailQueue({ boss, connectionString: url, mail: services.mail, transport: createMailTransport(mailStandin.url), logger: { info() {}, warn() {}, error() {} }, retryLimit, retryDelaySeconds, pollingIntervalSeconds: 0.5 });
      const handle: TestMail = {
        standin: mailStandin,
        boss,
        async settled(ms = 20_000) {
          const until = Date.now() + ms;
          for (;;) {
            const { rows } = await db.execute<{ n: number }>(sql`select count(*)::int as n from mail_outbox where status not in ('sent', 'failed')`);
            if (rows[0]!.n === 0) return;
            if (Date.now() > until) throw new Error(`${rows[0]!.n} message(s) still unsent after ${ms} ms`);
            await new Promise((r) => setTimeout(r, 100));
          }
        },
        async stop() {
          await queue.stop();
          await boss.stop({ graceful: false, close: true, wait: true });
          await mailStandin.close();
        },
      };
      mails.push(handle);
      return handle;
    },
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
      for (const m of mails) await m.stop();
      await pay.close();
      await search.close();
      if (!searchStopped) await standin.close();
      await drop();
    },
  };
}

// Several instances starting together against one empty database: each migrates at start, so the
// migrations must run once, in order, while the others wait (advisory lock), and all must start.
import { readFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { createDb, migrateDb, withSchemaLock } from '../../server/db/client.ts';
import { createAuth } from '../../server/auth.ts';
import { seedDemo, DEMO_SIGN_INS } from '../../seed/demo.ts';
import { createTestDb } from '../support/db.ts';

const journal = JSON.parse(readFileSync(new URL('../../drizzle/meta/_journal.json', import.meta.url), 'utf8')) as { entries: unknown[] };

async function withEmptyDatabase(fn: (url: string) => Promise<void>) {
  const adminUrl = process.env.TEST_PG_URL!;
  const name = `t_lock_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database "${name}"`);
  try {
    await fn(adminUrl.replace(/\/[^/]*$/, `/${name}`));
  } finally {
    await admin.query(`drop database if exists "${name}" with (force)`);
    await admin.end();
  }
}

describe('migrating at start from several instances', () => {
  it('runs each migration once while the other instances wait, and every instance starts', async () => {
    await withEmptyDatabase(async (url) => {
      const instances = [createDb(url, { max: 3 }), createDb(url, { max: 3 }), createDb(url, { max: 3 })];
      try {
        const results = await Promise.allSettled(instances.map((db) => migrateDb(db)));
        expect(results.map((r) => (r.status === 'rejected' ? String(r.reason) : 'ok'))).toEqual(['ok', 'ok', 'ok']);
        const { rows } = await instances[0]!.execute<{ n: string }>(sql`select count(*)::text as n from drizzle.__drizzle_migrations`);
        expect(Number(rows[0]!.n)).toBe(journal.entries.length);
      } finally {
        await Promise.all(instances.map((db) => db.$client.end()));
      }
    });
  });

  it('makes a second instance wait for the first one’s lock', async () => {
    await withEmptyDatabase(async (url) => {
      const [a, b] = [createDb(url, { max: 2 }), createDb(url, { max: 2 })];
      try {
        const order: string[] = [];
        let release!: () => void;
        const held = new Promise<void>((r) => (release = r));
        const first = withSchemaLock(a, async () => {
          order.push('first in');
          await held;
          order.push('first out');
        });
        await expect.poll(() => order.length).toBe(1);
        const second = withSchemaLock(b, async () => void order.push('second in'));
        await new Promise((r) => setTimeout(r, 300));
        expect(order).toEqual(['first in']); // still waiting
        release();
        await Promise.all([first, second]);
        expect(order).toEqual(['first in', 'first out', 'second in']);
      } finally {
        await Promise.all([a.$client.end(), b.$client.end()]);
      }
    });
  });

  it('seeds the demo scenario once when two instances seed at the same moment', async () => {
    const { url, drop, db: first } = await createTestDb();
    const second = createDb(url, { max: 3 });
    try {
      const instance = (db: typeof first) => {
        const auth = createAuth({ db, baseURL: 'http://127.0.0.1:3999', secret: 'test-secret-test-secret-test-secret-0123', trustedOrigins: [], signInLimitPerMinute: 10 });
        return withSchemaLock(db, () => seedDemo(db, auth));
      };
      const results = await Promise.all([instance(first), instance(second)]);
      expect(results.map((r) => r.seeded).sort()).toEqual([false, true]);
      const { rows } = await first.execute<{ n: string }>(sql`select count(*)::text as n from "user"`);
      expect(Number(rows[0]!.n)).toBe(DEMO_SIGN_INS.length + 1); // the sign-ins plus one more office installer (seed/demo.ts)
    } finally {
      await second.$client.end();
      await drop();
    }
  }, 60_000);
});

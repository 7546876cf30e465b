import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { createDb, type Db } from '../../server/db/client.ts';

const TEMPLATE_DB = 'stackyard_template';

function adminUrl() {
  const url = process.env.TEST_PG_URL;
  if (!url) throw new Error('TEST_PG_URL is not set: run the tests with `npm test`.');
  return url;
}

async function admin<T>(fn: (c: pg.Client) => Promise<T>) {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** A fresh database cloned from the migrated template: real PostgreSQL, private to the caller. */
export async function createTestDb(connectVia?: (url: string) => string): Promise<{ db: Db; url: string; drop(): Promise<void> }> {
  const name = `t_${process.pid}_${randomBytes(4).toString('hex')}`;
  await admin((c) => c.query(`create database "${name}" template "${TEMPLATE_DB}"`));
  const url = adminUrl().replace(/\/[^/]*$/, `/${name}`);
  const db = createDb(connectVia ? connectVia(url) : url, { max: 10 });
  return {
    db,
    url,
    async drop() {
      await db.$client.end();
      await admin((c) => c.query(`drop database if exists "${name}" with (force)`));
    },
  };
}

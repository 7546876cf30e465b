import { createHash } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import type { SQL } from 'drizzle-orm';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import type { PgDialect, PgSession } from 'drizzle-orm/pg-core';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import * as schema from './schema/index.ts';

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

/**
 * `db.execute(query)` as a named prepared statement (the name is the hash of its text): each
 * connection parses and plans it once, later calls only bind and run it. For the statements of
 * hot paths (reserving a job) whose planning costs more than running them.
 */
export async function executePrepared<T extends Record<string, unknown>>(db: DbOrTx, query: SQL): Promise<{ rows: T[] }> {
  const { dialect, session } = db as unknown as { dialect: PgDialect; session: PgSession };
  const built = dialect.sqlToQuery(query);
  const name = `sy_${createHash('sha1').update(built.sql).digest('hex').slice(0, 24)}`;
  return (await session.prepareQuery(built, undefined, name, false).execute()) as { rows: T[] };
}

const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../drizzle');

export function createDb(url: string, { max = 20 }: { max?: number } = {}): Db {
  const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: 5_000 });
  // A dropped connection (database restart) must not crash the process; the pool reconnects.
  pool.on('error', () => {});
  return drizzle({ client: pool, schema, casing: 'snake_case' }) as Db;
}

/** The advisory lock key every instance takes around migrating and seeding (any fixed 64-bit number). */
export const SCHEMA_LOCK_KEY = 0x5374_6b79_6172; // "Stkyar"

/**
 * Runs `work` while one pinned connection holds PostgreSQL's session advisory lock, so instances
 * starting together take turns: the second waits, then finds the work done. The work itself uses
 * the pool's other connections (so the pool needs at least two); the lock goes with the
 * connection if the process dies.
 */
export async function withSchemaLock<T>(db: Db, work: () => Promise<T>): Promise<T> {
  const client = await db.$client.connect();
  try {
    await client.query('select pg_advisory_lock($1)', [SCHEMA_LOCK_KEY]);
    try {
      return await work();
    } finally {
      await client.query('select pg_advisory_unlock($1)', [SCHEMA_LOCK_KEY]).catch(() => {});
    }
  } finally {
    client.release();
  }
}

/** Applies pending migrations; safe from every instance at once (they queue on the advisory lock). */
export async function migrateDb(db: Db) {
  await withSchemaLock(db, () => migrate(db, { migrationsFolder }));
}

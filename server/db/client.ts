import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import * as schema from './schema/index.ts';

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

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

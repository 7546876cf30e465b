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

export async function migrateDb(db: Db) {
  await migrate(db, { migrationsFolder });
}

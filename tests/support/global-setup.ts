// Builds the migrated template database once per run; each test file clones it (fast, isolated).
import pg from 'pg';
import { createDb, migrateDb } from '../../server/db/client.ts';

export const TEMPLATE_DB = 'stackyard_template';

export default async function setup() {
  if (process.env.STACKYARD_NO_DB === '1') return;
  const adminUrl = process.env.TEST_PG_URL;
  if (!adminUrl) throw new Error('TEST_PG_URL is not set: run the tests with `npm test`, which starts the test database.');
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  // Leftovers of an interrupted run.
  const { rows } = await admin.query(`select datname from pg_database where datname like 't\\_%' or datname = $1`, [TEMPLATE_DB]);
  for (const r of rows) await admin.query(`drop database if exists "${r.datname}" with (force)`);
  await admin.query(`create database "${TEMPLATE_DB}"`);
  await admin.end();

  const db = createDb(adminUrl.replace(/\/[^/]*$/, `/${TEMPLATE_DB}`), { max: 2 });
  await migrateDb(db);
  await db.$client.end();
}

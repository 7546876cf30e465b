// `npm run db:migrate | db:seed | db:reset | search:reindex` (through server/cli/db.mjs).
import { sql } from 'drizzle-orm';
import { readEnv } from '../env.ts';
import { migrateDb, withSchemaLock } from '../db/client.ts';
import { buildContext } from '../context.ts';
import { seedDemo } from '../../seed/demo.ts';
import { createServices } from '../deps.ts';

const tasks = process.argv.slice(2);
const context = buildContext(readEnv());
const { db, auth } = context;
const { partsIndex } = createServices(context);

for (const task of tasks) {
  if (task === 'reset') {
    await db.execute(sql`drop schema if exists public cascade`);
    await db.execute(sql`drop schema if exists drizzle cascade`);
    await db.execute(sql`drop schema if exists pgboss cascade`);
    await db.execute(sql`create schema public`);
    console.log('database emptied');
    await migrateDb(db);
    console.log('migrated');
    const { seeded } = await seedDemo(db, auth);
    console.log(seeded ? 'demo scenario seeded' : 'demo scenario already present');
  } else if (task === 'migrate') {
    await migrateDb(db);
    console.log('migrated');
  } else if (task === 'seed') {
    // Instances starting together seed one after the other; the second finds the marker.
    const { seeded } = await withSchemaLock(db, () => seedDemo(db, auth));
    console.log(seeded ? 'demo scenario seeded' : 'demo scenario already present');
  } else if (task === 'reindex') {
    console.log(`search index rebuilt with ${await partsIndex.rebuild(db)} parts`);
  } else {
    console.error(`unknown task ${task}: use migrate, seed, reset or reindex`);
    process.exitCode = 2;
  }
}
await db.$client.end();

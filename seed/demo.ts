// The demo scenario: an invented battery wholesaler, its staff and three installer companies.
import { eq } from 'drizzle-orm';
import type { Db } from '../server/db/client.ts';
import type { Auth } from '../server/auth.ts';
import { settings } from '../server/db/schema/index.ts';
import type { Role } from '../shared/roles.ts';
import { DEMO_PASSWORD, makeCompany, makeUser, wholesaler } from './factories.ts';
import { seedCatalogue } from './catalogue.ts';
import { seedDemoJobs } from './jobs.ts';
import { seedDemoWarehouse } from './warehouse.ts';
import { seedPurchasing } from './purchasing.ts';
import type { PartsIndex } from '../server/search/parts-index.ts';
import signIns from './demo-sign-ins.json' with { type: 'json' };

const SEED_KEY = 'seed.demo';
export const DEMO_VERSION = 1;

export const DEMO_SIGN_INS = signIns as { email: string; role: Role; name: string; company?: string }[];

const INSTALLERS = [
  { name: 'Brightgum Electrical', abn: '14 987 650 002', suburb: 'Thornbury', postcode: '3071', accountType: 'trade' as const, tierDiscountPct: '8' },
  { name: 'Southerly Solar & Storage', abn: '84 987 650 003', suburb: 'Mornington', postcode: '3931', accountType: 'cash' as const, tierDiscountPct: '5' },
  { name: 'Saltbush Home Energy', abn: '65 987 650 004', suburb: 'Ballarat', postcode: '3350', accountType: 'cash' as const, tierDiscountPct: '0' },
];

/** Seeds once: a second run finds the marker and adds nothing. */
export async function seedDemo(db: Db, auth: Auth, partsIndex?: PartsIndex) {
  const [done] = await db.select().from(settings).where(eq(settings.key, SEED_KEY));
  if (done && (done.value as { version?: number }).version === DEMO_VERSION) {
    const jobs = await seedDemoJobs(db);
    const warehouse = await seedDemoWarehouse(db);
    return { seeded: jobs || warehouse };
  }

  const home = await wholesaler(db);
  const customers = new Map<string, string>();
  for (const c of INSTALLERS) customers.set(c.name, (await makeCompany(db, { ...c, kind: 'installer' })).id);

  for (const u of DEMO_SIGN_INS) {
    const companyId = u.company ? customers.get(u.company)! : home.id;
    await makeUser(db, auth, { email: u.email, role: u.role, name: u.name, password: DEMO_PASSWORD, companyId });
  }
  await makeUser(db, auth, { email: 'office@saltbush-home.test', role: 'installer', name: 'Maya Lindqvist', companyId: customers.get('Saltbush Home Energy')! });

  // The catalogue and the marker commit together, so an interrupted seed can simply run again.
  await db.transaction(async (tx) => {
    await seedCatalogue(tx);
    await seedPurchasing(tx);
    const value = { version: DEMO_VERSION, at: new Date().toISOString() };
    await tx.insert(settings).values({ key: SEED_KEY, value }).onConflictDoUpdate({ target: settings.key, set: { value } });
  });
  await seedDemoJobs(db);
  await seedDemoWarehouse(db);
  await partsIndex?.rebuild(db);
  return { seeded: true };
}

// Factories shared by the demo seed and the tests: each creates missing parents itself,
// so a caller states only what it cares about.
import { eq } from 'drizzle-orm';
import type { Db } from '../server/db/client.ts';
import type { Auth } from '../server/auth.ts';
import { companies, user } from '../server/db/schema/index.ts';
import type { Role } from '../shared/roles.ts';

let counter = 0;
const next = () => `${Date.now().toString(36)}${(counter++).toString(36)}`;

export const DEMO_PASSWORD = 'stackyard-demo';

export async function makeCompany(db: Db, fields: Partial<typeof companies.$inferInsert> = {}) {
  const values = { name: `Company ${next()}`, kind: 'installer' as const, ...fields };
  const [existing] = await db.select().from(companies).where(eq(companies.name, values.name));
  if (existing) return existing;
  const [row] = await db.insert(companies).values(values).returning();
  return row!;
}

export async function wholesaler(db: Db) {
  const [found] = await db.select().from(companies).where(eq(companies.kind, 'wholesaler')).limit(1);
  return found ?? makeCompany(db, { name: 'Lowtide Battery Wholesale', kind: 'wholesaler' });
}

export interface MakeUserOptions {
  role?: Role;
  email?: string;
  name?: string;
  password?: string;
  companyId?: string;
}

/** Creates a user through the auth library (hashed password), or returns the existing one. */
export async function makeUser(db: Db, auth: Auth, options: MakeUserOptions = {}) {
  const role = options.role ?? 'installer';
  const email = (options.email ?? `${role}-${next()}@example.test`).toLowerCase();
  const [existing] = await db.select().from(user).where(eq(user.email, email));
  if (existing) return existing;
  const companyId = options.companyId ?? (role === 'installer' ? (await makeCompany(db)).id : (await wholesaler(db)).id);
  const created = await auth.api.createUser({
    body: { email, password: options.password ?? DEMO_PASSWORD, name: options.name ?? `Test ${role}`, role: role as never, data: { companyId } },
  });
  const [row] = await db.select().from(user).where(eq(user.id, created.user.id));
  return row!;
}

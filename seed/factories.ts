// Factories shared by the demo seed and the tests: each creates missing parents itself,
// so a caller states only what it cares about.
import { eq, sql } from 'drizzle-orm';
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

// ---- Stock and jobs (self-contained: warehouses, stocked parts, opening stock through the ledger) ----
import { makers, parts, stockLevels, stockMovements, warehouses, bins, defaultBins } from '../server/db/schema/index.ts';

/** A warehouse by code (created when missing). Lower ranks are tried first when reserving. */
export async function makeWarehouse(db: Db, fields: { code?: string; name?: string; rank?: number } = {}) {
  const code = fields.code ?? `W${next().toUpperCase()}`.slice(0, 16);
  const [existing] = await db.select().from(warehouses).where(eq(warehouses.code, code));
  if (existing) return existing;
  const [row] = await db.insert(warehouses).values({ code, name: fields.name ?? `Warehouse ${code}`, rank: fields.rank ?? 1 }).returning();
  return row!;
}

/** A plain accessory part (its maker created when missing), for stock and job tests. */
export async function makeStockPart(db: Db, fields: { sku?: string; name?: string; listPriceCents?: number | null; category?: 'accessory' } = {}) {
  const sku = (fields.sku ?? `TST-${next()}`).toUpperCase();
  const [existing] = await db.select().from(parts).where(eq(parts.sku, sku));
  if (existing) return existing;
  const [maker] = await db.insert(makers).values({ code: 'FACTORY', name: 'Factory Test Works' }).onConflictDoUpdate({ target: makers.code, set: { name: 'Factory Test Works' } }).returning();
  const [row] = await db
    .insert(parts)
    .values({ sku, name: fields.name ?? `Test part ${sku}`, category: 'accessory', makerId: maker!.id, listPriceCents: fields.listPriceCents === undefined ? 1000 : fields.listPriceCents, attributes: { category: 'accessory' } })
    .returning();
  return row!;
}

/** Puts units on hand through the ledger (a receive movement with the level kept in step); makes the bin and default bin too. */
export async function putStock(db: Db, partId: string, warehouseId: string, bin: string, qty: number, opts: { pickOrder?: number; isDefault?: boolean } = {}) {
  await db.transaction(async (tx) => {
    await tx.insert(bins).values({ warehouseId, code: bin, pickOrder: opts.pickOrder ?? 0 }).onConflictDoNothing();
    if (opts.isDefault) await tx.insert(defaultBins).values({ partId, warehouseId, bin }).onConflictDoUpdate({ target: [defaultBins.partId, defaultBins.warehouseId], set: { bin } });
    await tx
      .insert(stockLevels)
      .values({ partId, warehouseId, bin, onHand: qty })
      .onConflictDoUpdate({ target: [stockLevels.partId, stockLevels.warehouseId, stockLevels.bin], set: { onHand: sql`${stockLevels.onHand} + ${qty}` } });
    await tx.insert(stockMovements).values({ partId, warehouseId, bin, qty, kind: 'receive', reason: 'Opening stock' });
  });
}

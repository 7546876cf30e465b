// Factories shared by the demo seed and the tests: each creates missing parents itself,
// so a caller states only what it cares about. Parts and ranges take the same shapes as the
// demo data (seed/data/catalogue.ts), so the seed and a test write them the same way.
import { eq, inArray, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../server/db/client.ts';
import type { Auth } from '../server/auth.ts';
import {
  companies,
  makers,
  parts,
  partSupplierSkus,
  rangeInverters,
  ranges,
  stackPlans,
  stockLevels,
  stockMovements,
  suppliers,
  user,
  warehouses,
  bins,
  defaultBins,
} from '../server/db/schema/index.ts';
import { PartAttributesSchema, type CategoryCode, type PartAttributesInput } from '../shared/contracts/part-attributes.ts';
import { gs1CheckDigit } from '../shared/domain/gtin.ts';
import { BomRulesSchema } from '../shared/domain/bom-rules.ts';
import { companyKindOf, type Role } from '../shared/roles.ts';
import type { DemoMaker, DemoPart, DemoRange } from './data/catalogue.ts';
import { partColumns } from '../server/services/catalogue.ts';

let counter = 0;
const next = () => `${Date.now().toString(36)}${(counter++).toString(36)}`;

export const DEMO_PASSWORD = 'stackyard-demo';

export async function makeCompany(db: DbOrTx, fields: Partial<typeof companies.$inferInsert> = {}) {
  const values = { name: `Company ${next()}`, kind: 'installer' as const, ...fields };
  const [existing] = await db.select().from(companies).where(eq(companies.name, values.name));
  if (existing) return existing;
  const [row] = await db.insert(companies).values(values).returning();
  return row!;
}

export async function wholesaler(db: DbOrTx) {
  const [found] = await db.select().from(companies).where(eq(companies.kind, 'wholesaler')).limit(1);
  return found ?? makeCompany(db, { name: 'Lowtide Battery Wholesale', kind: 'wholesaler', abn: '33 987 650 001' });
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
  const companyId = options.companyId ?? (companyKindOf(role) === 'installer' ? (await makeCompany(db)).id : (await wholesaler(db)).id);
  const created = await auth.api.createUser({
    body: { email, password: options.password ?? DEMO_PASSWORD, name: options.name ?? `Test ${role}`, role: role as never, data: { companyId } },
  });
  const [row] = await db.select().from(user).where(eq(user.id, created.user.id));
  return row!;
}

/** A maker by code (found or created). */
export async function makeMaker(db: DbOrTx, fields: Partial<Omit<DemoMaker, 'code'>> & { code: string }) {
  const [existing] = await db.select().from(makers).where(eq(makers.code, fields.code));
  if (existing) return existing;
  const [row] = await db.insert(makers).values({ name: `Maker ${fields.code}`, country: 'AU', ...fields }).returning();
  return row!;
}

/** A supplier by code (found or created). */
export async function makeSupplier(db: DbOrTx, fields: { code: string } & Partial<typeof suppliers.$inferInsert>) {
  const [existing] = await db.select().from(suppliers).where(eq(suppliers.code, fields.code));
  if (existing) return existing;
  const [row] = await db.insert(suppliers).values({ name: `Supplier ${fields.code}`, ...fields }).returning();
  return row!;
}

export type PartSpec = Partial<Omit<DemoPart, 'maker'>> & { maker?: string };

/** The least each category's attributes need: what a part given only its category carries. */
const PLAIN_ATTRIBUTES: Record<CategoryCode, PartAttributesInput> = {
  module: { category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP' },
  controller: { category: 'controller', carriesCells: false },
  feet: { category: 'feet', unitsPerSet: 4, heightMm: 80 },
  'wall-bracket': { category: 'wall-bracket', fixing: 'masonry' },
  'end-cap': { category: 'end-cap' },
  'cable-set': { category: 'cable-set', lengthM: 2, crossSectionMm2: 35 },
  'cable-cover': { category: 'cable-cover' },
  'earth-lead': { category: 'earth-lead' },
  'comms-terminator': { category: 'comms-terminator', protocol: 'CAN' },
  inverter: { category: 'inverter', batteryMinV: 40, batteryMaxV: 60, batteryInputs: 1 },
  accessory: { category: 'accessory' },
};

let gtinCounter = 0;
/** A new valid GTIN-13 under GS1's documentation company prefix (0614141), item references 9xxxx. */
export function makeGtin() {
  const body = `0614141${String(90_000 + (gtinCounter++ % 10_000)).padStart(5, '0')}`;
  return `${body}${gs1CheckDigit(body)}`;
}

/**
 * A part in the demo data's shape; anything left out is a plain wall bracket. Its maker and its
 * suppliers are created when missing; `supersededBy` names a part that must already exist.
 */
export async function makePart(db: DbOrTx, spec: PartSpec = {}) {
  const category = spec.attributes?.category ?? spec.category ?? 'wall-bracket';
  if (spec.category && spec.category !== category) throw new Error(`makePart: category ${spec.category} but attributes of ${category}`);
  const attributes = PartAttributesSchema.parse(spec.attributes ?? PLAIN_ATTRIBUTES[category]);
  // Cells are dangerous goods (UN 3480, class 9) unless the spec says otherwise.
  const cells = 'nominalV' in attributes && 'ratedAh' in attributes && attributes.nominalV && attributes.ratedAh ? attributes.nominalV * attributes.ratedAh : null;
  const p = {
    sku: `TST-${next().toUpperCase()}`,
    name: `Test ${category.replace('-', ' ')}`,
    maker: 'HLM',
    description: '',
    unit: 'each' as const,
    packSize: 1,
    massKg: 1,
    lifecycle: 'active' as const,
    costCents: 1000,
    listPriceCents: 1500,
    ...(cells ? { dangerousGoods: { unNumber: 'UN3480' as const, class: '9' as const, whRating: Math.round(cells * 10) / 10 } } : {}),
    ...spec,
    category,
    attributes,
  };
  const maker = await makeMaker(db, { code: p.maker });
  const [successor] = p.supersededBy ? await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, p.supersededBy)) : [];
  if (p.supersededBy && !successor) throw new Error(`makePart: ${p.sku} is superseded by ${p.supersededBy}, which does not exist yet`);
  const [row] = await db
    .insert(parts)
    .values(partColumns(p, { makerId: maker.id, supersededById: successor?.id ?? null }))
    .returning();
  for (const s of p.supplierSkus ?? []) {
    const supplier = await makeSupplier(db, { code: s.supplier });
    await db.insert(partSupplierSkus).values({ partId: row!.id, supplierId: supplier.id, supplierSku: s.sku });
  }
  return row!;
}

export type RangeSpec = Partial<Omit<DemoRange, 'maker'>> & { maker?: string };

/**
 * A range in the demo data's shape; anything left out is a small parallel range with no BOM
 * rules. Its controller and module are made when not named; every other SKU it names must exist.
 */
export async function makeRange(db: DbOrTx, given: RangeSpec = {}) {
  const code = given.code ?? `R${next().toUpperCase()}`;
  const makerCode = given.maker ?? 'HLM';
  const spec = {
    code,
    name: `Range ${code}`,
    connection: 'parallel' as const,
    controllerSku: given.controllerSku ?? (await makePart(db, { maker: makerCode, category: 'controller', name: `${code} controller` })).sku,
    moduleSku: given.moduleSku ?? (await makePart(db, { maker: makerCode, category: 'module', name: `${code} battery module` })).sku,
    minModules: 1,
    maxModules: 4,
    maxStacks: 1,
    baseHeightMm: 80,
    defaultDodPct: 90,
    compatibleInverterSkus: [],
    rules: [],
    ...given,
    maker: makerCode,
  };
  const maker = await makeMaker(db, { code: spec.maker });
  const skus = [spec.controllerSku, spec.moduleSku, ...spec.compatibleInverterSkus];
  const found = await db.select({ id: parts.id, sku: parts.sku }).from(parts).where(inArray(parts.sku, skus));
  const ids = new Map(found.map((p) => [p.sku, p.id]));
  const missing = skus.filter((s) => !ids.has(s));
  if (missing.length) throw new Error(`makeRange ${spec.code}: no part ${missing.join(', ')}`);
  const [row] = await db
    .insert(ranges)
    .values({
      code: spec.code,
      name: spec.name,
      makerId: maker.id,
      connection: spec.connection,
      controllerId: ids.get(spec.controllerSku)!,
      moduleId: ids.get(spec.moduleSku)!,
      minModules: spec.minModules,
      maxModules: spec.maxModules,
      maxStacks: spec.maxStacks,
      baseHeightMm: spec.baseHeightMm,
      defaultDodPct: spec.defaultDodPct,
      rules: BomRulesSchema.parse(spec.rules),
    })
    .returning();
  if (spec.compatibleInverterSkus.length)
    await db.insert(rangeInverters).values(spec.compatibleInverterSkus.map((sku) => ({ rangeId: row!.id, inverterId: ids.get(sku)! })));
  return row!;
}

/** A warehouse by code (found or created). */
export async function makeWarehouse(db: DbOrTx, fields: { code?: string; name?: string; rank?: number } = {}) {
  const code = fields.code ?? `W${next().toUpperCase()}`.slice(0, 16);
  const [existing] = await db.select().from(warehouses).where(eq(warehouses.code, code));
  if (existing) return existing;
  const [row] = await db.insert(warehouses).values({ name: `Depot ${code}`, ...fields, code }).returning();
  return row!;
}

export interface StockSpec {
  partId: string;
  warehouseId: string;
  bin: string;
  onHand: number;
}

/** Stock received through the ledger, with levels kept in step (as the stock service will). */
export async function receiveStock(db: DbOrTx, rows: StockSpec[], reason = 'Opening stock') {
  for (let i = 0; i < rows.length; i += 500) {
    const chunk = rows.slice(i, i + 500);
    await db.insert(stockLevels).values(chunk);
    await db.insert(stockMovements).values(chunk.map((l) => ({ partId: l.partId, warehouseId: l.warehouseId, bin: l.bin, qty: l.onHand, kind: 'receive' as const, reason })));
  }
}

/** A saved draft plan row, for lists and access checks (the planner service computes real ones). */
export async function makePlan(db: DbOrTx, fields: { companyId: string; rangeId: string; createdBy: string; name?: string; modules?: number }) {
  const modules = fields.modules ?? 2;
  const [row] = await db
    .insert(stackPlans)
    .values({
      companyId: fields.companyId,
      rangeId: fields.rangeId,
      createdBy: fields.createdBy,
      name: fields.name ?? `Plan ${next()}`,
      request: { rangeId: fields.rangeId, modules },
      summary: { usableKwh: 0, modulesPerStack: modules, stacks: 1 },
    })
    .returning();
  return row!;
}

// ---- Stock and jobs (self-contained: warehouses, stocked parts, opening stock through the ledger) ----

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

import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { pgCode } from '../db/errors.ts';
import { partSupplierSkus, parts, priceListImports, supplierPartPrices, suppliers, user } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import type { SupplierInput, SupplierPartInput } from '@shared/contracts/purchasing.ts';
import type { PartsIndex } from '../search/parts-index.ts';

/** Suppliers, their terms and the parts they sell us (supplier SKU, pack, MOQ, cost, breaks), with each cost's history. */
export function createSupplierService({ db, partsIndex }: { db: Db; partsIndex: PartsIndex }) {
  async function one(id: string) {
    const [s] = await db.select().from(suppliers).where(eq(suppliers.id, id));
    if (!s) throw new NotFoundError('That supplier');
    return s;
  }

  return {
    one: async (actor: Actor, id: string) => {
      authorize(actor, 'purchasing.manage');
      return one(id);
    },

    async list(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      const { rows } = await db.execute<{ id: string; parts: number; last_import_at: Date | null }>(sql`
        select s.id, (select count(*)::int from part_supplier_skus p where p.supplier_id = s.id) as parts,
               (select max(i.applied_at) from price_list_imports i where i.supplier_id = s.id) as last_import_at
        from suppliers s`);
      const extra = new Map(rows.map((r) => [r.id, r]));
      const all = await db.select().from(suppliers).orderBy(asc(suppliers.name));
      return all.map((s) => ({ ...s, parts: extra.get(s.id)?.parts ?? 0, lastImportAt: extra.get(s.id)?.last_import_at ?? null }));
    },

    async save(actor: Actor, id: string | null, input: SupplierInput) {
      authorize(actor, 'purchasing.manage');
      const values = { ...input, audPerUnit: String(input.audPerUnit), flagChangePct: String(input.flagChangePct) };
      try {
        if (id) {
          const [row] = await db.update(suppliers).set(values).where(eq(suppliers.id, id)).returning();
          if (!row) throw new NotFoundError('That supplier');
          return row;
        }
        const [row] = await db.insert(suppliers).values(values).returning();
        return row!;
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`There is already a supplier ${input.code}.`, { fields: [{ path: 'code', message: 'Already used.' }] });
        throw e;
      }
    },

    async parts(actor: Actor, supplierId: string) {
      authorize(actor, 'purchasing.manage');
      await one(supplierId);
      return db
        .select({ sku: parts.sku, name: parts.name, supplierSku: partSupplierSkus.supplierSku, description: partSupplierSkus.description, packSize: partSupplierSkus.packSize, moq: partSupplierSkus.moq, costCents: partSupplierSkus.costCents, priceBreaks: partSupplierSkus.priceBreaks, listPriceCents: partSupplierSkus.listPriceCents, leadTimeDays: partSupplierSkus.leadTimeDays, updatedAt: partSupplierSkus.updatedAt })
        .from(partSupplierSkus)
        .innerJoin(parts, eq(parts.id, partSupplierSkus.partId))
        .where(eq(partSupplierSkus.supplierId, supplierId))
        .orderBy(asc(partSupplierSkus.supplierSku));
    },

    /** Adds or changes what a supplier sells us for one of our parts; a new cost goes into its history. */
    async savePart(actor: Actor, supplierId: string, input: SupplierPartInput) {
      authorize(actor, 'purchasing.manage');
      await one(supplierId);
      const [part] = await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, input.sku));
      if (!part) throw new ValidationError(`There is no part ${input.sku}.`, { fields: [{ path: 'sku', message: 'Unknown SKU.' }] });
      try {
        await db.transaction(async (tx) => {
          const [old] = await tx.select().from(partSupplierSkus).where(and(eq(partSupplierSkus.partId, part.id), eq(partSupplierSkus.supplierId, supplierId))).for('update');
          const values = { supplierSku: input.supplierSku, description: input.description ?? null, packSize: input.packSize, moq: input.moq, costCents: input.costCents ?? null, priceBreaks: input.priceBreaks, listPriceCents: input.listPriceCents ?? null, leadTimeDays: input.leadTimeDays ?? null, updatedAt: new Date() };
          await tx.insert(partSupplierSkus).values({ partId: part.id, supplierId, ...values }).onConflictDoUpdate({ target: [partSupplierSkus.partId, partSupplierSkus.supplierId], set: values });
          const costMoved = input.costCents !== null && input.costCents !== undefined && (old?.costCents !== input.costCents || JSON.stringify(old?.priceBreaks ?? []) !== JSON.stringify(input.priceBreaks));
          if (costMoved) await tx.insert(supplierPartPrices).values({ partId: part.id, supplierId, costCents: input.costCents!, priceBreaks: input.priceBreaks, userId: actor.userId });
          if (!old || old.supplierSku !== input.supplierSku) await partsIndex.sync(tx, [part.id]);
        });
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`Another part already has supplier SKU ${input.supplierSku} with this supplier.`, { fields: [{ path: 'supplierSku', message: 'Already used for another part.' }] });
        throw e;
      }
      return { sku: input.sku };
    },

    async history(actor: Actor, supplierId: string, sku: string) {
      authorize(actor, 'purchasing.manage');
      await one(supplierId);
      const [part] = await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, sku.toUpperCase()));
      if (!part) throw new NotFoundError(`Part ${sku}`);
      return db
        .select({ at: supplierPartPrices.createdAt, costCents: supplierPartPrices.costCents, priceBreaks: supplierPartPrices.priceBreaks, importId: supplierPartPrices.importId, by: user.name, fileName: priceListImports.fileName })
        .from(supplierPartPrices)
        .leftJoin(user, eq(user.id, supplierPartPrices.userId))
        .leftJoin(priceListImports, eq(priceListImports.id, supplierPartPrices.importId))
        .where(and(eq(supplierPartPrices.partId, part.id), eq(supplierPartPrices.supplierId, supplierId)))
        .orderBy(desc(supplierPartPrices.id));
    },
  };
}

export type SupplierService = ReturnType<typeof createSupplierService>;

// The demo catalogue, warehouses and opening stock, written from the plain data in seed/data/.
import { eq } from 'drizzle-orm';
import type { Db, Tx } from '../server/db/client.ts';
import { makers as makerTable, parts as partTable, partSupplierSkus, rangeInverters, ranges as rangeTable, stockLevels, stockMovements, suppliers, warehouses } from '../server/db/schema/index.ts';
import { PartAttributesSchema } from '../shared/contracts/part-attributes.ts';
import { BomRulesSchema } from '../shared/domain/bom-rules.ts';
import { catalogueSuppliers, makers, parts, ranges } from './data/catalogue.ts';

export const DEMO_WAREHOUSES = [
  { code: 'WST', name: 'Western depot', rank: 1 },
  { code: 'NTH', name: 'Northern depot', rank: 2 },
];

/** A small deterministic generator, so every run seeds the same stock. */
function sequence(seed: number) {
  let x = seed;
  return () => {
    x = (x * 1103515245 + 12345) % 2147483648;
    return x / 2147483648;
  };
}

export async function seedCatalogue(tx: Tx | Db) {
  const makerIds = new Map<string, string>();
  for (const m of makers) {
    const [row] = await tx.insert(makerTable).values(m).returning();
    makerIds.set(m.code, row!.id);
  }
  const supplierIds = new Map<string, string>();
  for (const s of catalogueSuppliers) {
    const [row] = await tx.insert(suppliers).values({ code: s.code, name: s.name }).returning();
    supplierIds.set(s.code, row!.id);
  }

  const partIds = new Map<string, string>();
  for (const p of parts) {
    const [row] = await tx
      .insert(partTable)
      .values({
        sku: p.sku,
        name: p.name,
        category: p.category,
        makerId: makerIds.get(p.maker)!,
        description: p.description,
        gtin: p.gtin ?? null,
        unit: p.unit,
        packSize: p.packSize,
        massKg: p.massKg,
        widthMm: p.widthMm ?? null,
        heightMm: p.heightMm ?? null,
        depthMm: p.depthMm ?? null,
        ipRating: p.ipRating ?? null,
        lifecycle: 'active',
        unNumber: p.dangerousGoods?.unNumber ?? null,
        dgClass: p.dangerousGoods?.class ?? null,
        whRating: p.dangerousGoods?.whRating ?? null,
        costCents: p.costCents,
        listPriceCents: p.listPriceCents,
        attributes: PartAttributesSchema.parse(p.attributes),
        compliance: p.compliance ?? null,
      })
      .returning({ id: partTable.id });
    partIds.set(p.sku, row!.id);
    if (p.supplierSkus?.length)
      await tx.insert(partSupplierSkus).values(p.supplierSkus.map((s) => ({ partId: row!.id, supplierId: supplierIds.get(s.supplier)!, supplierSku: s.sku })));
  }
  // Successors exist only once every part is in, so lifecycles are set afterwards.
  for (const p of parts.filter((x) => x.lifecycle !== 'active')) {
    await tx
      .update(partTable)
      .set({ lifecycle: p.lifecycle, supersededById: p.supersededBy ? partIds.get(p.supersededBy)! : null })
      .where(eq(partTable.id, partIds.get(p.sku)!));
  }

  for (const r of ranges) {
    const [row] = await tx
      .insert(rangeTable)
      .values({
        code: r.code,
        name: r.name,
        makerId: makerIds.get(r.maker)!,
        connection: r.connection,
        controllerId: partIds.get(r.controllerSku)!,
        moduleId: partIds.get(r.moduleSku)!,
        minModules: r.minModules,
        maxModules: r.maxModules,
        maxStacks: r.maxStacks,
        baseHeightMm: r.baseHeightMm,
        defaultDodPct: r.defaultDodPct,
        rules: BomRulesSchema.parse(r.rules),
      })
      .returning({ id: rangeTable.id });
    if (r.compatibleInverterSkus.length)
      await tx.insert(rangeInverters).values(r.compatibleInverterSkus.map((sku) => ({ rangeId: row!.id, inverterId: partIds.get(sku)! })));
  }

  await seedStock(tx, partIds);
  return { parts: parts.length, ranges: ranges.length };
}

/** Opening stock through the ledger (receive movements) with levels kept in step; some parts short. */
async function seedStock(tx: Tx | Db, partIds: Map<string, string>) {
  const random = sequence(20261202);
  const whIds: string[] = [];
  for (const w of DEMO_WAREHOUSES) {
    const [row] = await tx.insert(warehouses).values(w).returning({ id: warehouses.id });
    whIds.push(row!.id);
  }
  const levels: (typeof stockLevels.$inferInsert)[] = [];
  parts.forEach((p, i) => {
    if (p.lifecycle === 'discontinued' && random() < 0.6) return;
    whIds.forEach((warehouseId, w) => {
      const roll = random();
      if (roll < 0.18) return; // not stocked here: some shortages are part of the demo
      const big = p.category === 'module' || p.category === 'controller' || p.category === 'inverter';
      const onHand = Math.max(1, Math.round((big ? 12 : 60) * random()));
      const aisle = String.fromCharCode(65 + (i % 6));
      levels.push({ partId: partIds.get(p.sku)!, warehouseId, bin: `${aisle}-${String((i % 20) + 1).padStart(2, '0')}-${w + 1}`, onHand });
    });
  });
  for (let i = 0; i < levels.length; i += 500) {
    const chunk = levels.slice(i, i + 500);
    await tx.insert(stockLevels).values(chunk);
    await tx.insert(stockMovements).values(chunk.map((l) => ({ partId: l.partId, warehouseId: l.warehouseId, bin: l.bin, qty: l.onHand!, kind: 'receive' as const, reason: 'Opening stock' })));
  }
}

// The demo catalogue, warehouses and opening stock, written from the plain data in seed/data/
// through the same factories the tests use (seed/factories.ts).
import { eq } from 'drizzle-orm';
import type { Db, Tx } from '../server/db/client.ts';
import { parts as partTable } from '../server/db/schema/index.ts';
import { catalogueSuppliers, makers, parts as demoParts, ranges as demoRanges, type DemoPart, type DemoRange } from './data/catalogue.ts';
import { makeMaker, makePart, makeRange, makeSupplier, makeWarehouse, receiveStock, type StockSpec } from './factories.ts';

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

/**
 * Seeds the demo catalogue, or the part of it a test names: `parts` (default all) and the
 * `ranges` whose parts are all among them (default: every such range).
 */
export async function seedCatalogue(tx: Tx | Db, choice: { parts?: DemoPart[]; ranges?: DemoRange[] } = {}) {
  const chosen = choice.parts ?? demoParts;
  const skus = new Set(chosen.map((p) => p.sku));
  const chosenRanges = (choice.ranges ?? demoRanges).filter((r) => [r.controllerSku, r.moduleSku, ...r.compatibleInverterSkus, ...r.rules.map((x) => x.sku)].every((s) => skus.has(s)));
  for (const m of makers) await makeMaker(tx, m);
  for (const s of catalogueSuppliers) await makeSupplier(tx, { code: s.code, name: s.name });

  const partIds = new Map<string, string>();
  // Successors exist only once every part is in, so lifecycles are set afterwards.
  for (const p of chosen) partIds.set(p.sku, (await makePart(tx, { ...p, lifecycle: 'active', supersededBy: undefined })).id);
  for (const p of chosen.filter((x) => x.lifecycle !== 'active')) {
    const successor = p.supersededBy ? partIds.get(p.supersededBy) : undefined;
    await tx.update(partTable).set({ lifecycle: p.lifecycle, supersededById: successor ?? null }).where(eq(partTable.id, partIds.get(p.sku)!));
  }
  for (const r of chosenRanges) await makeRange(tx, r);

  await seedStock(tx, chosen, partIds);
  return { parts: chosen.length, ranges: chosenRanges.length };
}

/** Opening stock through the ledger (receive movements) with levels kept in step; some parts short. */
async function seedStock(tx: Tx | Db, chosen: DemoPart[], partIds: Map<string, string>) {
  const random = sequence(20261202);
  const whIds: string[] = [];
  for (const w of DEMO_WAREHOUSES) whIds.push((await makeWarehouse(tx, w)).id);
  const levels: StockSpec[] = [];
  chosen.forEach((p, i) => {
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
  await receiveStock(tx, levels);
}

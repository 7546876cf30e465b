import { inArray, eq, sql } from 'drizzle-orm';
import type { Index, MultiSearchParams, MultiSearchQuery } from 'meilisearch';
import { CATEGORY_LABELS, ATTRIBUTE_FIELDS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import type { DbOrTx } from '../db/client.ts';
import { makers, partMedia, parts, partSupplierSkus, rangeInverters, ranges, stockLevels } from '../db/schema/index.ts';
import type { SearchClient } from './client.ts';
import { AppError } from '../errors.ts';

export const PARTS_INDEX = 'parts';

/** What the search engine holds per part: enough to list and facet without touching the database. */
export interface PartDocument {
  id: string;
  sku: string;
  name: string;
  category: CategoryCode;
  categoryLabel: string;
  maker: string;
  makerName: string;
  gtin: string | null;
  /** The GTIN as GTIN-14, so a scanned code of any length finds it. */
  gtin14: string | null;
  supplierSkus: string[];
  ranges: string[];
  lifecycle: string;
  attributeText: string;
  description: string;
  packSize: number;
  unit: string;
  listPriceCents: number | null;
  available: number;
  inStock: boolean;
  archived: boolean;
  thumbnailId: string | null;
}

/**
 * Words the trade uses for the same thing. Meilisearch reads each synonym entry one way, so every
 * word of a group lists the others; a real server and the stand-in both expand the query with them.
 */
const SYNONYM_GROUPS = [
  ['earth', 'ground', 'bonding', 'grounding'],
  ['cover', 'guard', 'protection', 'shroud'],
  ['bracket', 'mount'],
  ['feet', 'foot', 'legs'],
];

const synonyms = Object.fromEntries(SYNONYM_GROUPS.flatMap((group) => group.map((word) => [word, group.filter((other) => other !== word)])));

export const PARTS_INDEX_SETTINGS = {
  searchableAttributes: ['sku', 'name', 'gtin', 'supplierSkus', 'makerName', 'categoryLabel', 'ranges', 'attributeText', 'description'],
  filterableAttributes: ['category', 'maker', 'ranges', 'lifecycle', 'inStock', 'archived', 'sku', 'gtin', 'gtin14', 'supplierSkus'],
  sortableAttributes: ['sku', 'name', 'category', 'makerName'],
  synonyms,
  // Totals and CSV exports page past Meilisearch's default cap of 1,000 hits.
  pagination: { maxTotalHits: 20_000 },
};

/** Words a person might type for a part's attributes: "51.2 V", "LFP", "CAN". */
function attributeText(category: CategoryCode, attributes: Record<string, unknown>) {
  return ATTRIBUTE_FIELDS[category]
    .map((f) => {
      const v = attributes[f.key];
      if (v === undefined || v === null || v === false) return null;
      if (v === true) return f.label;
      const value = Array.isArray(v) ? v.join(' ') : String(v);
      return f.unit ? `${value} ${f.unit}` : value;
    })
    .filter(Boolean)
    .join(' · ');
}

export function createPartsIndex(search: SearchClient) {
  const index: Index<PartDocument> = search.client.index<PartDocument>(PARTS_INDEX);

  async function check(task: { waitTask: (o?: { timeout?: number }) => Promise<{ status: string; error?: { message: string } | null }> }) {
    const done = await task.waitTask({ timeout: 60_000 });
    if (done.status === 'failed') throw new AppError(503, 'search_failed', `The search index refused an update: ${done.error?.message ?? 'unknown reason'}.`);
  }

  async function documentsFor(db: DbOrTx, ids?: string[]): Promise<PartDocument[]> {
    const where = ids ? inArray(parts.id, ids) : undefined;
    const rows = await db
      .select({
        id: parts.id,
        sku: parts.sku,
        name: parts.name,
        category: parts.category,
        maker: makers.code,
        makerName: makers.name,
        gtin: parts.gtin,
        gtin14: parts.gtin14,
        lifecycle: parts.lifecycle,
        attributes: parts.attributes,
        description: parts.description,
        packSize: parts.packSize,
        unit: parts.unit,
        listPriceCents: parts.listPriceCents,
        archivedAt: parts.archivedAt,
      })
      .from(parts)
      .innerJoin(makers, eq(makers.id, parts.makerId))
      .where(where);
    if (rows.length === 0) return [];
    const partIds = rows.map((r) => r.id);
    const [supplierRows, rangeRows, stockRows, mediaRows] = await Promise.all([
      db.select({ partId: partSupplierSkus.partId, sku: partSupplierSkus.supplierSku }).from(partSupplierSkus).where(ids ? inArray(partSupplierSkus.partId, partIds) : undefined),
      rangeMembership(db, ids ? partIds : undefined),
      db
        .select({ partId: stockLevels.partId, available: sql<number>`sum(${stockLevels.onHand} - ${stockLevels.reserved})::int` })
        .from(stockLevels)
        .where(ids ? inArray(stockLevels.partId, partIds) : undefined)
        .groupBy(stockLevels.partId),
      db
        .selectDistinctOn([partMedia.partId], { partId: partMedia.partId, id: partMedia.id })
        .from(partMedia)
        .where(ids ? sql`${partMedia.kind} = 'image' and ${inArray(partMedia.partId, partIds)}` : eq(partMedia.kind, 'image'))
        .orderBy(partMedia.partId, partMedia.createdAt),
    ]);
    const group = <T extends { partId: string }, V>(list: T[], pick: (t: T) => V) => {
      const m = new Map<string, V[]>();
      for (const x of list) m.set(x.partId, [...(m.get(x.partId) ?? []), pick(x)]);
      return m;
    };
    const supplierSkus = group(supplierRows, (r) => r.sku);
    const available = new Map(stockRows.map((r) => [r.partId, r.available]));
    const thumbs = new Map(mediaRows.map((r) => [r.partId, r.id]));
    return rows.map((r) => {
      const category = r.category as CategoryCode;
      const avail = available.get(r.id) ?? 0;
      return {
        id: r.id,
        sku: r.sku,
        name: r.name,
        category,
        categoryLabel: CATEGORY_LABELS[category],
        maker: r.maker,
        makerName: r.makerName,
        gtin: r.gtin,
        gtin14: r.gtin14,
        supplierSkus: supplierSkus.get(r.id) ?? [],
        ranges: rangeRows.get(r.id) ?? [],
        lifecycle: r.lifecycle,
        attributeText: attributeText(category, r.attributes as Record<string, unknown>),
        description: r.description,
        packSize: r.packSize,
        unit: r.unit,
        listPriceCents: r.listPriceCents,
        available: avail,
        inStock: avail > 0,
        archived: r.archivedAt !== null,
        thumbnailId: thumbs.get(r.id) ?? null,
      };
    });
  }

  return {
    index,

    /** Several searches of the parts index in one round trip (Meilisearch's multi-search), results in order. */
    async searchMany(queries: Omit<MultiSearchQuery, 'indexUid'>[]) {
      const { results } = await search.client.multiSearch<MultiSearchParams, PartDocument>({ queries: queries.map((q) => ({ ...q, indexUid: PARTS_INDEX })) });
      return results;
    },

    async configure() {
      await check(search.client.createIndex(PARTS_INDEX, { primaryKey: 'id' })).catch((e) => {
        if (!(e instanceof AppError)) throw e; // "index already exists" is a failed task we accept
      });
      await check(index.updateSettings(PARTS_INDEX_SETTINGS));
    },

    /** Re-sends the given parts (all when omitted) to the index, and waits until it has them. */
    async sync(db: DbOrTx, ids?: string[]) {
      // A full sync goes in batches, so a large catalogue never sits in memory all at once.
      const all = ids ?? (await db.select({ id: parts.id }).from(parts).orderBy(parts.id)).map((r) => r.id);
      let sent = 0;
      for (let i = 0; i < all.length; i += 5000) {
        const docs = await documentsFor(db, all.slice(i, i + 5000));
        if (docs.length) await check(index.addDocuments(docs));
        sent += docs.length;
      }
      return sent;
    },

    async rebuild(db: DbOrTx) {
      await check(search.client.deleteIndex(PARTS_INDEX)).catch(() => {});
      await this.configure();
      return this.sync(db);
    },

    /** At start-up: settings brought up to date, and an empty or missing index rebuilt from the database. */
    async ensure(db: DbOrTx) {
      await this.configure();
      const stats = await index.getStats().catch(() => null);
      if (stats && stats.numberOfDocuments > 0) return { rebuilt: false, documents: stats.numberOfDocuments };
      return { rebuilt: true, documents: await this.rebuild(db) };
    },
  };
}

export type PartsIndex = ReturnType<typeof createPartsIndex>;

/** Range codes each part belongs to: as the range's controller, module, compatible inverter or BOM rule part. */
export async function rangeMembership(db: DbOrTx, partIds?: string[]) {
  const all = await db.select({ code: ranges.code, controllerId: ranges.controllerId, moduleId: ranges.moduleId, rules: ranges.rules }).from(ranges);
  const skuRows = await db.select({ id: parts.id, sku: parts.sku }).from(parts).where(partIds ? inArray(parts.id, partIds) : undefined);
  const bySku = new Map(skuRows.map((r) => [r.sku, r.id]));
  const out = new Map<string, string[]>();
  const add = (id: string | undefined, code: string) => {
    if (!id) return;
    const list = out.get(id) ?? [];
    if (!list.includes(code)) out.set(id, [...list, code]);
  };
  const inverters = await db.select({ code: ranges.code, inverterId: rangeInverters.inverterId }).from(rangeInverters).innerJoin(ranges, eq(ranges.id, rangeInverters.rangeId));
  for (const i of inverters) add(i.inverterId, i.code);
  for (const r of all) {
    add(r.controllerId, r.code);
    add(r.moduleId, r.code);
    for (const rule of r.rules as { sku: string }[]) add(bySku.get(rule.sku), r.code);
  }
  return out;
}

import { and, asc, count, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client.ts';
import { makers, partMedia, parts, partSupplierSkus, ranges, stockLevels, suppliers, warehouses } from '../db/schema/index.ts';
import { PARTS_INDEX_SETTINGS, rangeMembership, type PartsIndex, type PartDocument } from '../search/parts-index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { can } from '@shared/roles.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import { normalizeGtin14 } from '@shared/domain/gtin.ts';
import type { PartInputParsed, PartListQuery } from '@shared/contracts/parts.ts';

const FACETS = ['category', 'maker', 'ranges', 'lifecycle', 'inStock'] as const;
type Facet = (typeof FACETS)[number];
/** What a result row needs; long texts stay in the engine. */
const SUMMARY_FIELDS = ['id', 'sku', 'name', 'category', 'maker', 'makerName', 'gtin', 'lifecycle', 'ranges', 'packSize', 'unit', 'listPriceCents', 'available', 'inStock', 'thumbnailId'] as const;
// The maker column shows the maker's name, so it sorts by name (codes need not follow names).
const SORTS: Record<string, string> = { sku: 'sku', name: 'name', category: 'category', maker: 'makerName' };

/** A filter value quoted for the search engine's filter syntax. */
const quote = (v: string) => `"${v.replace(/["\\]/g, '\\$&')}"`;

export type PartRow = typeof parts.$inferSelect;

function chosenFacets(query: PartListQuery): [Facet, string | undefined][] {
  return [
    ['category', query.category],
    ['maker', query.maker],
    ['ranges', query.range],
    ['lifecycle', query.lifecycle],
    ['inStock', query.inStock],
  ];
}

/** The engine filter for the chosen facets, optionally leaving one out (for its own counts). */
function filterFor(chosen: [Facet, string | undefined][], skip?: Facet) {
  const parts = chosen.filter(([f, v]) => v !== undefined && f !== skip).map(([f, v]) => (f === 'inStock' ? `inStock = ${v}` : `${f} = ${quote(v!)}`));
  return ['archived = false', ...parts].join(' AND ');
}

const sortFor = (query: PartListQuery) => (query.sort !== 'relevance' ? [`${SORTS[query.sort]}:${query.dir}`] : query.q ? undefined : ['sku:asc']);

/**
 * A one-word query as a scanned code: the exact SKU, the GTIN (any length, compared as GTIN-14)
 * or, for roles that may see supplier data, a supplier's SKU. Null when it cannot be one.
 */
function asCode(q: string, supplierData: boolean) {
  const code = q.trim().toUpperCase();
  if (code.length < 2 || code.length > 64 || /\s/.test(code)) return null;
  const gtin14 = /^\d{8,14}$/.test(code) ? normalizeGtin14(code) : null;
  return { code, gtin14, supplierData };
}

type Code = NonNullable<ReturnType<typeof asCode>>;

/** The engine search for the parts a code names, as filters on the exact values. */
function codeSearch({ code, gtin14, supplierData }: Code) {
  const names = [`sku = ${quote(code)}`, ...(gtin14 ? [`gtin14 = ${quote(gtin14)}`] : []), ...(supplierData ? [`supplierSkus = ${quote(code)}`] : [])];
  return { q: '', filter: names.join(' OR '), limit: 3, attributesToRetrieve: ['sku', 'gtin14'] };
}

/** Of the parts a code matched, the one it names first: by SKU, then GTIN, then supplier SKU. */
function partNamedBy({ code, gtin14 }: Code, hits: Pick<PartDocument, 'sku' | 'gtin14'>[]) {
  return (hits.find((h) => h.sku === code) ?? hits.find((h) => gtin14 !== null && h.gtin14 === gtin14) ?? hits[0])?.sku ?? null;
}

/**
 * The engine searches behind one catalogue page, sent as one multi-search: the page with every
 * facet's counts; then for each chosen facet the same search without its own filter, so that a
 * chosen facet still shows the counts of its other values; then, for a one-word query, the parts
 * it names exactly as a code (a scanner types the code, then Enter).
 */
export function catalogueSearches(query: PartListQuery, { supplierData }: { supplierData: boolean }) {
  const chosen = chosenFacets(query);
  // Roles that may not see supplier data cannot find parts by a supplier's SKU either.
  const attributesToSearchOn = supplierData ? undefined : SEARCHABLE_WITHOUT_SUPPLIERS;
  const page = {
    q: query.q,
    attributesToSearchOn,
    filter: filterFor(chosen),
    facets: [...FACETS] as string[],
    sort: sortFor(query),
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    attributesToRetrieve: [...SUMMARY_FIELDS] as string[],
  };
  const facetsAlone = chosen.filter(([, v]) => v !== undefined).map(([f]) => f);
  const variants = facetsAlone.map((f) => ({ q: query.q, attributesToSearchOn, filter: filterFor(chosen, f), facets: [f] as string[], limit: 0 }));
  const code = asCode(query.q, supplierData);
  return { page, searches: [page, ...variants, ...(code ? [codeSearch(code)] : [])], facetsAlone, code };
}

const SEARCHABLE_WITHOUT_SUPPLIERS = PARTS_INDEX_SETTINGS.searchableAttributes.filter((a) => a !== 'supplierSkus');

/** Supplier data (and finding parts by a supplier's SKU) is for the roles that may see it. */
const seesSuppliers = (actor: Actor) => can(actor.role, 'suppliers.view');

/** `onPartsChanged` lets caches built from part data (the planner's ranges) drop what they hold. */
export function createCatalogueService({ db, partsIndex, onPartsChanged = () => {} }: { db: Db; partsIndex: PartsIndex; onPartsChanged?: () => void }) {
  async function findPart(sku: string) {
    const [p] = await db.select().from(parts).where(eq(parts.sku, sku.toUpperCase()));
    if (!p) throw new NotFoundError(`Part ${sku}`);
    return p;
  }

  /** Names → ids for a part's references, with field-level messages for what does not exist. */
  async function resolveRefs(tx: Tx, input: PartInputParsed) {
    const [maker] = await tx.select({ id: makers.id }).from(makers).where(eq(makers.code, input.makerCode));
    const fields: { path: string; message: string }[] = [];
    if (!maker) fields.push({ path: 'makerCode', message: `There is no maker ${input.makerCode}.` });
    let supersededById: string | null = null;
    if (input.supersededBySku) {
      const [s] = await tx.select({ id: parts.id }).from(parts).where(eq(parts.sku, input.supersededBySku));
      if (!s) fields.push({ path: 'supersededBySku', message: `There is no part ${input.supersededBySku}.` });
      supersededById = s?.id ?? null;
    }
    const codes = [...new Set(input.supplierSkus.map((s) => s.supplier))];
    const found = codes.length ? await tx.select().from(suppliers).where(inArray(suppliers.code, codes)) : [];
    const supplierIds = new Map(found.map((s) => [s.code, s.id]));
    input.supplierSkus.forEach((s, i) => {
      if (!supplierIds.has(s.supplier)) fields.push({ path: `supplierSkus.${i}.supplier`, message: `There is no supplier ${s.supplier}.` });
    });
    if (fields.length) throw new ValidationError('Some references do not exist.', { fields });
    return { makerId: maker!.id, supersededById, supplierIds };
  }

  /** Range rules name parts by SKU, so a SKU they use cannot change under them. */
  async function refuseRenameInUse(tx: Tx, sku: string) {
    const using = await tx.select({ name: ranges.name }).from(ranges).where(sql`${ranges.rules} @> ${JSON.stringify([{ sku }])}::jsonb`);
    if (using.length)
      throw new ConflictError(`The SKU ${sku} is used by the BOM rules of ${using.map((r) => r.name).join(', ')}: change those rules first.`, {
        fields: [{ path: 'sku', message: 'Used by range rules; cannot be renamed.' }],
      });
  }

  function columnsFrom(input: PartInputParsed, refs: PartRefs, existing: PartRow | null) {
    // Left out (a form for someone who may not see cost) keeps the cost; null clears it.
    return { ...partColumns(input, refs), costCents: input.costCents === undefined ? (existing?.costCents ?? null) : input.costCents };
  }

  /** Writes a part and its supplier SKUs, then updates the index before committing, so both agree. */
  async function save(actor: Actor, input: PartInputParsed, existing: PartRow | null) {
    authorize(actor, 'catalogue.edit');
    try {
      return await db.transaction(async (tx) => {
        if (existing && existing.sku !== input.sku) await refuseRenameInUse(tx, existing.sku);
        const refs = await resolveRefs(tx, input);
        const values = columnsFrom(input, refs, existing);
        const [row] = existing
          ? await tx.update(parts).set(values).where(eq(parts.id, existing.id)).returning()
          : await tx.insert(parts).values(values).returning();
        await tx.delete(partSupplierSkus).where(eq(partSupplierSkus.partId, row!.id));
        if (input.supplierSkus.length)
          await tx.insert(partSupplierSkus).values(input.supplierSkus.map((s) => ({ partId: row!.id, supplierId: refs.supplierIds.get(s.supplier)!, supplierSku: s.sku })));
        await partsIndex.sync(tx, [row!.id]);
        return row!;
      }).finally(onPartsChanged);
    } catch (e) {
      throw uniqueViolation(e) ?? e;
    }
  }

  return {
    /** A scanned or typed code: the part it names, found the way the catalogue page finds it. */
    async lookup(actor: Actor, text: string) {
      authorize(actor, 'catalogue.view');
      const code = asCode(text, seesSuppliers(actor));
      const [found] = code ? await partsIndex.searchMany([codeSearch(code)]) : [];
      const sku = code && found ? partNamedBy(code, found.hits) : null;
      if (!sku) throw new NotFoundError(`A part with the code ${text}`);
      return { sku };
    },

    async list(actor: Actor, query: PartListQuery) {
      authorize(actor, 'catalogue.view');
      const { searches, facetsAlone, code } = catalogueSearches(query, { supplierData: seesSuppliers(actor) });
      const [result, ...rest] = await partsIndex.searchMany(searches);
      const byCode = code ? rest.pop() : undefined;
      const dist = { ...(result!.facetDistribution ?? {}) };
      facetsAlone.forEach((facet, i) => (dist[facet] = rest[i]!.facetDistribution?.[facet] ?? {}));
      const exactSku = code && byCode ? partNamedBy(code, byCode.hits) : null;
      return {
        hits: result!.hits,
        total: result!.estimatedTotalHits ?? result!.hits.length,
        facets: {
          category: dist.category ?? {},
          maker: dist.maker ?? {},
          range: dist.ranges ?? {},
          lifecycle: dist.lifecycle ?? {},
          inStock: dist.inStock ?? {},
        },
        exactSku,
      };
    },

    /** Every matching part (up to the index's hit cap) for the CSV export: hits only, no facets. */
    async exportRows(actor: Actor, query: PartListQuery) {
      authorize(actor, 'catalogue.view');
      const rows: PartDocument[] = [];
      const { q, facets: _facets, ...page } = catalogueSearches(query, { supplierData: seesSuppliers(actor) }).page;
      for (let offset = 0; offset < 20_000; offset += 1000) {
        const { hits } = await partsIndex.index.search(q, { ...page, limit: 1000, offset });
        rows.push(...(hits as PartDocument[]));
        if (hits.length < 1000) break;
      }
      return rows;
    },

    async detail(actor: Actor, sku: string) {
      authorize(actor, 'catalogue.view');
      const p = await findPart(sku);
      const [[maker], successor, predecessors, media, stock, supplierRows, membership] = await Promise.all([
        db.select().from(makers).where(eq(makers.id, p.makerId)),
        p.supersededById ? db.select({ sku: parts.sku, name: parts.name }).from(parts).where(eq(parts.id, p.supersededById)) : Promise.resolve([]),
        db.select({ sku: parts.sku, name: parts.name }).from(parts).where(eq(parts.supersededById, p.id)).orderBy(asc(parts.sku)),
        db.select().from(partMedia).where(eq(partMedia.partId, p.id)).orderBy(asc(partMedia.createdAt)),
        db
          .select({
            warehouse: warehouses.code,
            warehouseName: warehouses.name,
            onHand: sql<number>`coalesce(sum(${stockLevels.onHand}), 0)::int`,
            reserved: sql<number>`coalesce(sum(${stockLevels.reserved}), 0)::int`,
          })
          .from(warehouses)
          .leftJoin(stockLevels, and(eq(stockLevels.warehouseId, warehouses.id), eq(stockLevels.partId, p.id)))
          .groupBy(warehouses.id)
          .orderBy(asc(warehouses.rank), asc(warehouses.code)),
        seesSuppliers(actor)
          ? db.select({ supplier: suppliers.code, sku: partSupplierSkus.supplierSku }).from(partSupplierSkus).innerJoin(suppliers, eq(suppliers.id, partSupplierSkus.supplierId)).where(eq(partSupplierSkus.partId, p.id))
          : Promise.resolve(null),
        rangeMembership(db, [p.id]),
      ]);
      return { part: p, maker: maker!, successor: successor[0] ?? null, predecessors, media, stock, supplierSkus: supplierRows, ranges: membership.get(p.id) ?? [] };
    },

    create: (actor: Actor, input: PartInputParsed) => save(actor, input, null),

    async update(actor: Actor, sku: string, input: PartInputParsed) {
      authorize(actor, 'catalogue.edit');
      return save(actor, input, await findPart(sku));
    },

    async setArchived(actor: Actor, sku: string, archived: boolean) {
      authorize(actor, 'catalogue.edit');
      const p = await findPart(sku);
      return db.transaction(async (tx) => {
        const [row] = await tx.update(parts).set({ archivedAt: archived ? new Date() : null, updatedAt: new Date() }).where(eq(parts.id, p.id)).returning();
        await partsIndex.sync(tx, [p.id]);
        return row!;
      }).finally(onPartsChanged);
    },

    async makers(actor: Actor) {
      authorize(actor, 'catalogue.view');
      return db
        .select({ code: makers.code, name: makers.name, country: makers.country, parts: count(parts.id) })
        .from(makers)
        .leftJoin(parts, and(eq(parts.makerId, makers.id), isNull(parts.archivedAt)))
        .groupBy(makers.id)
        .orderBy(asc(makers.name));
    },

    async ranges(actor: Actor) {
      authorize(actor, 'catalogue.view');
      const controller = sql<string>`(select sku from parts where parts.id = ${ranges.controllerId})`;
      const moduleSku = sql<string>`(select sku from parts where parts.id = ${ranges.moduleId})`;
      return db
        .select({
          id: ranges.id,
          code: ranges.code,
          name: ranges.name,
          maker: makers.code,
          makerName: makers.name,
          connection: ranges.connection,
          minModules: ranges.minModules,
          maxModules: ranges.maxModules,
          maxStacks: ranges.maxStacks,
          controllerSku: controller,
          moduleSku,
        })
        .from(ranges)
        .innerJoin(makers, eq(makers.id, ranges.makerId))
        .orderBy(asc(ranges.name));
    },
  };
}

export type CatalogueService = ReturnType<typeof createCatalogueService>;

/** Unique violations as 409s that name the field. */
function uniqueViolation(e: unknown) {
  const cause = (e as { cause?: { code?: string; constraint?: string } })?.cause;
  if (cause?.code !== '23505') return null;
  if (cause.constraint?.includes('sku') && !cause.constraint.includes('supplier'))
    return new ConflictError('A part with that SKU already exists.', { fields: [{ path: 'sku', message: 'Already in use by another part.' }] });
  if (cause.constraint?.includes('gtin')) return new ConflictError('Another part already has that GTIN.', { fields: [{ path: 'gtin', message: 'Already on another part.' }] });
  return new ConflictError('That supplier SKU already belongs to another part.', { fields: [{ path: 'supplierSkus', message: 'Already on another part.' }] });
}

type PartRefs = { makerId: string; supersededById: string | null };
type PartColumnsInput = Pick<PartInputParsed, 'sku' | 'name' | 'description' | 'gtin' | 'unit' | 'packSize' | 'massKg' | 'widthMm' | 'heightMm' | 'depthMm' | 'ipRating' | 'lifecycle' | 'dangerousGoods' | 'listPriceCents' | 'attributes' | 'compliance'> & { costCents?: number | null };

/** A part's row from its input: one mapping for the catalogue's writes and the seed/test factories. */
export function partColumns(input: PartColumnsInput, refs: PartRefs) {
  return {
    sku: input.sku,
    name: input.name,
    category: input.attributes.category,
    makerId: refs.makerId,
    description: input.description,
    gtin: input.gtin ?? null,
    unit: input.unit,
    packSize: input.packSize,
    massKg: input.massKg,
    widthMm: input.widthMm ?? null,
    heightMm: input.heightMm ?? null,
    depthMm: input.depthMm ?? null,
    ipRating: input.ipRating ?? null,
    lifecycle: input.lifecycle,
    supersededById: refs.supersededById,
    unNumber: input.dangerousGoods?.unNumber ?? null,
    dgClass: input.dangerousGoods?.class ?? null,
    whRating: input.dangerousGoods?.whRating ?? null,
    costCents: input.costCents ?? null,
    listPriceCents: input.listPriceCents ?? null,
    attributes: input.attributes,
    compliance: input.compliance ?? null,
    updatedAt: new Date(),
  };
}

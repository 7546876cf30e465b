import { createHash } from 'node:crypto';
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client.ts';
import { makers, partSupplierSkus, parts, priceListImports, priceListRows, supplierImportMappings, suppliers, user } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import { readPriceFile } from '../lib/price-file.ts';
import { changePct, mappingProblems, parseRow, suggestMapping, type ParsedRow } from '@shared/domain/price-list.ts';
import { IMPORT_FIELDS, type ColumnMapping, type ImportField, type NumberLocale, type PreviewChange, type PreviewCounts, type PreviewQuery, type RowLinkInput } from '@shared/contracts/purchasing.ts';
import { PartAttributesSchema } from '@shared/contracts/part-attributes.ts';
import type { PartsIndex } from '../search/parts-index.ts';
import { recomputeSellPrices } from './pricing.ts';

export interface Upload {
  buffer: Buffer;
  originalname: string;
}

/** Called between the steps of staging and applying: rows done of rows in all. */
export type ProgressFn = (done: number, total: number) => void | Promise<void>;

const CHUNK = 5000;
type RowKind = 'error' | 'new' | 'changed' | 'unchanged';

const emptyCounts = (): PreviewCounts => ({ rows: 0, ok: 0, errors: 0, new: 0, changed: 0, unchanged: 0, missing: 0, flagged: 0, unlinked: 0 });

/**
 * Price-list imports: upload (the file is kept with the import), map columns (remembered per
 * supplier), stage every row with its problems and its diff against current costs, link or create
 * parts, apply in one transaction. Staging and applying report progress to an in-memory table the
 * client polls; see DEVELOPERS.md "Price-list imports".
 */
export type PriceListApplied = { importId: string; supplierName: string; fileName: string; counts: PreviewCounts; appliedBy: string };

export function createPriceListService({ db, partsIndex, onApplied }: { db: Db; partsIndex: PartsIndex; onApplied?: (tx: Tx, applied: PriceListApplied) => Promise<unknown> }) {
  const progress = new Map<string, { done: number; total: number }>();

  async function load(id: string) {
    const [row] = await db
      .select({ imp: priceListImports, supplier: { id: suppliers.id, code: suppliers.code, name: suppliers.name, numberLocale: suppliers.numberLocale, audPerUnit: suppliers.audPerUnit, flagChangePct: suppliers.flagChangePct } })
      .from(priceListImports)
      .innerJoin(suppliers, eq(suppliers.id, priceListImports.supplierId))
      .where(eq(priceListImports.id, id));
    if (!row) throw new NotFoundError('That price list');
    return row;
  }

  async function describe(id: string) {
    const { imp, supplier } = await load(id);
    const [createdBy, appliedBy] = await Promise.all([imp.createdBy, imp.appliedBy].map(async (u) => (u ? ((await db.select({ name: user.name }).from(user).where(eq(user.id, u)))[0]?.name ?? null) : null)));
    const [same] = await db
      .select({ at: priceListImports.appliedAt })
      .from(priceListImports)
      .where(and(eq(priceListImports.supplierId, imp.supplierId), eq(priceListImports.fileHash, imp.fileHash), eq(priceListImports.status, 'applied'), sql`${priceListImports.id} <> ${imp.id}`))
      .orderBy(desc(priceListImports.appliedAt))
      .limit(1);
    const live = progress.get(id);
    return {
      ...imp,
      supplier: { id: supplier.id, code: supplier.code, name: supplier.name },
      createdByName: createdBy ?? null,
      appliedByName: appliedBy ?? null,
      progress: live ?? { done: imp.progressDone, total: imp.progressTotal },
      sameFileAppliedAt: same?.at ?? null,
    };
  }

  /** Parses every row with the mapping and writes the staged rows (replacing any before) in one transaction. */
  async function stage(id: string, mapping: ColumnMapping, sheet: string | null, onProgress?: ProgressFn) {
    const { imp, supplier } = await load(id);
    const file = await readPriceFile(imp.file, { sheet });
    const problems = mappingProblems(file.columns, mapping);
    if (problems.length) throw new ValidationError(problems.join(' '), { fields: problems.map((message) => ({ path: 'mapping', message })) });
    const index: Partial<Record<ImportField, number>> = {};
    for (const f of IMPORT_FIELDS) if (mapping[f]) index[f] = file.columns.indexOf(mapping[f]!);
    const ctx = { locale: supplier.numberLocale as NumberLocale, audPerUnit: supplier.audPerUnit, index, mapping };
    const total = file.rows.length;
    const report = async (done: number) => {
      progress.set(id, { done, total });
      await onProgress?.(done, total);
    };

    const parsed: (ParsedRow & { rowNo: number })[] = [];
    const firstRow = new Map<string, number>();
    const firstGtin = new Map<string, number>();
    for (const r of file.rows) {
      const row = { ...parseRow(r.cells, ctx), rowNo: r.rowNo };
      if (row.supplierSku) {
        const key = row.supplierSku.toUpperCase();
        const before = firstRow.get(key);
        if (before !== undefined) row.problems.push({ column: mapping.supplierSku ?? null, message: `Supplier SKU ${row.supplierSku} is also on row ${before}; each SKU once per file.` });
        else firstRow.set(key, r.rowNo);
      }
      if (row.gtin && row.problems.length === 0) {
        const before = firstGtin.get(row.gtin.padStart(14, '0'));
        if (before !== undefined) row.problems.push({ column: mapping.gtin ?? null, message: `GTIN ${row.gtin} is also on row ${before}; one item, one row.` });
        else firstGtin.set(row.gtin.padStart(14, '0'), r.rowNo);
      }
      parsed.push(row);
    }

    // What the supplier sells us now, and our parts by GTIN for rows we have never bought from them.
    const current = await db
      .select({ partId: partSupplierSkus.partId, supplierSku: partSupplierSkus.supplierSku, costCents: partSupplierSkus.costCents, priceBreaks: partSupplierSkus.priceBreaks, packSize: partSupplierSkus.packSize, moq: partSupplierSkus.moq, listPriceCents: partSupplierSkus.listPriceCents, leadTimeDays: partSupplierSkus.leadTimeDays })
      .from(partSupplierSkus)
      .where(eq(partSupplierSkus.supplierId, supplier.id));
    const bySku = new Map(current.map((c) => [c.supplierSku.toUpperCase(), c]));
    const linkedParts = new Set(current.map((c) => c.partId));
    const gtins = [...new Set(parsed.filter((p) => p.gtin && !bySku.has(p.supplierSku!.toUpperCase())).map((p) => p.gtin!.padStart(14, '0')))];
    const byGtin = new Map<string, string>();
    for (let i = 0; i < gtins.length; i += CHUNK) {
      const found = await db.select({ id: parts.id, gtin14: parts.gtin14 }).from(parts).where(inArray(parts.gtin14, gtins.slice(i, i + CHUNK)));
      for (const f of found) byGtin.set(f.gtin14!, f.id);
    }
    const flagAt = Number(supplier.flagChangePct);

    const staged = parsed.map((p) => {
      let kind: RowKind = 'error';
      let partId: string | null = null;
      let matchedBy: 'supplier-sku' | 'gtin' | null = null;
      let oldCost: number | null = null;
      let flagged = false;
      if (p.problems.length === 0) {
        const cur = bySku.get(p.supplierSku!.toUpperCase());
        if (cur) {
          partId = cur.partId;
          matchedBy = 'supplier-sku';
          oldCost = cur.costCents;
          const same =
            cur.costCents === p.costCents &&
            JSON.stringify(cur.priceBreaks) === JSON.stringify(p.priceBreaks) &&
            (index.packSize === undefined || cur.packSize === p.packSize) &&
            (index.moq === undefined || cur.moq === p.moq) &&
            (index.listPrice === undefined || cur.listPriceCents === p.listPriceCents) &&
            (index.leadTimeDays === undefined || cur.leadTimeDays === p.leadTimeDays);
          kind = same ? 'unchanged' : 'changed';
          const pct = changePct(cur.costCents, p.costCents);
          flagged = kind === 'changed' && pct !== null && Math.abs(pct) > flagAt;
        } else {
          kind = 'new';
          const g = p.gtin ? byGtin.get(p.gtin.padStart(14, '0')) : undefined;
          // A part that already has another SKU with this supplier is not re-linked by its GTIN.
          if (g && !linkedParts.has(g)) {
            partId = g;
            matchedBy = 'gtin';
          }
        }
      }
      return { ...p, kind, partId, matchedBy, oldCost, flagged };
    });

    await db.transaction(async (tx) => {
      await tx.delete(priceListRows).where(eq(priceListRows.importId, id));
      for (let i = 0; i < staged.length; i += CHUNK) {
        await insertStaged(tx, id, staged.slice(i, i + CHUNK));
        await report(Math.min(i + CHUNK, total));
      }
      await tx.update(priceListImports).set({ mapping, sheet: file.sheet, columns: file.columns, sheets: file.sheets, status: 'ready', progressDone: total, progressTotal: total }).where(eq(priceListImports.id, id));
      await tx
        .insert(supplierImportMappings)
        .values({ supplierId: supplier.id, headers: file.columns, mapping })
        .onConflictDoUpdate({ target: supplierImportMappings.supplierId, set: { headers: file.columns, mapping, updatedAt: new Date() } });
      await tx.update(priceListImports).set({ counts: await countRows(tx, id, supplier.id) }).where(eq(priceListImports.id, id));
    });
    progress.delete(id);
  }

  async function insertStaged(tx: Tx, importId: string, rows: (ParsedRow & { rowNo: number; kind: RowKind; partId: string | null; matchedBy: string | null; oldCost: number | null; flagged: boolean })[]) {
    // One array parameter per column (sql.param: drizzle would otherwise spread an array into a list).
    const arr = <T>(f: (r: (typeof rows)[number]) => T) => sql.param(rows.map(f));
    await tx.execute(sql`
      insert into price_list_rows (import_id, row_no, supplier_sku, gtin, description, cost_cents, list_price_cents, pack_size, moq, lead_time_days, price_breaks, problems, part_id, matched_by, old_cost_cents, kind, flagged)
      select ${importId}::uuid, * from unnest(
        ${arr((r) => r.rowNo)}::int[], ${arr((r) => r.supplierSku)}::text[], ${arr((r) => r.gtin)}::text[], ${arr((r) => r.description)}::text[],
        ${arr((r) => r.costCents)}::numeric[], ${arr((r) => r.listPriceCents)}::bigint[], ${arr((r) => r.packSize)}::int[], ${arr((r) => r.moq)}::int[], ${arr((r) => r.leadTimeDays)}::int[],
        ${arr((r) => JSON.stringify(r.priceBreaks))}::jsonb[], ${arr((r) => JSON.stringify(r.problems))}::jsonb[], ${arr((r) => r.partId)}::uuid[], ${arr((r) => r.matchedBy)}::text[],
        ${arr((r) => r.oldCost)}::numeric[], ${arr((r) => r.kind)}::text[], ${arr((r) => r.flagged)}::boolean[])`);
  }

  async function countRows(tx: Tx | Db, importId: string, supplierId: string): Promise<PreviewCounts> {
    const { rows } = await tx.execute<Record<keyof PreviewCounts, number>>(sql`
      select count(*)::int as rows,
             count(*) filter (where kind <> 'error')::int as ok,
             count(*) filter (where kind = 'error')::int as errors,
             count(*) filter (where kind = 'new')::int as new,
             count(*) filter (where kind = 'changed')::int as changed,
             count(*) filter (where kind = 'unchanged')::int as unchanged,
             count(*) filter (where flagged)::int as flagged,
             count(*) filter (where kind = 'new' and part_id is null and create_as is null)::int as unlinked,
             (select count(*)::int from part_supplier_skus s where s.supplier_id = ${supplierId}::uuid
                and not exists (select 1 from price_list_rows m where m.import_id = ${importId}::uuid and upper(m.supplier_sku) = upper(s.supplier_sku))) as missing
      from price_list_rows where import_id = ${importId}::uuid`);
    return { ...emptyCounts(), ...rows[0] };
  }

  function assertOpen(status: string) {
    if (status === 'applied') throw new ConflictError('This price list has already been applied; upload the file again to start a new import.');
    if (status === 'applying' || status === 'staging') throw new ConflictError('This price list is being worked on; wait for it to finish.');
  }

  return {
    progressOf: (id: string) => progress.get(id) ?? null,

    async list(actor: Actor) {
      authorize(actor, 'purchasing.manage');
      return db
        .select({ id: priceListImports.id, supplier: suppliers.name, supplierCode: suppliers.code, fileName: priceListImports.fileName, fileKind: priceListImports.fileKind, fileHash: priceListImports.fileHash, status: priceListImports.status, counts: priceListImports.counts, createdAt: priceListImports.createdAt, createdBy: user.name, appliedAt: priceListImports.appliedAt })
        .from(priceListImports)
        .innerJoin(suppliers, eq(suppliers.id, priceListImports.supplierId))
        .leftJoin(user, eq(user.id, priceListImports.createdBy))
        .orderBy(desc(priceListImports.createdAt))
        .limit(200);
    },

    async get(actor: Actor, id: string) {
      authorize(actor, 'purchasing.manage');
      return describe(id);
    },

    /** Keeps the file with a new import and offers a mapping (the supplier's remembered one, or one guessed from the headers). */
    async upload(actor: Actor, supplierId: string, file: Upload | undefined) {
      authorize(actor, 'purchasing.manage');
      if (!file) throw new ValidationError('Choose a price-list file to upload (form field "file").', { fields: [{ path: 'file', message: 'Choose a CSV or XLSX file.' }] });
      const [supplier] = await db.select({ id: suppliers.id }).from(suppliers).where(eq(suppliers.id, supplierId));
      if (!supplier) throw new ValidationError('There is no such supplier; choose one from the list.', { fields: [{ path: 'supplierId', message: 'Unknown supplier.' }] });
      const read = await readPriceFile(file.buffer);
      const [remembered] = await db.select().from(supplierImportMappings).where(eq(supplierImportMappings.supplierId, supplierId));
      const mapping = suggestMapping(read.columns, remembered?.mapping);
      const [row] = await db
        .insert(priceListImports)
        .values({
          supplierId,
          fileName: file.originalname.replace(/[^\p{L}\p{N} ._-]/gu, '_').slice(0, 120) || 'price-list',
          fileHash: createHash('sha256').update(file.buffer).digest('hex'),
          fileKind: read.kind,
          file: file.buffer,
          sheets: read.sheets,
          sheet: read.sheet,
          columns: read.columns,
          mapping,
          counts: { rows: read.rows.length },
          progressTotal: read.rows.length,
          createdBy: actor.userId,
        })
        .returning({ id: priceListImports.id });
      return describe(row!.id);
    },

    /** Sets the mapping (and sheet), then reads every row and stages it with its problems and its diff. */
    async setMapping(actor: Actor, id: string, input: { mapping: ColumnMapping; sheet?: string }, onProgress?: ProgressFn) {
      authorize(actor, 'purchasing.manage');
      const { imp } = await load(id);
      assertOpen(imp.status);
      const sheet = input.sheet ?? imp.sheet;
      if (input.sheet && !imp.sheets.includes(input.sheet)) throw new ValidationError(`The workbook has no sheet "${input.sheet}".`, { fields: [{ path: 'sheet', message: `Choose one of: ${imp.sheets.join(', ')}.` }] });
      try {
        await stage(id, Object.fromEntries(Object.entries(input.mapping).filter(([, c]) => c)) as ColumnMapping, sheet, onProgress);
      } finally {
        progress.delete(id);
      }
      return describe(id);
    },

    async preview(actor: Actor, id: string, q: PreviewQuery) {
      authorize(actor, 'purchasing.manage');
      const { imp, supplier } = await load(id);
      const counts = { ...emptyCounts(), ...(imp.counts as Partial<PreviewCounts>) };
      // Before the columns are chosen there is nothing to check yet: only the row count is known.
      if (imp.status === 'uploaded') return { counts, errors: [], changes: [], total: 0 };
      const errors = await db
        .select({ row: priceListRows.rowNo, problems: priceListRows.problems })
        .from(priceListRows)
        .where(and(eq(priceListRows.importId, id), eq(priceListRows.kind, 'error')))
        .orderBy(asc(priceListRows.rowNo))
        .limit(q.kind === 'error' ? q.pageSize : 200)
        .offset(q.kind === 'error' ? (q.page - 1) * q.pageSize : 0);
      const offset = (q.page - 1) * q.pageSize;
      let changes: PreviewChange[] = [];
      let total = 0;
      if (q.kind === 'missing') {
        const { rows } = await db.execute<{ supplier_sku: string; description: string | null; sku: string; cost_cents: string | null }>(sql`
          select s.supplier_sku, s.description, p.sku, s.cost_cents from part_supplier_skus s join parts p on p.id = s.part_id
          where s.supplier_id = ${supplier.id}::uuid and not exists (select 1 from price_list_rows m where m.import_id = ${id}::uuid and upper(m.supplier_sku) = upper(s.supplier_sku))
          order by s.supplier_sku limit ${q.pageSize} offset ${offset}`);
        changes = rows.map((r) => ({ row: null, kind: 'missing' as const, supplierSku: r.supplier_sku, description: r.description, sku: r.sku, matchedBy: 'supplier-sku', createAs: null, oldCostCents: r.cost_cents === null ? null : Number(r.cost_cents), newCostCents: null, changePct: null, flagged: false }));
        total = counts.missing;
      } else if (q.kind !== 'error') {
        changes = await stagedChanges(id, q.kind, q.pageSize, offset);
        total = q.kind === 'all' ? counts.ok : q.kind === 'flagged' ? counts.flagged : counts[q.kind];
      } else total = counts.errors;
      return { counts, errors: errors.flatMap((e) => e.problems.map((p) => ({ row: e.row, column: p.column, message: p.message }))), changes, total };
    },

    /** Every problem of every row, for a CSV the supplier can be sent. */
    async problemRows(actor: Actor, id: string) {
      authorize(actor, 'purchasing.manage');
      await load(id);
      const rows = await db.select({ row: priceListRows.rowNo, supplierSku: priceListRows.supplierSku, problems: priceListRows.problems }).from(priceListRows).where(and(eq(priceListRows.importId, id), eq(priceListRows.kind, 'error'))).orderBy(asc(priceListRows.rowNo));
      return rows.flatMap((r) => r.problems.map((p) => ({ row: r.row, supplierSku: r.supplierSku, column: p.column, problem: p.message })));
    },

    /** Links new rows to existing parts, marks them to become new parts, or undoes either. */
    async link(actor: Actor, id: string, input: RowLinkInput) {
      authorize(actor, 'purchasing.manage');
      const { imp, supplier } = await load(id);
      assertOpen(imp.status);
      if (imp.status !== 'ready') throw new ConflictError('Choose the columns first; then rows can be linked.');
      await db.transaction(async (tx) => {
        for (const [i, l] of input.links.entries()) {
          const path = `links.${i}`;
          const [row] = await tx.select().from(priceListRows).where(and(eq(priceListRows.importId, id), eq(priceListRows.rowNo, l.row))).for('update');
          if (!row) throw new ValidationError(`Row ${l.row} is not in this price list.`, { fields: [{ path: `${path}.row`, message: 'No such row.' }] });
          if (row.kind !== 'new') throw new ValidationError(`Row ${l.row} is ${row.kind === 'error' ? 'refused for its problems' : 'already matched by its supplier SKU'}; only new rows can be linked.`, { fields: [{ path: `${path}.row`, message: 'Only new rows can be linked.' }] });
          if ('unlink' in l) {
            await tx.update(priceListRows).set({ partId: null, matchedBy: null, createAs: null }).where(and(eq(priceListRows.importId, id), eq(priceListRows.rowNo, l.row)));
          } else if ('sku' in l) {
            const [part] = await tx.select({ id: parts.id }).from(parts).where(eq(parts.sku, l.sku));
            if (!part) throw new ValidationError(`Row ${l.row}: there is no part ${l.sku}.`, { fields: [{ path: `${path}.sku`, message: 'Unknown SKU.' }] });
            const [held] = await tx.select({ sku: partSupplierSkus.supplierSku }).from(partSupplierSkus).where(and(eq(partSupplierSkus.partId, part.id), eq(partSupplierSkus.supplierId, supplier.id)));
            if (held) throw new ValidationError(`Row ${l.row}: ${l.sku} already has supplier SKU ${held.sku} with ${supplier.name}.`, { fields: [{ path: `${path}.sku`, message: 'Already linked to another supplier SKU.' }] });
            const [twice] = await tx.select({ row: priceListRows.rowNo }).from(priceListRows).where(and(eq(priceListRows.importId, id), eq(priceListRows.partId, part.id), sql`${priceListRows.rowNo} <> ${l.row}`, eq(priceListRows.kind, 'new')));
            if (twice) throw new ValidationError(`Row ${l.row}: ${l.sku} is already linked to row ${twice.row}.`, { fields: [{ path: `${path}.sku`, message: 'Already linked to another row.' }] });
            await tx.update(priceListRows).set({ partId: part.id, matchedBy: 'linked', createAs: null }).where(and(eq(priceListRows.importId, id), eq(priceListRows.rowNo, l.row)));
          } else {
            if (!PartAttributesSchema.safeParse({ category: l.create.category }).success) throw new ValidationError(`Row ${l.row}: a ${l.create.category} needs its technical details; create it in the catalogue, then link the row.`, { fields: [{ path: `${path}.create.category`, message: 'Needs attributes; create it in the catalogue.' }] });
            const [maker] = await tx.select({ id: makers.id }).from(makers).where(eq(makers.code, l.create.maker));
            if (!maker) throw new ValidationError(`Row ${l.row}: there is no maker ${l.create.maker}.`, { fields: [{ path: `${path}.create.maker`, message: 'Unknown maker.' }] });
            const [taken] = await tx.select({ id: parts.id }).from(parts).where(eq(parts.sku, l.create.sku));
            if (taken) throw new ValidationError(`Row ${l.row}: SKU ${l.create.sku} is taken; link the row to it or choose another SKU.`, { fields: [{ path: `${path}.create.sku`, message: 'SKU taken.' }] });
            await tx.update(priceListRows).set({ partId: null, matchedBy: null, createAs: l.create }).where(and(eq(priceListRows.importId, id), eq(priceListRows.rowNo, l.row)));
          }
        }
        await tx.update(priceListImports).set({ counts: await countRows(tx, id, supplier.id) }).where(eq(priceListImports.id, id));
      });
      return describe(id);
    },

    /**
     * Applies the staged rows in one transaction: new parts, supplier parts (only what differs),
     * price history, part costs (the cheapest supplier's), sell prices and the search index. A second
     * apply of the same import changes nothing; a crash part-way leaves nothing behind.
     */
    async apply(actor: Actor, id: string, onProgress?: ProgressFn) {
      authorize(actor, 'purchasing.manage');
      const first = await load(id);
      if (first.imp.status === 'uploaded') throw new ConflictError('Choose the columns first; then the price list can be applied.');
      const report = async (done: number, total: number) => {
        progress.set(id, { done, total });
        await onProgress?.(done, total);
      };
      try {
        return await db.transaction(async (tx) => {
          // One import of a supplier at a time; a second apply of this import waits here, then finds it applied.
          await tx.execute(sql`select id from suppliers where id = ${first.supplier.id}::uuid for update`);
          const [imp] = await tx.select().from(priceListImports).where(eq(priceListImports.id, id)).for('update');
          const counts = { ...emptyCounts(), ...(imp!.counts as Partial<PreviewCounts>) };
          if (imp!.status === 'applied') return { applied: false, counts, pricesMoved: 0 };
          assertOpen(imp!.status);
          const mapped = new Set(Object.keys(imp!.mapping));
          const steps = 6;
          await report(0, steps);

          // 1. Parts created from rows.
          const toCreate = await tx.select().from(priceListRows).where(and(eq(priceListRows.importId, id), eq(priceListRows.kind, 'new'), sql`${priceListRows.createAs} is not null`));
          for (const r of toCreate) {
            const spec = r.createAs!;
            const [maker] = await tx.select({ id: makers.id }).from(makers).where(eq(makers.code, spec.maker));
            if (!maker) throw new ValidationError(`Row ${r.rowNo}: there is no maker ${spec.maker}.`);
            const [p] = await tx
              .insert(parts)
              .values({ sku: spec.sku, name: (r.description ?? r.supplierSku ?? spec.sku).slice(0, 200), category: spec.category, makerId: maker.id, gtin: r.gtin, packSize: 1, attributes: PartAttributesSchema.parse({ category: spec.category }) })
              .returning({ id: parts.id });
            await tx.update(priceListRows).set({ partId: p!.id }).where(and(eq(priceListRows.importId, id), eq(priceListRows.rowNo, r.rowNo)));
          }
          await report(1, steps);

          const live = sql`r.import_id = ${id}::uuid and r.kind in ('new', 'changed') and r.part_id is not null`;
          // 2. History: every cost (or set of breaks) that differs from what we hold now.
          await tx.execute(sql`
            insert into supplier_part_prices (part_id, supplier_id, cost_cents, price_breaks, import_id, user_id)
            select r.part_id, ${imp!.supplierId}::uuid, r.cost_cents, r.price_breaks, ${id}::uuid, ${actor.userId}
            from price_list_rows r left join part_supplier_skus s on s.part_id = r.part_id and s.supplier_id = ${imp!.supplierId}::uuid
            where ${live} and (s.part_id is null or s.cost_cents is distinct from r.cost_cents or s.price_breaks is distinct from r.price_breaks)`);
          await report(2, steps);

          // 3. Supplier parts: existing ones updated where anything differs (fields the file does not map,
          // or leaves blank, are kept), then the new ones inserted.
          const take = (field: ImportField, column: string) => (mapped.has(field) ? sql.raw(`coalesce(r.${column}, s.${column})`) : sql.raw(`s.${column}`));
          const next = sql`(r.supplier_sku, r.cost_cents, r.price_breaks, ${take('description', 'description')}, ${take('packSize', 'pack_size')}, ${take('moq', 'moq')}, ${take('listPrice', 'list_price_cents')}, ${take('leadTimeDays', 'lead_time_days')})`;
          const { rows: updated } = await tx.execute<{ part_id: string }>(sql`
            update part_supplier_skus s set (supplier_sku, cost_cents, price_breaks, description, pack_size, moq, list_price_cents, lead_time_days) = ${next}, updated_at = now()
            from price_list_rows r
            where ${live} and s.part_id = r.part_id and s.supplier_id = ${imp!.supplierId}::uuid
              and (s.supplier_sku, s.cost_cents, s.price_breaks, s.description, s.pack_size, s.moq, s.list_price_cents, s.lead_time_days) is distinct from ${next}
            returning s.part_id`);
          const { rows: inserted } = await tx.execute<{ part_id: string }>(sql`
            insert into part_supplier_skus (part_id, supplier_id, supplier_sku, description, pack_size, moq, cost_cents, price_breaks, list_price_cents, lead_time_days)
            select r.part_id, ${imp!.supplierId}::uuid, r.supplier_sku, r.description, coalesce(r.pack_size, 1), coalesce(r.moq, 1), r.cost_cents, r.price_breaks, r.list_price_cents, r.lead_time_days
            from price_list_rows r where ${live}
            on conflict (part_id, supplier_id) do nothing
            returning part_id`);
          const touched = [...updated.map((u) => ({ part_id: u.part_id, inserted: false })), ...inserted.map((u) => ({ part_id: u.part_id, inserted: true }))];
          await report(3, steps);

          // 4. A part's cost is its cheapest supplier's.
          const partIds = touched.map((t) => t.part_id);
          const costMoved: string[] = [];
          for (let i = 0; i < partIds.length; i += CHUNK) {
            const ids = `{${partIds.slice(i, i + CHUNK).join(',')}}`;
            const { rows } = await tx.execute<{ id: string }>(sql`
              update parts p set cost_cents = c.cost, updated_at = now()
              from (select part_id, min(cost_cents) as cost from part_supplier_skus where part_id = any(${ids}::uuid[]) and cost_cents is not null group by part_id) c
              where p.id = c.part_id and p.cost_cents is distinct from c.cost returning p.id`);
            costMoved.push(...rows.map((r) => r.id));
          }
          await report(4, steps);

          // 5. Sell prices follow costs (and supplier list prices); the search index follows new supplier SKUs.
          const recompute = partIds.length ? await recomputeSellPrices(tx, partsIndex, { partIds, reason: `Price list ${imp!.fileName} applied`, importId: id, userId: actor.userId }) : { moved: 0 };
          const newLinks = touched.filter((t) => t.inserted).map((t) => t.part_id);
          if (newLinks.length) await partsIndex.sync(tx, newLinks);
          await report(5, steps);

          // 6. The import record.
          const finalCounts = await countRows(tx, id, imp!.supplierId);
          await tx.update(priceListImports).set({ status: 'applied', appliedBy: actor.userId, appliedAt: new Date(), counts: { ...finalCounts, applied: touched.length, pricesMoved: recompute.moved } }).where(eq(priceListImports.id, id));
          await onApplied?.(tx, { importId: id, supplierName: first.supplier.name, fileName: imp!.fileName, counts: finalCounts, appliedBy: actor.name });
          await report(6, steps);
          return { applied: true, counts: finalCounts, pricesMoved: recompute.moved };
        });
      } finally {
        progress.delete(id);
      }
    },
  };

  async function stagedChanges(id: string, kind: PreviewQuery['kind'], limit: number, offset: number) {
    const where = kind === 'all' ? sql`r.kind <> 'error'` : kind === 'flagged' ? sql`r.flagged` : sql`r.kind = ${kind}`;
    const { rows } = await db.execute<{ row_no: number; kind: 'new' | 'changed' | 'unchanged'; supplier_sku: string; description: string | null; sku: string | null; matched_by: string | null; create_as: { category: string; maker: string; sku: string } | null; old_cost_cents: string | null; cost_cents: string | null; flagged: boolean }>(sql`
      select r.row_no, r.kind, r.supplier_sku, r.description, p.sku, r.matched_by, r.create_as, r.old_cost_cents, r.cost_cents, r.flagged
      from price_list_rows r left join parts p on p.id = r.part_id
      where r.import_id = ${id}::uuid and ${where}
      order by r.flagged desc, case r.kind when 'changed' then 0 when 'new' then 1 else 2 end, r.row_no
      limit ${limit} offset ${offset}`);
    return rows.map((r) => {
      const oldC = r.old_cost_cents === null ? null : Number(r.old_cost_cents);
      const newC = r.cost_cents === null ? null : Number(r.cost_cents);
      return { row: r.row_no, kind: r.kind, supplierSku: r.supplier_sku, description: r.description, sku: r.sku, matchedBy: r.matched_by, createAs: r.create_as, oldCostCents: oldC, newCostCents: newC, changePct: changePct(oldC, newC), flagged: r.flagged };
    });
  }
}

export type PriceListService = ReturnType<typeof createPriceListService>;

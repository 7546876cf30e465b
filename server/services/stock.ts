import { and, asc, desc, eq, gte, ilike, inArray, lt, sql, type SQL } from 'drizzle-orm';
import { likeLiteral } from '../db/like.ts';
import type { Db, DbOrTx, Tx } from '../db/client.ts';
import { pgCode } from '../db/errors.ts';
import { bins, companies, defaultBins, jobs, parts, partSerials, stockLevels, stockLimits, stockMovements, user, warehouses } from '../db/schema/index.ts';
import { isSerialised } from '@shared/domain/warehouse.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import type { AdjustmentInput, BinInput, CountInput, MovementQuery, ReceiptInput, ReturnInput, StockQuery, TransferInput, WarehouseInput } from '@shared/contracts/stock.ts';
import { fillBackorders, inStockTransaction, levelKey, lockLevels, newReference, partsBySku, recordMovement, resolveBin, warehouseByCode, type FilledJob } from './ledger.ts';

export interface StockDeps {
  db: Db;
  now?: () => Date;
  /** Books a receipt against its purchase order inside the receipt's transaction (purchasing provides it). */
  onPurchaseOrderReceipt?: (tx: Tx, receipt: { purchaseOrder: string; warehouseId: string; lines: { partId: string; qty: number }[] }) => Promise<void>;
  /** Units on open purchase orders per `${partId}|${warehouseId}` (purchasing provides it). */
  onOrder?: (db: Db) => Promise<Map<string, number>>;
}

/** The stock ledger as the only way stock changes: every change is a movement plus its level row, in one transaction. */
export function createStockService({ db, now = () => new Date(), onPurchaseOrderReceipt, onOrder }: StockDeps) {
  async function onePart(sku: string) {
    return (await partsBySku(db, [sku])).get(sku.toUpperCase())!;
  }

  async function describeFilled(given: Map<string, number>): Promise<FilledJob[]> {
    if (given.size === 0) return [];
    const rows = await db
      .select({ id: jobs.id, reference: jobs.reference, company: companies.name, status: jobs.status })
      .from(jobs)
      .innerJoin(companies, eq(companies.id, jobs.companyId))
      .where(sql`${jobs.id} = any(${`{${[...given.keys()].join(',')}}`}::uuid[])`)
      .orderBy(asc(jobs.reference));
    return rows.map((r) => ({ ...r, units: given.get(r.id) ?? 0 }));
  }

  /**
   * Serialised parts (modules, controllers, inverters) arrive with one serial per unit; other parts
   * with none. A serial the part already has (in stock or issued) or one given twice is refused.
   */
  async function checkReceiptSerials(input: ReceiptInput, found: Map<string, { id: string; sku: string }>) {
    const ids = [...found.values()].map((p) => p.id);
    const categories = new Map((await db.select({ id: parts.id, category: parts.category }).from(parts).where(inArray(parts.id, ids))).map((r) => [r.id, r.category]));
    const fields: { path: string; message: string }[] = [];
    const wanted: { partId: string; serial: string; path: string }[] = [];
    input.lines.forEach((l, i) => {
      const part = found.get(l.sku)!;
      const serialised = isSerialised(categories.get(part.id) ?? '');
      if (serialised && !l.serials) fields.push({ path: `lines.${i}.serials`, message: `${l.sku} is serialised: give the serial of each of the ${l.qty} units.` });
      if (!serialised && l.serials?.length) fields.push({ path: `lines.${i}.serials`, message: `${l.sku} is not serialised: it is received by quantity only.` });
      for (const [j, serial] of (l.serials ?? []).entries()) {
        if (wanted.some((w) => w.partId === part.id && w.serial.toUpperCase() === serial.toUpperCase())) fields.push({ path: `lines.${i}.serials.${j}`, message: `Serial ${serial} is given twice.` });
        wanted.push({ partId: part.id, serial, path: `lines.${i}.serials.${j}` });
      }
    });
    if (fields.length) throw new ValidationError(fields[0]!.message, { fields });
    if (wanted.length === 0) return;
    const known = await db
      .select({ partId: partSerials.partId, serial: partSerials.serial, state: partSerials.state })
      .from(partSerials)
      .where(and(inArray(partSerials.partId, [...new Set(wanted.map((w) => w.partId))]), inArray(sql`upper(${partSerials.serial})`, wanted.map((w) => w.serial.toUpperCase()))));
    const clashes = wanted.filter((w) => known.some((k) => k.partId === w.partId && k.serial.toUpperCase() === w.serial.toUpperCase()));
    if (clashes.length) {
      const state = (w: (typeof clashes)[number]) => known.find((k) => k.partId === w.partId && k.serial.toUpperCase() === w.serial.toUpperCase())!.state;
      throw new ConflictError(`Serial ${clashes.map((c) => c.serial).join(', ')} is already known: ${state(clashes[0]!) === 'issued' ? 'issued to a job (book it back as a return)' : 'in stock'}.`, { fields: clashes.map((c) => ({ path: c.path, message: `Serial ${c.serial} is already ${state(c) === 'issued' ? 'issued to a job' : 'in stock'}.` })) });
    }
  }

  return {
    async levels(actor: Actor, q: StockQuery) {
      authorize(actor, 'stock.view');
      const where: SQL[] = [];
      if (q.sku) where.push(ilike(parts.sku, `${likeLiteral(q.sku)}%`));
      if (q.warehouse) where.push(eq(warehouses.code, q.warehouse.toUpperCase()));
      const cond = where.length ? and(...where) : undefined;
      const [rows, [count], ordered] = await Promise.all([
        db
          .select({ partId: parts.id, warehouseId: warehouses.id, sku: parts.sku, name: parts.name, warehouse: warehouses.code, bin: stockLevels.bin, onHand: stockLevels.onHand, reserved: stockLevels.reserved, isDefaultBin: sql<boolean>`${defaultBins.bin} is not null` })
          .from(stockLevels)
          .innerJoin(parts, eq(parts.id, stockLevels.partId))
          .innerJoin(warehouses, eq(warehouses.id, stockLevels.warehouseId))
          .leftJoin(defaultBins, and(eq(defaultBins.partId, stockLevels.partId), eq(defaultBins.warehouseId, stockLevels.warehouseId), eq(defaultBins.bin, stockLevels.bin)))
          .where(cond)
          .orderBy(asc(parts.sku), asc(warehouses.rank), asc(stockLevels.bin))
          .limit(q.pageSize)
          .offset((q.page - 1) * q.pageSize),
        db
          .select({ n: sql<number>`count(*)::int` })
          .from(stockLevels)
          .innerJoin(parts, eq(parts.id, stockLevels.partId))
          .innerJoin(warehouses, eq(warehouses.id, stockLevels.warehouseId))
          .where(cond),
        onOrder ? onOrder(db) : new Map<string, number>(),
      ]);
      // Units on order belong to a part × warehouse: shown once, on its first bin row.
      const shown = new Set<string>();
      return {
        rows: rows.map(({ partId, warehouseId, ...r }) => {
          const key = `${partId}|${warehouseId}`;
          const first = !shown.has(key);
          shown.add(key);
          return { ...r, available: r.onHand - r.reserved, onOrder: first ? (ordered.get(key) ?? 0) : 0 };
        }),
        total: count?.n ?? 0,
      };
    },

    async movements(actor: Actor, q: MovementQuery) {
      authorize(actor, 'stock.view');
      const where: SQL[] = [];
      if (q.sku) where.push(eq(parts.sku, q.sku.toUpperCase()));
      if (q.warehouse) where.push(eq(warehouses.code, q.warehouse.toUpperCase()));
      if (q.kind) where.push(eq(stockMovements.kind, q.kind));
      if (q.from) where.push(gte(stockMovements.createdAt, new Date(`${q.from}T00:00:00Z`)));
      if (q.to) where.push(lt(stockMovements.createdAt, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)));
      const cond = where.length ? and(...where) : undefined;
      const [rows, [count]] = await Promise.all([
        db
          .select({ id: stockMovements.id, at: stockMovements.createdAt, sku: parts.sku, name: parts.name, warehouse: warehouses.code, bin: stockMovements.bin, qty: stockMovements.qty, kind: stockMovements.kind, reason: stockMovements.reason, reference: stockMovements.reference, jobId: jobs.id, jobReference: jobs.reference, by: user.name })
          .from(stockMovements)
          .innerJoin(parts, eq(parts.id, stockMovements.partId))
          .innerJoin(warehouses, eq(warehouses.id, stockMovements.warehouseId))
          .leftJoin(jobs, eq(jobs.id, stockMovements.jobId))
          .leftJoin(user, eq(user.id, stockMovements.userId))
          .where(cond)
          .orderBy(desc(stockMovements.id))
          .limit(q.pageSize)
          .offset((q.page - 1) * q.pageSize),
        db
          .select({ n: sql<number>`count(*)::int` })
          .from(stockMovements)
          .innerJoin(parts, eq(parts.id, stockMovements.partId))
          .innerJoin(warehouses, eq(warehouses.id, stockMovements.warehouseId))
          .where(cond),
      ]);
      return { rows, total: count?.n ?? 0 };
    },

    /**
     * Goods in: one movement per line, each serialised unit's serial recorded in its bin, then
     * waiting backorders of those parts are filled oldest first. `purchaseOrder` names the order
     * the goods arrived against (purchasing's "receive against a PO" passes it).
     */
    async receive(actor: Actor, input: ReceiptInput, { purchaseOrder }: { purchaseOrder?: string } = {}) {
      authorize(actor, 'stock.receive');
      const wh = await warehouseByCode(db, input.warehouse);
      const found = await partsBySku(db, input.lines.map((l) => l.sku), 'lines');
      const lines = await Promise.all(input.lines.map(async (l, i) => ({ partId: found.get(l.sku)!.id, warehouseId: wh.id, bin: await resolveBin(db, found.get(l.sku)!.id, wh.id, l.bin, `lines.${i}.bin`), qty: l.qty, serials: l.serials ?? [] })));
      await checkReceiptSerials(input, found);
      if (input.reference) {
        const [seen] = await db.select({ id: stockMovements.id }).from(stockMovements).where(and(eq(stockMovements.reference, input.reference), eq(stockMovements.kind, 'receive'))).limit(1);
        if (seen) throw new ConflictError(`Receipt ${input.reference} has already been booked in.`, { fields: [{ path: 'reference', message: 'Already received.' }] });
      }
      const reference = input.reference ?? newReference('RCV', now());
      const po = input.purchaseOrder ?? purchaseOrder;
      const reason = po ? `Against purchase order ${po}` : null;
      if (input.purchaseOrder && !onPurchaseOrderReceipt) throw new ValidationError('Receiving against purchase orders is not available.', { fields: [{ path: 'purchaseOrder', message: 'Not available.' }] });
      const given = await inStockTransaction(db, async (tx) => {
        const locked = await lockLevels(tx, lines);
        for (const l of lines) {
          await recordMovement(tx, { ...l, kind: 'receive', reference, reason, userId: actor.userId });
          locked.get(levelKey(l))!.onHand += l.qty;
          if (l.serials.length) await tx.insert(partSerials).values(l.serials.map((serial) => ({ partId: l.partId, serial, state: 'in-stock' as const, warehouseId: l.warehouseId, bin: l.bin, receiptReference: reference, receivedAt: now() })));
        }
        if (input.purchaseOrder) await onPurchaseOrderReceipt!(tx, { purchaseOrder: input.purchaseOrder, warehouseId: wh.id, lines });
        return fillBackorders(tx, [...locked.values()], now());
      }).catch((e: unknown) => {
        // Two receipts of one serial at once: the unique key refused the second.
        if (pgCode(e) === '23505') throw new ConflictError('One of these serials was booked in by another receipt just now. Check the serials and try again.');
        throw e;
      });
      return { reference, movements: lines.length, filledJobs: await describeFilled(given) };
    },

    async adjust(actor: Actor, input: AdjustmentInput) {
      authorize(actor, 'stock.adjust');
      const wh = await warehouseByCode(db, input.warehouse);
      const part = await onePart(input.sku);
      const bin = await resolveBin(db, part.id, wh.id, input.bin);
      const reference = newReference('ADJ', now());
      await inStockTransaction(db, async (tx) => {
        const key = { partId: part.id, warehouseId: wh.id, bin };
        const locked = (await lockLevels(tx, [key])).get(levelKey(key))!;
        await recordMovement(tx, { ...key, qty: input.qty, kind: 'adjust', reason: input.reason, reference, userId: actor.userId });
        if (input.qty > 0) await fillBackorders(tx, [{ ...locked, onHand: locked.onHand + input.qty }], now());
      });
      return { reference, movements: 1, filledJobs: [] };
    },

    /** A stock count: the difference from the book figure becomes a count-correction movement. */
    async count(actor: Actor, input: CountInput) {
      authorize(actor, 'stock.adjust');
      const wh = await warehouseByCode(db, input.warehouse);
      const part = await onePart(input.sku);
      const reference = newReference('CNT', now());
      const diff = await inStockTransaction(db, async (tx) => {
        const key = { partId: part.id, warehouseId: wh.id, bin: input.bin };
        const locked = (await lockLevels(tx, [key])).get(levelKey(key))!;
        const d = input.counted - locked.onHand;
        if (d !== 0) await recordMovement(tx, { ...key, qty: d, kind: 'count-correction', reason: input.reason ?? `Counted ${input.counted}`, reference, userId: actor.userId });
        return d;
      });
      return { reference, movements: diff === 0 ? 0 : 1, filledJobs: [] };
    },

    /** Moves free (unreserved) units between bins or warehouses: a transfer-out and a transfer-in with one reference. */
    async transfer(actor: Actor, input: TransferInput) {
      authorize(actor, 'stock.transfer');
      const from = await warehouseByCode(db, input.fromWarehouse, 'fromWarehouse');
      const to = await warehouseByCode(db, input.toWarehouse, 'toWarehouse');
      const part = await onePart(input.sku);
      const fromBin = await resolveBin(db, part.id, from.id, input.fromBin, 'fromBin');
      const toBin = await resolveBin(db, part.id, to.id, input.toBin, 'toBin');
      if (from.id === to.id && fromBin === toBin) throw new ValidationError('Choose a different warehouse or bin to move the stock to.', { fields: [{ path: 'toBin', message: 'Same place as the source.' }] });
      const reference = newReference('TRF', now());
      const given = await inStockTransaction(db, async (tx) => {
        const a = { partId: part.id, warehouseId: from.id, bin: fromBin };
        const b = { partId: part.id, warehouseId: to.id, bin: toBin };
        const locked = await lockLevels(tx, [a, b]);
        const src = locked.get(levelKey(a))!;
        if (src.onHand - src.reserved < input.qty) throw new ConflictError(`Only ${Math.max(0, src.onHand - src.reserved)} of ${input.sku} are free in ${input.fromWarehouse} ${fromBin}; reserved units stay where they are.`);
        await recordMovement(tx, { ...a, qty: -input.qty, kind: 'transfer-out', reason: input.reason, reference, userId: actor.userId });
        await recordMovement(tx, { ...b, qty: input.qty, kind: 'transfer-in', reason: input.reason, reference, userId: actor.userId });
        const dest = locked.get(levelKey(b))!;
        return fillBackorders(tx, [{ ...dest, onHand: dest.onHand + input.qty }], now());
      });
      return { reference, movements: 2, filledJobs: await describeFilled(given) };
    },

    async returnStock(actor: Actor, input: ReturnInput) {
      authorize(actor, 'stock.receive');
      const wh = await warehouseByCode(db, input.warehouse);
      const part = await onePart(input.sku);
      const bin = await resolveBin(db, part.id, wh.id, input.bin);
      if (input.jobId) {
        const [j] = await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.id, input.jobId));
        if (!j) throw new ValidationError('There is no such job.', { fields: [{ path: 'jobId', message: 'Unknown job.' }] });
      }
      const reference = newReference('RTN', now());
      const given = await inStockTransaction(db, async (tx) => {
        const key = { partId: part.id, warehouseId: wh.id, bin };
        const locked = (await lockLevels(tx, [key])).get(levelKey(key))!;
        await recordMovement(tx, { ...key, qty: input.qty, kind: 'return', reason: input.reason, reference, jobId: input.jobId ?? null, userId: actor.userId });
        return fillBackorders(tx, [{ ...locked, onHand: locked.onHand + input.qty }], now());
      });
      return { reference, movements: 1, filledJobs: await describeFilled(given) };
    },

    /** Parts whose stock (all warehouses) is at or below their minimum. */
    async lowStock(actor: Actor) {
      authorize(actor, 'stock.view');
      const rows = await lowStockRows(db);
      return rows.map((r) => ({ ...r, toMax: Math.max(0, r.max - (r.available - r.backordered)) }));
    },

    /** The part's minimum and maximum and its default bins, for the part page's stock settings. */
    async partSettings(actor: Actor, sku: string) {
      authorize(actor, 'stock.view');
      const part = await onePart(sku);
      const [[limits], defaults] = await Promise.all([
        db.select({ min: stockLimits.minQty, max: stockLimits.maxQty }).from(stockLimits).where(eq(stockLimits.partId, part.id)),
        db.select({ warehouse: warehouses.code, bin: defaultBins.bin }).from(defaultBins).innerJoin(warehouses, eq(warehouses.id, defaultBins.warehouseId)).where(eq(defaultBins.partId, part.id)).orderBy(asc(warehouses.rank), asc(warehouses.code)),
      ]);
      return { sku: part.sku, limits: limits ?? null, defaultBins: defaults };
    },

    async setLimits(actor: Actor, sku: string, limits: { min: number; max: number }) {
      authorize(actor, 'stock.limits');
      const part = await onePart(sku);
      await db
        .insert(stockLimits)
        .values({ partId: part.id, minQty: limits.min, maxQty: limits.max })
        .onConflictDoUpdate({ target: stockLimits.partId, set: { minQty: limits.min, maxQty: limits.max, updatedAt: now() } });
      return { sku: part.sku, ...limits };
    },

    async warehouses(actor: Actor) {
      authorize(actor, 'stock.view');
      const [whs, binRows] = await Promise.all([
        db.select().from(warehouses).orderBy(asc(warehouses.rank), asc(warehouses.code)),
        db.execute<{ id: string; warehouse_id: string; code: string; pick_order: number; parts: number }>(sql`
          select b.id, b.warehouse_id, b.code, b.pick_order,
                 (select count(*)::int from stock_levels l where l.warehouse_id = b.warehouse_id and l.bin = b.code and l.on_hand > 0) as parts
          from bins b order by b.pick_order, b.code`),
      ]);
      return whs.map((w) => ({ ...w, bins: binRows.rows.filter((b) => b.warehouse_id === w.id).map((b) => ({ id: b.id, code: b.code, pickOrder: b.pick_order, parts: b.parts })) }));
    },

    async saveWarehouse(actor: Actor, id: string | null, input: WarehouseInput) {
      authorize(actor, 'warehouses.manage');
      try {
        if (id) {
          const [row] = await db.update(warehouses).set(input).where(eq(warehouses.id, id)).returning();
          if (!row) throw new NotFoundError('That warehouse');
          return row;
        }
        const [row] = await db.insert(warehouses).values(input).returning();
        return row!;
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`There is already a warehouse ${input.code}.`, { fields: [{ path: 'code', message: 'Already used.' }] });
        throw e;
      }
    },

    async saveBin(actor: Actor, warehouseId: string, binId: string | null, input: BinInput) {
      authorize(actor, 'warehouses.manage');
      const [wh] = await db.select().from(warehouses).where(eq(warehouses.id, warehouseId));
      if (!wh) throw new NotFoundError('That warehouse');
      try {
        if (binId) {
          const row = await db.transaction(async (tx) => {
            const [old] = await tx.select().from(bins).where(and(eq(bins.id, binId), eq(bins.warehouseId, warehouseId))).for('update');
            if (!old) throw new NotFoundError('That bin');
            if (old.code !== input.code) {
              const [used] = await tx.select({ n: sql<number>`count(*)::int` }).from(stockLevels).where(and(eq(stockLevels.warehouseId, warehouseId), eq(stockLevels.bin, old.code)));
              if ((used?.n ?? 0) > 0) throw new ConflictError(`Bin ${old.code} holds stock; transfer it out before renaming the bin.`);
            }
            const [r] = await tx.update(bins).set(input).where(eq(bins.id, binId)).returning();
            return r!;
          });
          return row;
        }
        const [row] = await db.insert(bins).values({ ...input, warehouseId }).returning();
        return row!;
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`${wh.code} already has a bin ${input.code}.`, { fields: [{ path: 'code', message: 'Already used.' }] });
        throw e;
      }
    },

    async setDefaultBin(actor: Actor, input: { sku: string; warehouse: string; bin: string }) {
      authorize(actor, 'warehouses.manage');
      const wh = await warehouseByCode(db, input.warehouse);
      const part = await onePart(input.sku);
      const [b] = await db.select().from(bins).where(and(eq(bins.warehouseId, wh.id), eq(bins.code, input.bin)));
      if (!b) throw new ValidationError(`There is no bin ${input.bin} in ${wh.code}.`, { fields: [{ path: 'bin', message: `There is no bin ${input.bin} in ${wh.code}.` }] });
      await db.insert(defaultBins).values({ partId: part.id, warehouseId: wh.id, bin: b.code }).onConflictDoUpdate({ target: [defaultBins.partId, defaultBins.warehouseId], set: { bin: b.code } });
      return { sku: part.sku, warehouse: wh.code, bin: b.code };
    },
  };
}

export type StockService = ReturnType<typeof createStockService>;

/**
 * Parts at or below their minimum, counting what waiting backorders will take (available less
 * backordered), most short first; archived parts are not restocked. The low-stock page and
 * purchasing's daily digest both read this.
 */
export async function lowStockRows(db: DbOrTx) {
  const rows = await db.execute<{ sku: string; name: string; on_hand: number; available: number; backordered: number; min: number; max: number }>(sql`
    select p.sku, p.name, coalesce(s.on_hand, 0)::int as on_hand, coalesce(s.available, 0)::int as available,
           coalesce(b.qty, 0)::int as backordered, l.min_qty as min, l.max_qty as max
    from stock_limits l
    join parts p on p.id = l.part_id and p.archived_at is null
    left join (select part_id, sum(on_hand) as on_hand, sum(on_hand - reserved) as available from stock_levels group by part_id) s on s.part_id = l.part_id
    left join (select part_id, sum(qty) as qty from backorders group by part_id) b on b.part_id = l.part_id
    where coalesce(s.available, 0) - coalesce(b.qty, 0) <= l.min_qty
    order by (coalesce(s.available, 0) - coalesce(b.qty, 0) - l.min_qty), p.sku`);
  return rows.rows.map((r) => ({ sku: r.sku, name: r.name, onHand: r.on_hand, available: r.available, backordered: r.backordered, min: r.min, max: r.max }));
}

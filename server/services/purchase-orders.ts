import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, DbOrTx, Tx } from '../db/client.ts';
import { partSupplierSkus, parts, purchaseOrderLines, purchaseOrders, suppliers, warehouses } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import { newReference, partsBySku, resolveBin, warehouseByCode } from './ledger.ts';
import { orderQuantity, unitCostAt } from '@shared/domain/price-list.ts';
import type { PoInput, PoReceiptInput, PoStatus, PriceBreak, Suggestion } from '@shared/contracts/purchasing.ts';

export interface PurchaseOrderDeps {
  db: Db;
  now?: () => Date;
  /**
   * Called once a purchase order is marked sent, inside its transaction. E-mailing the PDF to the
   * supplier plugs in here when the mail queue exists; until then it does nothing.
   */
  onPurchaseOrderSent?: (tx: Tx, po: { id: string; number: string; supplierId: string }) => Promise<void>;
}

/** Units still expected per part × warehouse: open orders (sent or part received), less what has arrived. */
export async function onOrderFor(db: Db | Tx, opts: { includeDrafts?: boolean } = {}) {
  const statuses = opts.includeDrafts ? ['draft', 'sent', 'part-received'] : ['sent', 'part-received'];
  const { rows } = await db.execute<{ part_id: string; warehouse_id: string; qty: number }>(sql`
    select l.part_id, o.warehouse_id, sum(l.qty - l.received)::int as qty
    from purchase_order_lines l join purchase_orders o on o.id = l.purchase_order_id
    where o.status = any(${`{${statuses.join(',')}}`}::text[]) group by l.part_id, o.warehouse_id having sum(l.qty - l.received) > 0`);
  return new Map(rows.map((r) => [`${r.part_id}|${r.warehouse_id}`, r.qty]));
}

/**
 * When short parts are expected, by part id: the soonest open purchase order still owing units —
 * its expected date, else sent date plus the supplier's lead time. (The backorders e-mail says it.)
 */
export async function expectedArrivalsFor(db: DbOrTx, partIds: string[]) {
  if (partIds.length === 0) return new Map<string, Date>();
  const { rows } = await db.execute<{ part_id: string; at: Date }>(sql`
    select l.part_id, min(coalesce(o.expected_at, o.sent_at + make_interval(days => s.lead_time_days))) as at
    from purchase_order_lines l join purchase_orders o on o.id = l.purchase_order_id join suppliers s on s.id = o.supplier_id
    where o.status in ('sent', 'part-received') and l.qty > l.received and l.part_id = any(${`{${[...new Set(partIds)].join(',')}}`}::uuid[])
    group by l.part_id`);
  return new Map<string, Date>(rows.filter((r) => r.at).map((r) => [r.part_id, new Date(r.at)]));
}

interface SupplierOption {
  supplierId: string;
  code: string;
  name: string;
  supplierSku: string;
  costCents: number;
  priceBreaks: PriceBreak[];
  packSize: number;
  moq: number;
  leadTimeDays: number;
}

/**
 * The supplier to buy `need` units from: each one's order quantity (MOQ, whole packs) and its
 * unit cost at that quantity (price breaks); cheapest unit cost first, then the shorter lead time.
 */
export function chooseSupplier(need: number, options: SupplierOption[]) {
  let best: (SupplierOption & { orderQty: number; unitCostCents: number }) | null = null;
  for (const o of options) {
    const orderQty = orderQuantity(need, o.moq, o.packSize);
    const unitCostCents = unitCostAt(orderQty, o.costCents, o.priceBreaks);
    const better = !best || unitCostCents < best.unitCostCents || (unitCostCents === best.unitCostCents && (o.leadTimeDays < best.leadTimeDays || (o.leadTimeDays === best.leadTimeDays && o.code < best.code)));
    if (better) best = { ...o, orderQty, unitCostCents };
  }
  return best;
}

export function createPurchaseOrderService({ db, now = () => new Date(), onPurchaseOrderSent = async () => {} }: PurchaseOrderDeps) {
  async function options(partIds: string[]) {
    if (partIds.length === 0) return new Map<string, SupplierOption[]>();
    const rows = await db
      .select({ partId: partSupplierSkus.partId, supplierId: suppliers.id, code: suppliers.code, name: suppliers.name, supplierSku: partSupplierSkus.supplierSku, costCents: partSupplierSkus.costCents, priceBreaks: partSupplierSkus.priceBreaks, packSize: partSupplierSkus.packSize, moq: partSupplierSkus.moq, partLead: partSupplierSkus.leadTimeDays, supplierLead: suppliers.leadTimeDays })
      .from(partSupplierSkus)
      .innerJoin(suppliers, eq(suppliers.id, partSupplierSkus.supplierId))
      .where(and(inArray(partSupplierSkus.partId, partIds), sql`${partSupplierSkus.costCents} is not null`));
    const out = new Map<string, SupplierOption[]>();
    for (const r of rows) {
      const list = out.get(r.partId) ?? [];
      list.push({ supplierId: r.supplierId, code: r.code, name: r.name, supplierSku: r.supplierSku, costCents: r.costCents!, priceBreaks: r.priceBreaks, packSize: r.packSize, moq: r.moq, leadTimeDays: r.partLead ?? r.supplierLead });
      out.set(r.partId, list);
    }
    return out;
  }

  async function receivingWarehouse(code?: string) {
    if (code) return warehouseByCode(db, code);
    const [w] = await db.select().from(warehouses).orderBy(asc(warehouses.rank), asc(warehouses.code)).limit(1);
    if (!w) throw new ConflictError('Add a warehouse before ordering stock.');
    return w;
  }

  async function detail(id: string) {
    const [po] = await db
      .select({ po: purchaseOrders, supplier: { id: suppliers.id, code: suppliers.code, name: suppliers.name, contactEmail: suppliers.contactEmail, contactName: suppliers.contactName }, warehouse: warehouses.code, warehouseName: warehouses.name })
      .from(purchaseOrders)
      .innerJoin(suppliers, eq(suppliers.id, purchaseOrders.supplierId))
      .innerJoin(warehouses, eq(warehouses.id, purchaseOrders.warehouseId))
      .where(eq(purchaseOrders.id, id));
    if (!po) throw new NotFoundError('That purchase order');
    const lines = await db
      .select({ id: purchaseOrderLines.id, lineNo: purchaseOrderLines.lineNo, partId: purchaseOrderLines.partId, sku: parts.sku, name: parts.name, supplierSku: purchaseOrderLines.supplierSku, qty: purchaseOrderLines.qty, received: purchaseOrderLines.received, unitCostCents: purchaseOrderLines.unitCostCents, category: parts.category })
      .from(purchaseOrderLines)
      .innerJoin(parts, eq(parts.id, purchaseOrderLines.partId))
      .where(eq(purchaseOrderLines.purchaseOrderId, id))
      .orderBy(asc(purchaseOrderLines.lineNo));
    return { ...po.po, supplier: po.supplier, warehouse: po.warehouse, warehouseName: po.warehouseName, lines };
  }

  async function insertOrder(tx: Tx, actor: Actor, supplierId: string, warehouseId: string, note: string | null, lines: { partId: string; supplierSku: string; qty: number; unitCostCents: number }[]) {
    const [po] = await tx.insert(purchaseOrders).values({ number: newReference('PO', now()), supplierId, warehouseId, note, createdBy: actor.userId }).returning({ id: purchaseOrders.id, number: purchaseOrders.number });
    await tx.insert(purchaseOrderLines).values(lines.map((l, i) => ({ purchaseOrderId: po!.id, lineNo: i + 1, ...l })));
    return po!;
  }

  async function setStatus(actor: Actor, id: string, from: PoStatus[], to: PoStatus) {
    authorize(actor, 'purchasing.manage');
    return db.transaction(async (tx) => {
      const [po] = await tx.select().from(purchaseOrders).where(eq(purchaseOrders.id, id)).for('update');
      if (!po) throw new NotFoundError('That purchase order');
      if (!from.includes(po.status)) throw new ConflictError(`Purchase order ${po.number} is ${po.status}; it cannot be marked ${to}.`);
      await tx
        .update(purchaseOrders)
        .set({ status: to, ...(to === 'sent' ? { sentAt: now() } : {}), ...(to === 'closed' ? { closedAt: now() } : {}) })
        .where(eq(purchaseOrders.id, id));
      if (to === 'sent') await onPurchaseOrderSent(tx, { id, number: po.number, supplierId: po.supplierId });
      return { id, number: po.number };
    });
  }

  return {
    detail: async (actor: Actor, id: string) => {
      authorize(actor, 'purchase-orders.view');
      return detail(id);
    },

    async list(actor: Actor, status?: PoStatus) {
      authorize(actor, 'purchase-orders.view');
      const { rows } = await db.execute<{ id: string; number: string; status: PoStatus; supplier: string; warehouse: string; lines: number; units: number; received: number; ex_cents: string | null; created_at: Date }>(sql`
        select o.id, o.number, o.status, s.name as supplier, w.code as warehouse, count(l.id)::int as lines, coalesce(sum(l.qty), 0)::int as units,
               coalesce(sum(l.received), 0)::int as received, sum(round(l.unit_cost_cents * l.qty)) as ex_cents, o.created_at
        from purchase_orders o join suppliers s on s.id = o.supplier_id join warehouses w on w.id = o.warehouse_id
        left join purchase_order_lines l on l.purchase_order_id = o.id
        ${status ? sql`where o.status = ${status}` : sql``}
        group by o.id, s.name, w.code order by o.created_at desc limit 500`);
      return rows;
    },

    /** Reorder suggestions: parts whose available − backorders + on order is at or below their minimum. */
    async suggestions(actor: Actor): Promise<Suggestion[]> {
      authorize(actor, 'purchasing.manage');
      // No warehouse yet: nothing can be ordered into, so nothing to suggest.
      const wh = await receivingWarehouse().catch((e: unknown) => {
        if (e instanceof ConflictError) return null;
        throw e;
      });
      if (!wh) return [];
      const { rows } = await db.execute<{ id: string; sku: string; name: string; available: number; backordered: number; on_order: number; min: number; max: number }>(sql`
        select p.id, p.sku, p.name, coalesce(s.available, 0)::int as available, coalesce(b.qty, 0)::int as backordered, coalesce(o.qty, 0)::int as on_order, l.min_qty as min, l.max_qty as max
        from stock_limits l join parts p on p.id = l.part_id
        left join (select part_id, sum(on_hand - reserved) as available from stock_levels group by part_id) s on s.part_id = l.part_id
        left join (select part_id, sum(qty) as qty from backorders group by part_id) b on b.part_id = l.part_id
        left join (select ol.part_id, sum(ol.qty - ol.received) as qty from purchase_order_lines ol join purchase_orders po on po.id = ol.purchase_order_id
                   where po.status in ('draft', 'sent', 'part-received') group by ol.part_id) o on o.part_id = l.part_id
        where p.archived_at is null and coalesce(s.available, 0) - coalesce(b.qty, 0) + coalesce(o.qty, 0) <= l.min_qty
        order by p.sku`);
      const opts = await options(rows.map((r) => r.id));
      return rows.map((r) => {
        const position = r.available - r.backordered + r.on_order;
        const need = Math.max(0, r.max - position);
        const pick = chooseSupplier(need, opts.get(r.id) ?? []);
        const why = pick
          ? `${r.available} available − ${r.backordered} backordered + ${r.on_order} on order (drafts included) = ${position}, at or below the minimum ${r.min}; ${need} to reach ${r.max}, rounded to ${pick.orderQty} (MOQ ${pick.moq}, packs of ${pick.packSize})`
          : `${position} against a minimum of ${r.min}; no supplier has a cost for this part`;
        return {
          sku: r.sku,
          name: r.name,
          warehouse: wh.code,
          available: r.available,
          backordered: r.backordered,
          onOrder: r.on_order,
          min: r.min,
          max: r.max,
          need,
          orderQty: pick?.orderQty ?? 0,
          supplier: pick ? { code: pick.code, name: pick.name, supplierSku: pick.supplierSku, unitCostCents: pick.unitCostCents, leadTimeDays: pick.leadTimeDays, packSize: pick.packSize, moq: pick.moq } : null,
          why,
        };
      });
    },

    /** Turns chosen suggestions into draft purchase orders: one per supplier, to the first-ranked warehouse. */
    async draftFromSuggestions(actor: Actor, lines: { sku: string; qty: number }[]) {
      authorize(actor, 'purchasing.manage');
      const wh = await receivingWarehouse();
      const found = await partsBySku(db, lines.map((l) => l.sku), 'lines');
      const opts = await options([...found.values()].map((p) => p.id));
      const bySupplier = new Map<string, { partId: string; supplierSku: string; qty: number; unitCostCents: number }[]>();
      for (const [i, l] of lines.entries()) {
        const part = found.get(l.sku)!;
        const pick = chooseSupplier(l.qty, opts.get(part.id) ?? []);
        if (!pick) throw new ValidationError(`No supplier has a cost for ${l.sku}; add one on the supplier's parts first.`, { fields: [{ path: `lines.${i}.sku`, message: 'No supplier with a cost.' }] });
        const list = bySupplier.get(pick.supplierId) ?? [];
        list.push({ partId: part.id, supplierSku: pick.supplierSku, qty: pick.orderQty, unitCostCents: pick.unitCostCents });
        bySupplier.set(pick.supplierId, list);
      }
      return db.transaction(async (tx) => {
        const made = [];
        for (const [supplierId, poLines] of bySupplier) made.push(await insertOrder(tx, actor, supplierId, wh.id, 'From reorder suggestions', poLines));
        return made;
      });
    },

    async create(actor: Actor, input: PoInput) {
      authorize(actor, 'purchasing.manage');
      const [supplier] = await db.select().from(suppliers).where(eq(suppliers.code, input.supplier));
      if (!supplier) throw new ValidationError(`There is no supplier ${input.supplier}.`, { fields: [{ path: 'supplier', message: 'Unknown supplier.' }] });
      const wh = await receivingWarehouse(input.warehouse);
      const found = await partsBySku(db, input.lines.map((l) => l.sku), 'lines');
      const sp = await db.select().from(partSupplierSkus).where(and(eq(partSupplierSkus.supplierId, supplier.id), inArray(partSupplierSkus.partId, [...found.values()].map((p) => p.id))));
      const byPart = new Map(sp.map((s) => [s.partId, s]));
      const lines = input.lines.map((l, i) => {
        const part = found.get(l.sku)!;
        const s = byPart.get(part.id);
        if (!s) throw new ValidationError(`${supplier.name} does not sell us ${l.sku}; add it to the supplier's parts first.`, { fields: [{ path: `lines.${i}.sku`, message: 'Not sold by this supplier.' }] });
        const unit = l.unitCostCents ?? (s.costCents === null ? null : unitCostAt(l.qty, s.costCents, s.priceBreaks));
        if (unit === null) throw new ValidationError(`There is no cost for ${l.sku} from ${supplier.name}; give one.`, { fields: [{ path: `lines.${i}.unitCostCents`, message: 'Give the unit cost.' }] });
        return { partId: part.id, supplierSku: s.supplierSku, qty: l.qty, unitCostCents: unit };
      });
      return db.transaction((tx) => insertOrder(tx, actor, supplier.id, wh.id, input.note ?? null, lines));
    },

    send: (actor: Actor, id: string) => setStatus(actor, id, ['draft'], 'sent'),
    close: (actor: Actor, id: string) => setStatus(actor, id, ['sent', 'part-received', 'received'], 'closed'),

    async remove(actor: Actor, id: string) {
      authorize(actor, 'purchasing.manage');
      // Locked, so a "mark sent" arriving at the same moment cannot lose its order.
      await db.transaction(async (tx) => {
        const [po] = await tx.select().from(purchaseOrders).where(eq(purchaseOrders.id, id)).for('update');
        if (!po) throw new NotFoundError('That purchase order');
        if (po.status !== 'draft') throw new ConflictError(`Purchase order ${po.number} has been sent; close it instead of deleting it.`);
        await tx.delete(purchaseOrders).where(eq(purchaseOrders.id, id));
      });
    },

    /** A receipt against this order, as the stock service's receipt input (the warehouse's receiving flow books it). */
    async receiptFor(actor: Actor, id: string, input: PoReceiptInput) {
      authorize(actor, 'stock.receive');
      const po = await detail(id);
      if (!['sent', 'part-received'].includes(po.status)) throw new ConflictError(`Purchase order ${po.number} is ${po.status}; only sent orders are received.`);
      const [wh] = await db.select({ id: warehouses.id }).from(warehouses).where(eq(warehouses.id, po.warehouseId));
      const lines = await Promise.all(
        input.lines.map(async (l, i) => {
          const line = po.lines.find((x) => x.id === l.lineId);
          if (!line) throw new ValidationError(`Line ${i + 1} is not on purchase order ${po.number}.`, { fields: [{ path: `lines.${i}.lineId`, message: 'Not on this order.' }] });
          let bin = l.bin;
          if (!bin) {
            bin = await resolveBin(db, line.partId, wh!.id, undefined, `lines.${i}.bin`).catch((e: unknown) => {
              // Only "no bin yet" falls back to the receiving bin; a database failure stays one.
              if (!(e instanceof ValidationError)) throw e;
              if (input.fallbackBin) return input.fallbackBin;
              throw new ValidationError(`${line.sku} has no bin in ${po.warehouse} yet: name one for it, or a receiving bin.`, { fields: [{ path: `lines.${i}.bin`, message: 'Name the bin.' }] });
            });
          }
          return { sku: line.sku, qty: l.qty, bin, ...(l.serials ? { serials: l.serials } : {}) };
        }),
      );
      return { warehouse: po.warehouse, reference: input.reference, purchaseOrder: po.number, lines };
    },

    /**
     * Books a receipt's units against its purchase order inside the receipt's transaction (the
     * stock service calls it): received counts up, status part received or received. More than is
     * outstanding on a line is refused, so the whole receipt is.
     */
    async bookReceipt(tx: Tx, receipt: { purchaseOrder: string; warehouseId: string; lines: { partId: string; qty: number }[] }) {
      const [po] = await tx.select().from(purchaseOrders).where(eq(purchaseOrders.number, receipt.purchaseOrder)).for('update');
      if (!po) throw new ValidationError(`There is no purchase order ${receipt.purchaseOrder}.`, { fields: [{ path: 'purchaseOrder', message: 'Unknown purchase order.' }] });
      if (!['sent', 'part-received'].includes(po.status)) throw new ConflictError(`Purchase order ${po.number} is ${po.status}; only sent orders are received.`);
      if (po.warehouseId !== receipt.warehouseId) throw new ValidationError(`Purchase order ${po.number} is for another warehouse.`, { fields: [{ path: 'warehouse', message: 'Not this order’s warehouse.' }] });
      const lines = await tx.select().from(purchaseOrderLines).where(eq(purchaseOrderLines.purchaseOrderId, po.id)).orderBy(asc(purchaseOrderLines.lineNo)).for('update');
      for (const [i, r] of receipt.lines.entries()) {
        let left = r.qty;
        for (const line of lines.filter((l) => l.partId === r.partId)) {
          const take = Math.min(left, line.qty - line.received);
          if (take <= 0) continue;
          line.received += take;
          left -= take;
        }
        if (left > 0) throw new ConflictError(`Line ${i + 1}: ${r.qty} is more than is still expected on ${po.number}.`, { fields: [{ path: `lines.${i}.qty`, message: 'More than is outstanding.' }] });
      }
      for (const line of lines) await tx.update(purchaseOrderLines).set({ received: line.received }).where(eq(purchaseOrderLines.id, line.id));
      const done = lines.every((l) => l.received >= l.qty);
      await tx.update(purchaseOrders).set({ status: done ? 'received' : 'part-received' }).where(eq(purchaseOrders.id, po.id));
    },
  };
}

export type PurchaseOrderService = ReturnType<typeof createPurchaseOrderService>;

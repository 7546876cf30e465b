import { can } from '@shared/roles.ts';
import { centsToDollars, invoiceGst } from '@shared/domain/money.ts';
import { changePct } from '@shared/domain/price-list.ts';
import { isSerialised } from '@shared/domain/warehouse.ts';
import type { NumberLocale, PriceList, PurchaseOrder, Supplier } from '@shared/contracts/purchasing.ts';
import type { Actor } from '../policies/actor.ts';
import type { SupplierService } from '../services/suppliers.ts';
import type { PriceListService } from '../services/price-lists.ts';
import type { PricingService } from '../services/pricing.ts';
import type { PurchaseOrderService } from '../services/purchase-orders.ts';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function presentSupplier(s: Awaited<ReturnType<SupplierService['list']>>[number]): Supplier {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    currency: s.currency,
    audPerUnit: Number(s.audPerUnit),
    numberLocale: s.numberLocale as NumberLocale,
    leadTimeDays: s.leadTimeDays,
    contactName: s.contactName,
    contactEmail: s.contactEmail,
    contactPhone: s.contactPhone,
    flagChangePct: Number(s.flagChangePct),
    parts: s.parts,
    lastImportAt: s.lastImportAt ? new Date(s.lastImportAt).toISOString() : null,
  };
}

export function presentSupplierPart(p: Awaited<ReturnType<SupplierService['parts']>>[number]) {
  return { ...p, updatedAt: p.updatedAt.toISOString() };
}

export function presentPriceHistory(h: Awaited<ReturnType<SupplierService['history']>>[number]) {
  return { at: h.at.toISOString(), costCents: h.costCents, priceBreaks: h.priceBreaks, importId: h.importId, by: h.by ?? (h.fileName ? `Price list ${h.fileName}` : null) };
}

export function presentPriceList(p: Awaited<ReturnType<PriceListService['get']>>): PriceList {
  return {
    id: p.id,
    supplier: p.supplier,
    fileName: p.fileName,
    fileHash: p.fileHash,
    fileKind: p.fileKind,
    sheets: p.sheets,
    sheet: p.sheet,
    status: p.status,
    columns: p.columns,
    mapping: p.mapping,
    counts: p.counts,
    progress: p.progress,
    createdAt: p.createdAt.toISOString(),
    createdBy: p.createdByName,
    appliedAt: iso(p.appliedAt),
    appliedBy: p.appliedByName,
    sameFileAppliedAt: iso(p.sameFileAppliedAt),
  };
}

export function presentPriceListSummary(p: Awaited<ReturnType<PriceListService['list']>>[number]) {
  return { ...p, createdAt: p.createdAt.toISOString(), appliedAt: iso(p.appliedAt) };
}

/** A problem row for the CSV sent back to the supplier (the CSV writer neutralises formulas). */
export function presentProblemCsvRow(p: Awaited<ReturnType<PriceListService['problemRows']>>[number]) {
  return { Row: p.row, 'Supplier SKU': p.supplierSku ?? '', Column: p.column ?? '', Problem: p.problem };
}

export function presentRecompute(r: Awaited<ReturnType<PricingService['recomputes']>>[number]) {
  return { id: r.id, at: r.at.toISOString(), reason: r.reason, moved: r.moved, by: r.by, moves: r.moves.map(presentMove) };
}

export function presentMove(m: { sku: string; name: string; oldCents: number | null; newCents: number }) {
  return { sku: m.sku, name: m.name, oldCents: m.oldCents, newCents: m.newCents, changePct: changePct(m.oldCents, m.newCents) };
}

export function presentMoveCsvRow(m: { sku: string; name: string; oldCents: number | null; newCents: number }) {
  const pct = changePct(m.oldCents, m.newCents);
  return { SKU: m.sku, Name: m.name, 'Old price ex GST': m.oldCents === null ? '' : centsToDollars(m.oldCents), 'New price ex GST': centsToDollars(m.newCents), 'Change %': pct ?? '' };
}

export function presentPoSummary(actor: Actor, r: Awaited<ReturnType<PurchaseOrderService['list']>>[number]) {
  const cost = can(actor.role, 'costs.view');
  return { id: r.id, number: r.number, status: r.status, supplier: r.supplier, warehouse: r.warehouse, lines: r.lines, units: r.units, received: r.received, exCents: cost && r.ex_cents !== null ? Number(r.ex_cents) : null, createdAt: new Date(r.created_at).toISOString() };
}

/** A purchase order; costs and totals only for roles that see costs (the warehouse receives without them). */
export function presentPurchaseOrder(actor: Actor, po: Awaited<ReturnType<PurchaseOrderService['detail']>>): PurchaseOrder {
  const cost = can(actor.role, 'costs.view');
  // GST on the order total (s 9-90 per-invoice rounding), one method for every document we print.
  const gst = invoiceGst(po.lines.map((l) => ({ exCents: l.unitCostCents, qty: l.qty })), 'per-invoice');
  return {
    id: po.id,
    number: po.number,
    status: po.status,
    supplier: { id: po.supplier.id, code: po.supplier.code, name: po.supplier.name, contactEmail: cost ? po.supplier.contactEmail : null },
    warehouse: po.warehouse,
    note: po.note,
    createdAt: po.createdAt.toISOString(),
    sentAt: iso(po.sentAt),
    closedAt: iso(po.closedAt),
    lines: po.lines.map((l, i) => ({ id: l.id, lineNo: l.lineNo, sku: l.sku, name: l.name, supplierSku: l.supplierSku, qty: l.qty, received: l.received, serialised: isSerialised(l.category), unitCostCents: cost ? l.unitCostCents : null, lineCents: cost ? gst.lines[i]!.exCents : null })),
    totals: cost ? { exCents: gst.exCents, gstCents: gst.gstCents, incCents: gst.incCents } : null,
  };
}

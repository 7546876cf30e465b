// Prices on a bill of materials: each line's unit price (per sold pack, ex GST) and line
// total, then subtotal, GST and total. Cents throughout, decimal arithmetic in money.ts.
import { invoiceGst, lineTotalCents, type GstMethod } from './money.ts';

export interface PricedLineInput {
  /** Sold packs (or metres, for parts sold by the metre). */
  packs: number;
  /** Ex GST price of one sold pack, in cents; null when the catalogue has no price. */
  unitPriceCents: number | null;
}

export interface QuoteTotals {
  /** GST worked out on the total, one method for every quote (GST Act s 9-90). */
  gstMethod: GstMethod;
  subtotalCents: number;
  gstCents: number;
  totalCents: number;
  /** Lines without a price, left out of the totals (and said so on screen). */
  unpricedLines: number;
}

/** A line's total ex GST, or null when the part has no price. */
export function pricedLineTotal(line: PricedLineInput): number | null {
  return line.unitPriceCents == null ? null : lineTotalCents(line.unitPriceCents, line.packs);
}

/** A job's totals: its lines are whole units (qty) at a unit price, some not priced yet. */
export function jobTotals(lines: { qty: number; unitPriceCents: number | string | null }[]): QuoteTotals {
  return quoteTotals(lines.map((l) => ({ packs: l.qty, unitPriceCents: l.unitPriceCents === null ? null : Number(l.unitPriceCents) })));
}

/** Subtotal, GST and total over the priced lines, GST on the invoice total. */
export function quoteTotals(lines: PricedLineInput[], method: GstMethod = 'per-invoice'): QuoteTotals {
  const priced = lines.filter((l): l is PricedLineInput & { unitPriceCents: number } => l.unitPriceCents != null);
  const gst = invoiceGst(
    priced.map((l) => ({ exCents: l.unitPriceCents, qty: l.packs })),
    method,
  );
  return { gstMethod: method, subtotalCents: gst.exCents, gstCents: gst.gstCents, totalCents: gst.incCents, unpricedLines: lines.length - priced.length };
}

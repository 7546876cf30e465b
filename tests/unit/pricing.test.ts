import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { discountedCents, listPriceFrom } from '../../shared/domain/pricing.ts';
import { invoiceGst } from '../../shared/domain/money.ts';
import { chooseSupplier } from '../../server/services/purchase-orders.ts';

describe('sell prices from costs', () => {
  it('adds the markup with decimal arithmetic and rounds half a cent up', () => {
    // $38.50 × 1.45 = $55.825 → $55.83: nearest cent, half up (GST Act s 9-90 rounding, applied to prices as common practice).
    expect(listPriceFrom({ basis: 'markup', markupPct: 45, costCents: 3850, supplierListCents: null })).toBe(5583);
    // A 4-dp cost: $12.3456 × 1.30 = $16.04928 → $16.05 (domain.md §5: costs may carry 4 decimals).
    expect(listPriceFrom({ basis: 'markup', markupPct: 30, costCents: 1234.56, supplierListCents: null })).toBe(1605);
    // 0.1 × 0.35 × 3 is 0.10499999999999998 in binary floating point (domain.md §5); 10.5 c × 1.00 must still round to 11 c.
    expect(listPriceFrom({ basis: 'markup', markupPct: 0, costCents: 10.5, supplierListCents: null })).toBe(11);
  });

  it('takes the supplier’s list price when the basis says so, and has nothing without a cost', () => {
    expect(listPriceFrom({ basis: 'supplier-list', markupPct: 30, costCents: 1000, supplierListCents: 1799 })).toBe(1799); // domain.md §5: "or the supplier's list price"
    expect(listPriceFrom({ basis: 'markup', markupPct: 30, costCents: null, supplierListCents: 1799 })).toBeNull();
  });

  it('takes the tier discount off the list price', () => {
    // $55.83 less 8 % = $51.3636 → $51.36 (nearest cent, common practice).
    expect(discountedCents(5583, 8)).toBe(5136);
    // $19.99 less 12.5 % = $17.49125 → $17.49.
    expect(discountedCents(1999, 12.5)).toBe(1749);
  });

  it('never sells below zero or above list, whatever the discount', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 10_000_000 }), fc.double({ min: 0, max: 99.99, noNaN: true }), (list, pct) => {
      const d = discountedCents(list, pct);
      return Number.isInteger(d) && d >= 0 && d <= list;
    }));
  });
});

describe('GST on a purchase order', () => {
  it('rounds per invoice or per line, as s 9-90 allows', () => {
    // domain.md §5 worked example: three lines of $0.35 ex GST → $0.11 on the total, $0.12 line by line (GST Act s 9-90).
    const lines = [1, 2, 3].map(() => ({ exCents: 35, qty: 1 }));
    expect(invoiceGst(lines, 'per-invoice').gstCents).toBe(11);
    expect(invoiceGst(lines, 'per-line').gstCents).toBe(12);
  });
});

describe('choosing the supplier', () => {
  const bulk = { supplierId: 'b', code: 'BULK', name: 'Bulk', supplierSku: 'B1', costCents: 1000, priceBreaks: [{ minQty: 24, costCents: 850 }], packSize: 6, moq: 12, leadTimeDays: 20 };
  const quick = { supplierId: 'q', code: 'QUICK', name: 'Quick', supplierSku: 'Q1', costCents: 950, priceBreaks: [], packSize: 1, moq: 1, leadTimeDays: 2 };

  it('compares unit prices at the quantity each would really sell', () => {
    // 5 needed: Bulk sells 12 at $10.00, Quick 5 at $9.50 → Quick (lowest unit price, common trade practice).
    expect(chooseSupplier(5, [bulk, quick])).toMatchObject({ code: 'QUICK', orderQty: 5, unitCostCents: 950 });
    // 20 needed: Bulk rounds to 24 and reaches its $8.50 break → Bulk.
    expect(chooseSupplier(20, [bulk, quick])).toMatchObject({ code: 'BULK', orderQty: 24, unitCostCents: 850 });
  });

  it('breaks a tie on price by lead time', () => {
    expect(chooseSupplier(3, [{ ...bulk, priceBreaks: [], packSize: 1, moq: 1, costCents: 950 }, quick])).toMatchObject({ code: 'QUICK' });
    expect(chooseSupplier(3, [])).toBeNull();
  });
});

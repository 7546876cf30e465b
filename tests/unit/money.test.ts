import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  centsToDollars,
  dollarsToCents,
  formatCents,
  gstInInclusiveCents,
  gstOnExclusiveCents,
  invoiceGst,
  lineTotalCents,
  roundCents,
} from '../../shared/domain/money.ts';

const threeLinesOf35c = [
  { exCents: 35, qty: 1 },
  { exCents: 35, qty: 1 },
  { exCents: 35, qty: 1 },
];

describe('GST on amounts', () => {
  it('adds 10 % to a GST-exclusive amount', () => {
    expect(gstOnExclusiveCents(10000)).toBe(1000); // GST Act s 9-70: 10 % of $100.00
    expect(gstOnExclusiveCents(1999)).toBe(200); // s 9-70 10 %, s 9-90 nearest cent: 199.9 → 200
  });

  it('rounds half a cent up and less than half down', () => {
    expect(gstOnExclusiveCents(5)).toBe(1); // s 9-90: 0.5 c rounds up
    expect(gstOnExclusiveCents(4)).toBe(0); // s 9-90: 0.4 c rounds down
    expect(gstOnExclusiveCents(35)).toBe(4); // s 9-90: 3.5 c rounds up
  });

  it('takes one-eleventh of a GST-inclusive amount', () => {
    expect(gstInInclusiveCents(1100)).toBe(100); // ATO: GST in a GST-inclusive price is 1/11
    expect(gstInInclusiveCents(11000)).toBe(1000); // ATO: 1/11 of $110.00
    expect(gstInInclusiveCents(1000)).toBe(91); // ATO 1/11 and s 9-90: 90.909… → 91
  });

  it('mirrors a credit note', () => {
    expect(gstOnExclusiveCents(-35)).toBe(-4); // our convention: a credit reverses the invoice's rounding exactly
  });
});

describe('invoiceGst', () => {
  it('gives $0.11 per invoice and $0.12 per line for three lines of $0.35', () => {
    expect(invoiceGst(threeLinesOf35c, 'per-invoice').gstCents).toBe(11); // GST Act s 9-90, domain.md §5 check
    expect(invoiceGst(threeLinesOf35c, 'per-line').gstCents).toBe(12); // GST Act s 9-90, domain.md §5 check
  });

  it('does not fall into the binary floating-point trap', () => {
    // domain.md §5: 0.1 × 0.35 × 3 in binary floating point is 0.10499…, one cent short.
    expect(Math.round(0.1 * 0.35 * 3 * 100)).toBe(10); // IEEE 754 double arithmetic, the trap itself
    expect(invoiceGst([{ exCents: 35, qty: 3 }], 'per-invoice').gstCents).toBe(11); // s 9-90: 10.5 c rounds up
  });

  it('totals ex, GST and inc consistently', () => {
    const invoice = invoiceGst([{ exCents: 12345, qty: 2 }, { exCents: 999, qty: 10 }], 'per-invoice');
    expect(invoice.exCents).toBe(34680); // 246.90 + 99.90, arithmetic
    expect(invoice.gstCents).toBe(3468); // s 9-70: 10 % of $346.80
    expect(invoice.incCents).toBe(38148); // ex + GST
    expect(invoice.lines.map((l) => l.gstCents)).toEqual([null, null]);
  });

  it('rounds a fractional quantity line to the cent before GST', () => {
    expect(lineTotalCents(1999, 2.5)).toBe(4998); // 4997.5 c, half up (s 9-90 convention used for line totals too)
    expect(roundCents('0.5')).toBe(1); // s 9-90: half a cent up
  });

  it('keeps both methods within half a cent per line of each other (property)', () => {
    const line = fc.record({ exCents: fc.integer({ min: 0, max: 10_000_000 }), qty: fc.integer({ min: 1, max: 1000 }) });
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 30 }), (lines) => {
        const perLine = invoiceGst(lines, 'per-line');
        const perInvoice = invoiceGst(lines, 'per-invoice');
        // Each line's rounding moves it by at most half a cent (s 9-90), the total by at most half.
        expect(Math.abs(perLine.gstCents - perInvoice.gstCents)).toBeLessThanOrEqual((lines.length + 1) / 2);
        expect(Number.isInteger(perLine.gstCents) && Number.isInteger(perInvoice.gstCents)).toBe(true);
        expect(perLine.incCents).toBe(perLine.exCents + perLine.gstCents); // inc = ex + GST by definition
      }),
    );
  });
});

describe('formatCents', () => {
  it('formats Australian dollars', () => {
    expect(formatCents(123450)).toBe('$1,234.50'); // CLDR en-AU currency pattern via Intl
    expect(formatCents(5, 'en-AU')).toBe('$0.05'); // CLDR en-AU currency pattern via Intl
    expect(formatCents(-123450, 'en-AU')).toBe('-$1,234.50'); // CLDR en-AU negative currency pattern via Intl
  });

  it('refuses non-numbers', () => {
    expect(() => formatCents(Number.NaN)).toThrow(RangeError);
  });
});

describe('dollars typed in a form and written in files', () => {
  it('reads a typed amount as exact cents, and refuses what is not an amount', () => {
    // Common practice: $ and thousands separators are ignored; decimal input is exact (no 0.1 + 0.2 drift).
    expect(dollarsToCents('$1,234.50')).toBe(123450);
    expect(dollarsToCents('0.29')).toBe(29); // 0.29 × 100 is 28.999999999999996 in binary floating point
    expect(dollarsToCents('12.3456')).toBe(1234.56);
    expect(dollarsToCents('  ')).toBeNull();
    for (const text of ['sixty', '1.2.3', '1e3', '12,34.5x', '--1']) expect(dollarsToCents(text)).toBeNaN();
  });

  it('writes cents as a plain dollar figure with at least two places', () => {
    // Common practice for CSV money columns: plain decimal, no symbol or grouping.
    expect(centsToDollars(123450)).toBe('1234.50');
    expect(centsToDollars(10)).toBe('0.10');
    expect(centsToDollars(1234.56)).toBe('12.3456');
    expect(centsToDollars(0)).toBe('0.00');
  });

  it('round-trips any whole-cent amount', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 100_000_000 }), (cents) => dollarsToCents(centsToDollars(cents)) === cents));
  });
});

// Money as cents with decimal arithmetic: binary floating point drifts off the cent
// (0.1 × 0.35 × 3 comes out just under 0.105), which is exactly where GST rounding decides.
import Decimal from 'decimal.js';

export const GST_RATE = new Decimal('0.1');

export type GstMethod = 'per-line' | 'per-invoice';

export interface InvoiceLineInput {
  /** Unit price excluding GST, in cents (may carry fractions of a cent, e.g. 4-dp costs). */
  exCents: number;
  qty: number;
}

export interface InvoiceGst {
  method: GstMethod;
  exCents: number;
  gstCents: number;
  incCents: number;
  /** Each line's total ex GST; its GST is only set when GST is worked out per line. */
  lines: { exCents: number; gstCents: number | null }[];
}

function toDecimal(value: Decimal.Value, what: string): Decimal {
  const d = new Decimal(value);
  if (!d.isFinite()) throw new RangeError(`${what} must be a finite number; got ${String(value)}.`);
  return d;
}

/**
 * Round to a whole cent, half a cent away from zero. The GST Act s 9-90 rounds half a cent
 * up; away from zero keeps a credit note the mirror image of the invoice it reverses.
 */
export function roundCents(value: Decimal.Value): number {
  return toDecimal(value, 'An amount').toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
}

/** GST to add to a GST-exclusive amount. */
export function gstOnExclusiveCents(cents: number): number {
  return roundCents(toDecimal(cents, 'The amount').times(GST_RATE));
}

/** GST contained in a GST-inclusive amount: one-eleventh at a 10 % rate. */
export function gstInInclusiveCents(cents: number): number {
  return roundCents(toDecimal(cents, 'The amount').dividedBy(11));
}

/** A line's total ex GST, rounded to the cent as it is printed on the invoice. */
export function lineTotalCents(exCents: number, qty: number): number {
  return roundCents(toDecimal(exCents, 'The unit price').times(toDecimal(qty, 'The quantity')));
}

/**
 * GST for a whole invoice. s 9-90 lets a supplier round per line or on the invoice total,
 * as long as one method is used consistently, and the two can differ by cents.
 */
export function invoiceGst(lines: InvoiceLineInput[], method: GstMethod): InvoiceGst {
  const lineTotals = lines.map((line) => lineTotalCents(line.exCents, line.qty));
  const exCents = lineTotals.reduce((sum, cents) => sum + cents, 0);
  if (method === 'per-line') {
    const withGst = lineTotals.map((cents) => ({ exCents: cents, gstCents: gstOnExclusiveCents(cents) }));
    const gstCents = withGst.reduce((sum, line) => sum + line.gstCents, 0);
    return { method, exCents, gstCents, incCents: exCents + gstCents, lines: withGst };
  }
  const gstCents = gstOnExclusiveCents(exCents);
  return {
    method,
    exCents,
    gstCents,
    incCents: exCents + gstCents,
    lines: lineTotals.map((cents) => ({ exCents: cents, gstCents: null })),
  };
}

/** Display cents as currency, e.g. 123450 → "$1,234.50" in en-AU. */
export function formatCents(cents: number, locale = 'en-AU', currency = 'AUD'): string {
  toDecimal(cents, 'The amount');
  // One correctly rounded division gives Intl the double nearest the exact dollar figure,
  // and Intl then rounds for display; no arithmetic happens on the result.
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(cents / 100);
}

/**
 * Cents as a plain dollar figure for forms and CSV files, e.g. 123450 → "1234.50", 1234.56 → "12.3456":
 * at least two decimals, more only when the cents carry fractions (4-dp costs). No grouping, no symbol.
 */
export function centsToDollars(cents: number): string {
  const dollars = toDecimal(cents, 'The amount').dividedBy(100);
  return dollars.toFixed(Math.max(2, dollars.decimalPlaces()));
}

/**
 * What someone typed in a dollar box, as cents: "$1,234.50" → 123450, "12.3456" → 1234.56,
 * blank → null. Anything that is not a plain decimal number ("sixty", "1.2.3", "1e3") is NaN,
 * so the caller refuses it instead of saving a blank.
 */
export function dollarsToCents(text: string): number | null {
  const raw = text.replace(/[$,\s]/g, '');
  if (raw === '') return null;
  if (!/^-?(\d+\.?\d*|\.\d+)$/.test(raw)) return Number.NaN;
  return new Decimal(raw).times(100).toNumber();
}

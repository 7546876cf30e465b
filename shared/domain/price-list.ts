// Reading a supplier's price-list rows: numbers written the supplier's way, GTIN check digits,
// and the problems a purchasing officer must see beside the row and column they sit in.
// Pure functions, so the browser's preview and the server's import agree.
import Decimal from 'decimal.js';
import { isValidGtin, gs1CheckDigit } from './gtin.ts';
import { IMPORT_FIELDS, IMPORT_FIELD_LABELS, REQUIRED_IMPORT_FIELDS, type ColumnMapping, type ImportField, type NumberLocale, type PriceBreak, type RowProblem } from '../contracts/purchasing.ts';

/** A unit cost above this is taken for a typo (a missing decimal point), not a price. */
export const ABSURD_COST_CENTS = 100_000_000; // $1,000,000

const SPACES = /[\s\u00a0\u202f]/g;
const SHAPES: Record<NumberLocale, RegExp[]> = {
  // 1,234.50 · 1234.50
  'en-AU': [/^\d{1,3}(,\d{3})+(\.\d+)?$/, /^\d+(\.\d+)?$/, /^\.\d+$/],
  // 1.234,50 · 1234,50
  'de-DE': [/^\d{1,3}(\.\d{3})+(,\d+)?$/, /^\d+(,\d+)?$/],
  // 1 234,50 · 1234,50 (groups by space, non-breaking or narrow non-breaking space)
  'fr-FR': [/^\d{1,3}( \d{3})+(,\d+)?$/, /^\d+(,\d+)?$/],
};

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/**
 * A number as the supplier wrote it: "$1,234.50" (en-AU), "1.234,50 €" (de-DE), "1 234,50" (fr-FR).
 * Currency signs and codes around it are ignored; a leading minus or brackets make it negative.
 * Digits grouped the other locale's way ("1.234,50" for en-AU) are refused, not guessed.
 */
export function parseLocaleNumber(raw: string | number, locale: NumberLocale): Parsed<Decimal> {
  if (typeof raw === 'number') {
    if (!Number.isFinite(raw)) return { ok: false, message: 'is not a number' };
    // A spreadsheet cell's own number: its shortest decimal spelling is the value the supplier typed.
    return { ok: true, value: new Decimal(String(raw)) };
  }
  let s = raw.trim();
  if (s === '') return { ok: false, message: 'is empty' };
  let negative = false;
  if (/^\(.*\)$/.test(s)) {
    negative = true;
    s = s.slice(1, -1).trim();
  }
  // Currency codes and signs before or after the figure.
  s = s.replace(/^(?:[A-Z]{3}|[$€£¥]|A\$|AU\$|NZ\$|US\$)\s*/i, '').replace(/\s*(?:[A-Z]{3}|[$€£¥])$/i, '');
  if (s.startsWith('-') || s.startsWith('−')) {
    negative = !negative;
    s = s.slice(1);
  }
  s = s.replace(/^(?:[$€£¥]|A\$|AU\$)\s*/i, '');
  const spaced = s.replace(SPACES, ' ');
  const shapes = SHAPES[locale];
  if (!shapes.some((re) => re.test(spaced))) {
    return { ok: false, message: `"${raw}" is not a number written as ${exampleFor(locale)}` };
  }
  const plain = locale === 'en-AU' ? spaced.replace(/,/g, '') : spaced.replace(/[. ]/g, '').replace(',', '.');
  const value = new Decimal(plain);
  return { ok: true, value: negative ? value.negated() : value };
}

export function exampleFor(locale: NumberLocale): string {
  return { 'en-AU': '1,234.50', 'de-DE': '1.234,50', 'fr-FR': '1 234,50' }[locale];
}

/**
 * A money figure in the supplier's currency → AUD cents with at most two further decimals
 * (costs carry up to 4 decimals of a dollar), rounded half up as money.ts rounds cents.
 */
export function toCostCents(dollars: Decimal, audPerUnit: Decimal.Value = 1): number {
  return dollars.times(audPerUnit).times(100).toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toNumber();
}

/** Whole units from a cell ("1,000" in en-AU; "1.000" in de-DE). */
export function parseWholeNumber(raw: string | number, locale: NumberLocale): Parsed<number> {
  const n = parseLocaleNumber(raw, locale);
  if (!n.ok) return n;
  if (!n.value.isInteger()) return { ok: false, message: `"${raw}" is not a whole number` };
  if (n.value.abs().greaterThan(1_000_000_000)) return { ok: false, message: `"${raw}" is too large` };
  return { ok: true, value: n.value.toNumber() };
}

/** What a spreadsheet header most likely means, from the words suppliers use. */
const HEADER_WORDS: Record<ImportField, string[]> = {
  supplierSku: ['suppliersku', 'sku', 'itemcode', 'code', 'partno', 'partnumber', 'productcode', 'article', 'artikelnummer', 'artikel', 'reference', 'ref', 'catalogueno', 'stockcode', 'itemno'],
  cost: ['cost', 'unitcost', 'price', 'unitprice', 'buyprice', 'tradeprice', 'netprice', 'dealerprice', 'preis', 'prix', 'costexgst', 'priceexgst', 'nettpreis'],
  description: ['description', 'desc', 'name', 'productname', 'itemname', 'bezeichnung', 'designation', 'title'],
  gtin: ['gtin', 'ean', 'barcode', 'upc', 'gtin13', 'ean13', 'eancode'],
  packSize: ['packsize', 'pack', 'packqty', 'unitsperpack', 'qtyperpack', 'inner', 'vpe', 'carton'],
  moq: ['moq', 'minorder', 'minimumorder', 'minqty', 'minimumorderquantity', 'mindestmenge'],
  leadTimeDays: ['leadtime', 'leadtimedays', 'lead', 'leaddays', 'deliverydays', 'lieferzeit'],
  listPrice: ['rrp', 'listprice', 'recommendedprice', 'retailprice', 'sellprice', 'uvp', 'msrp'],
  break1Qty: ['break1qty', 'qty1', 'breakqty1', 'tier1qty', 'qtybreak', 'breakqty'],
  break1Cost: ['break1cost', 'break1price', 'price1', 'tier1price', 'tier1cost', 'breakprice', 'breakcost'],
  break2Qty: ['break2qty', 'qty2', 'breakqty2', 'tier2qty'],
  break2Cost: ['break2cost', 'break2price', 'price2', 'tier2price', 'tier2cost'],
  break3Qty: ['break3qty', 'qty3', 'breakqty3', 'tier3qty'],
  break3Cost: ['break3cost', 'break3price', 'price3', 'tier3price', 'tier3cost'],
};

const squash = (header: string) => header.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]/g, '');

/**
 * The mapping to offer for a file: the supplier's remembered one when every column it names is
 * still in the file, otherwise one guessed from the header names (each column used once).
 */
export function suggestMapping(columns: string[], remembered?: ColumnMapping | null): ColumnMapping {
  if (remembered && Object.keys(remembered).length > 0 && Object.values(remembered).every((c) => columns.includes(c!))) return { ...remembered };
  const out: ColumnMapping = {};
  const used = new Set<string>();
  for (const field of IMPORT_FIELDS) {
    const words = HEADER_WORDS[field];
    // Exact word first, then a header that starts with one of the words ("Cost AUD ex GST").
    const hit =
      columns.find((c) => !used.has(c) && words.includes(squash(c))) ??
      columns.find((c) => !used.has(c) && words.some((w) => w.length >= 4 && squash(c).startsWith(w)));
    if (hit) {
      out[field] = hit;
      used.add(hit);
    }
  }
  return out;
}

/** The required fields the mapping leaves out, or columns it names that the file lacks. */
export function mappingProblems(columns: string[], mapping: ColumnMapping): string[] {
  const problems: string[] = [];
  for (const f of REQUIRED_IMPORT_FIELDS) if (!mapping[f]) problems.push(`Choose the column that holds ${IMPORT_FIELD_LABELS[f]} (required).`);
  for (const [f, c] of Object.entries(mapping) as [ImportField, string][]) {
    if (c && !columns.includes(c)) problems.push(`${IMPORT_FIELD_LABELS[f]}: the file has no column "${c}".`);
  }
  const seen = new Map<string, ImportField>();
  for (const [f, c] of Object.entries(mapping) as [ImportField, string][]) {
    if (!c) continue;
    const before = seen.get(c);
    if (before) problems.push(`Column "${c}" is chosen for both ${IMPORT_FIELD_LABELS[before]} and ${IMPORT_FIELD_LABELS[f]}.`);
    seen.set(c, f);
  }
  return problems;
}

export type Cell = string | number | null;

export interface ParsedRow {
  supplierSku: string | null;
  gtin: string | null;
  description: string | null;
  costCents: number | null;
  listPriceCents: number | null;
  packSize: number | null;
  moq: number | null;
  leadTimeDays: number | null;
  priceBreaks: PriceBreak[];
  problems: RowProblem[];
}

export interface RowContext {
  locale: NumberLocale;
  audPerUnit: Decimal.Value;
  /** Column index of each mapped field. */
  index: Partial<Record<ImportField, number>>;
  mapping: ColumnMapping;
}

const cellText = (c: Cell | undefined) => (c === null || c === undefined ? '' : typeof c === 'number' ? String(c) : c.trim());

/** One file row → our fields, with every problem found (the row is refused when any is). */
export function parseRow(cells: Cell[], ctx: RowContext): ParsedRow {
  const problems: RowProblem[] = [];
  const col = (f: ImportField) => ctx.mapping[f] ?? null;
  const get = (f: ImportField): Cell => {
    const i = ctx.index[f];
    return i === undefined ? null : (cells[i] ?? null);
  };
  const present = (f: ImportField) => cellText(get(f)) !== '';

  const money = (f: ImportField, what: string): number | null => {
    if (!present(f)) return null;
    const n = parseLocaleNumber(get(f) as string | number, ctx.locale);
    if (!n.ok) {
      problems.push({ column: col(f), message: `${what} ${n.message}.` });
      return null;
    }
    if (n.value.isNegative()) {
      problems.push({ column: col(f), message: `${what} cannot be negative (${n.value.toString()}).` });
      return null;
    }
    if (n.value.decimalPlaces() > 4) {
      problems.push({ column: col(f), message: `${what} has more than 4 decimals (${n.value.toString()}).` });
      return null;
    }
    const cents = toCostCents(n.value, ctx.audPerUnit);
    if (cents >= ABSURD_COST_CENTS) {
      problems.push({ column: col(f), message: `${what} of ${n.value.toString()} is not believable for one unit; check the decimal point.` });
      return null;
    }
    return cents;
  };
  const whole = (f: ImportField, what: string, min: number, max: number): number | null => {
    if (!present(f)) return null;
    const n = parseWholeNumber(get(f) as string | number, ctx.locale);
    if (!n.ok) {
      problems.push({ column: col(f), message: `${what} ${n.message}.` });
      return null;
    }
    if (n.value < min || n.value > max) {
      problems.push({ column: col(f), message: `${what} must be ${min}–${max.toLocaleString('en-AU')}; got ${n.value}.` });
      return null;
    }
    return n.value;
  };

  const supplierSku = cellText(get('supplierSku'));
  if (!supplierSku) problems.push({ column: col('supplierSku'), message: 'Supplier SKU is missing.' });
  else if (supplierSku.length > 64) problems.push({ column: col('supplierSku'), message: 'Supplier SKU is longer than 64 characters.' });

  const costCents = money('cost', 'Cost');
  if (!present('cost')) problems.push({ column: col('cost'), message: 'Cost is missing.' });

  let gtin: string | null = null;
  if (present('gtin')) {
    const g = cellText(get('gtin')).replace(/\s+/g, '');
    if (!/^\d+$/.test(g) || ![8, 12, 13, 14].includes(g.length)) problems.push({ column: col('gtin'), message: `GTIN "${g}" is not 8, 12, 13 or 14 digits.` });
    else if (!isValidGtin(g)) problems.push({ column: col('gtin'), message: `GTIN ${g} has a wrong check digit (it should end in ${gs1CheckDigit(g.slice(0, -1))}).` });
    else gtin = g;
  }

  const description = cellText(get('description')).slice(0, 300) || null;
  const packSize = whole('packSize', 'Pack size', 1, 100_000);
  const moq = whole('moq', 'Minimum order', 1, 1_000_000);
  const leadTimeDays = whole('leadTimeDays', 'Lead time', 0, 365);
  const listPriceRaw = money('listPrice', 'Recommended price');
  const listPriceCents = listPriceRaw === null ? null : Math.round(listPriceRaw);

  const priceBreaks: PriceBreak[] = [];
  for (const [q, c] of [['break1Qty', 'break1Cost'], ['break2Qty', 'break2Cost'], ['break3Qty', 'break3Cost']] as const) {
    if (!present(q) && !present(c)) continue;
    const minQty = whole(q, 'Break quantity', 2, 1_000_000);
    const cost = money(c, 'Break cost');
    if (present(q) !== present(c)) {
      problems.push({ column: col(present(q) ? c : q), message: 'A price break needs both its quantity and its cost.' });
      continue;
    }
    if (minQty !== null && cost !== null) priceBreaks.push({ minQty, costCents: cost });
  }
  priceBreaks.sort((a, b) => a.minQty - b.minQty);
  for (let i = 1; i < priceBreaks.length; i++) {
    if (priceBreaks[i]!.minQty === priceBreaks[i - 1]!.minQty) problems.push({ column: col('break1Qty'), message: `Two price breaks start at ${priceBreaks[i]!.minQty}.` });
  }

  return { supplierSku: supplierSku || null, gtin, description, costCents, listPriceCents, packSize, moq, leadTimeDays, priceBreaks, problems };
}

/** Percentage change from old to new cost, one decimal (null when there was no old cost). */
export function changePct(oldCents: number | null, newCents: number | null): number | null {
  if (oldCents === null || newCents === null || oldCents === 0) return null;
  return new Decimal(newCents).minus(oldCents).dividedBy(oldCents).times(100).toDecimalPlaces(1, Decimal.ROUND_HALF_UP).toNumber();
}

/**
 * The unit cost at an order quantity: the deepest price break the quantity reaches, else the
 * quantity-1 cost (breaks are "from this many units up", common trade practice).
 */
export function unitCostAt(qty: number, costCents: number, breaks: PriceBreak[]): number {
  let best = costCents;
  for (const b of breaks) if (qty >= b.minQty && b.costCents < best) best = b.costCents;
  return best;
}

/**
 * Units to order to bring stock from `position` back up to `max`, never below the MOQ, in whole
 * packs: the need is rounded up to the MOQ, then up to a multiple of the pack size.
 */
export function orderQuantity(need: number, moq: number, packSize: number): number {
  if (need <= 0) return 0;
  const atLeast = Math.max(need, moq);
  return Math.ceil(atLeast / packSize) * packSize;
}

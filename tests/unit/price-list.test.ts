import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import ExcelJS from 'exceljs';
import { changePct, orderQuantity, parseLocaleNumber, parseRow, suggestMapping, mappingProblems, toCostCents, unitCostAt, type RowContext } from '../../shared/domain/price-list.ts';
import { checkZipSize, readPriceFile, sniffPriceFile } from '../../server/lib/price-file.ts';
import { AppError } from '../../server/errors.ts';
import { zipOf } from '../support/zip.ts';
import type { NumberLocale } from '../../shared/contracts/purchasing.ts';

const csv = (s: string) => Buffer.from(s, 'utf8');

describe('CSV per RFC 4180', () => {
  it('reads quoted fields with embedded commas, line breaks and doubled quotes', async () => {
    // RFC 4180 §2 rules 5–7: fields may be quoted; a quoted field may hold commas and CRLF; a quote inside is doubled.
    const f = await readPriceFile(csv('sku,description,cost\r\nA-1,"Bracket, wall",12.50\r\nA-2,"Two\r\nlines",3\r\nA-3,"He said ""hi""",4\r\n'));
    expect(f.kind).toBe('csv');
    expect(f.columns).toEqual(['sku', 'description', 'cost']);
    expect(f.rows.map((r) => r.cells[1])).toEqual(['Bracket, wall', 'Two\r\nlines', 'He said "hi"']); // RFC 4180 §2 examples
    expect(f.rows.map((r) => r.rowNo)).toEqual([2, 3, 4]);
  });

  it('takes the last record with or without a closing line break', async () => {
    // RFC 4180 §2 rule 2: the last record may or may not end in a line break.
    const a = await readPriceFile(csv('sku,cost\r\nA,1\r\nB,2'));
    const b = await readPriceFile(csv('sku,cost\r\nA,1\r\nB,2\r\n'));
    expect(a.rows.map((r) => r.cells)).toEqual(b.rows.map((r) => r.cells));
  });

  it('guesses semicolons and tabs, and drops a UTF-8 BOM', async () => {
    const semi = await readPriceFile(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), csv('Artikel;Preis\nX-1;"1.234,50"\nX-2;"9,99"\n')]));
    expect(semi.columns).toEqual(['Artikel', 'Preis']); // the BOM is not part of the first header (Unicode FAQ: BOM as signature)
    expect(semi.rows[0]!.cells).toEqual(['X-1', '1.234,50']);
    const tab = await readPriceFile(csv('sku\tcost\nA\t1.5\n'));
    expect(tab.rows[0]!.cells).toEqual(['A', '1.5']);
  });

  it('refuses a quote that is never closed, naming the row', async () => {
    await expect(readPriceFile(csv('sku,cost\nA,"1.50\nB,2\n'))).rejects.toThrow(/Row \d+/);
  });
});

describe('what the file is, by its bytes', () => {
  it('refuses empty files, PDFs, images, old .xls and UTF-16 text', () => {
    expect(() => sniffPriceFile(Buffer.alloc(0))).toThrow(/empty/);
    expect(() => sniffPriceFile(Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n<<>>\x00', 'latin1'))).toThrow(/neither a CSV/);
    expect(() => sniffPriceFile(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]))).toThrow(/neither a CSV/);
    expect(() => sniffPriceFile(Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]))).toThrow(/old Excel/);
    expect(() => sniffPriceFile(Buffer.from('\ufeffsku,cost', 'utf16le'))).toThrow(/neither a CSV/);
  });

  it('treats a CSV called .xlsx as CSV (the name does not matter)', () => {
    expect(sniffPriceFile(csv('sku,cost\nA,1\n'))).toBe('csv');
  });
});

describe('XLSX through exceljs', () => {
  it('reads the chosen sheet, with numbers as numbers', async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet('Notes').addRow(['Prices valid from 1 March']);
    const ws = wb.addWorksheet('Prices');
    ws.addRow(['Code', 'Cost']);
    ws.addRow(['M-1', 1234.5]);
    ws.addRow(['M-2', { formula: '2*3', result: 6 }]);
    const bytes = Buffer.from(await wb.xlsx.writeBuffer());
    const first = await readPriceFile(bytes);
    expect(first.sheets).toEqual(['Notes', 'Prices']);
    expect(first.sheet).toBe('Prices'); // the sheet with the most rows
    const f = await readPriceFile(bytes, { sheet: 'Prices' });
    expect(f.columns).toEqual(['Code', 'Cost']);
    expect(f.rows.map((r) => r.cells)).toEqual([['M-1', 1234.5], ['M-2', 6]]); // a formula cell gives its cached result (ECMA-376 §18.3.1.40 <v>)
  });

  it('refuses a ZIP that unpacks far beyond its size (a zip bomb)', () => {
    const bomb = zipOf([{ name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(50 * 1024 * 1024, 0x41) }]);
    expect(bomb.length).toBeLessThan(200_000);
    expect(() => checkZipSize(bomb, 10 * 1024 * 1024)).toThrow(/unpacks to more than 10 MB/);
  });

  it('refuses a bomb whose ZIP directory lies about the size', () => {
    const bomb = zipOf([{ name: 'a.xml', data: Buffer.alloc(30 * 1024 * 1024, 0x20) }], { lie: true });
    expect(() => checkZipSize(bomb, 10 * 1024 * 1024)).toThrow(/unpacks to more than/);
  });
});

const ctx = (mapping: RowContext['mapping'], columns: string[], locale: RowContext['locale'] = 'en-AU'): RowContext => ({
  locale,
  audPerUnit: 1,
  mapping,
  index: Object.fromEntries(Object.entries(mapping).map(([f, c]) => [f, columns.indexOf(c!)])),
});

function num(s: string, locale: NumberLocale) {
  const r = parseLocaleNumber(s, locale);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}
const cents = (s: string, locale: NumberLocale) => toCostCents(num(s, locale));

describe('numbers as each supplier writes them', () => {
  it('reads the three trade formats per locale', () => {
    // domain.md §8 examples; CLDR number symbols: en-AU "." decimal "," group; de-DE "," decimal "." group; fr-FR "," decimal, narrow space group.
    expect(parseLocaleNumber('$1,234.50', 'en-AU')).toMatchObject({ ok: true });
    expect(cents('$1,234.50', 'en-AU')).toBe(123450);
    expect(cents('1 234,50', 'fr-FR')).toBe(123450);
    expect(cents('1\u202f234,50', 'fr-FR')).toBe(123450);
    expect(cents('1.234,50', 'de-DE')).toBe(123450);
    expect(cents('1.234,50 €', 'de-DE')).toBe(123450);
    expect(cents('AUD 12.3456', 'en-AU')).toBe(1234.56); // 4-dp cost (domain.md §5)
  });

  it('refuses the other locale’s grouping instead of guessing', () => {
    expect(parseLocaleNumber('1.234,50', 'en-AU').ok).toBe(false); // common practice: ambiguous grouping is an error
    expect(parseLocaleNumber('1,234.50', 'de-DE').ok).toBe(false);
    expect(parseLocaleNumber('12,34,5', 'en-AU').ok).toBe(false);
    expect(parseLocaleNumber('sixty', 'en-AU').ok).toBe(false);
  });

  it('reads negatives in both spellings', () => {
    expect(num('-5.00', 'en-AU').toNumber()).toBe(-5); // common practice
    expect(num('(5.00)', 'en-AU').toNumber()).toBe(-5); // accounting brackets, common practice
  });

  it('converts a foreign currency with decimal arithmetic', () => {
    // 0.1 × 0.35 × 3 in binary floating point is 0.10499999999999998 (domain.md §5); decimal.js keeps 0.105 → 10.5 c.
    expect(toCostCents(num('0.35', 'en-AU').times(3), '0.1')).toBe(10.5);
  });

  it('never throws on any text', () => {
    fc.assert(
      fc.property(fc.string(), fc.constantFrom('en-AU', 'de-DE', 'fr-FR' as const), (s, loc) => {
        const r = parseLocaleNumber(s, loc);
        return r.ok ? r.value.isFinite() : r.message.length > 0;
      }),
    );
  });
});

describe('a price-list row', () => {
  const columns = ['Code', 'Price', 'EAN', 'Pack', 'Desc'];
  const c = ctx({ supplierSku: 'Code', cost: 'Price', gtin: 'EAN', packSize: 'Pack', description: 'Desc' }, columns);

  it('checks GTIN check digits', () => {
    // GS1 General Specifications §7.9.1 worked example: 629104150021 → 3 (domain.md §6).
    expect(parseRow(['A', '1.00', '6291041500213', '1', 'x'], c).problems).toEqual([]);
    expect(parseRow(['A', '1.00', '6291041500214', '1', 'x'], c).problems).toEqual([{ column: 'EAN', message: 'GTIN 6291041500214 has a wrong check digit (it should end in 3).' }]);
    expect(parseRow(['A', '1.00', '5012345678900', '1', 'x'], c).gtin).toBe('5012345678900'); // GS1 UK: 501234567890 → 0
  });

  it('names each problem’s column', () => {
    const r = parseRow(['', '-3', '123', '0', ''], c);
    expect(r.problems.map((p) => p.column)).toEqual(['Code', 'Price', 'EAN', 'Pack']);
    expect(r.problems.map((p) => p.message)).toEqual(['Supplier SKU is missing.', 'Cost cannot be negative (-3).', 'GTIN "123" is not 8, 12, 13 or 14 digits.', 'Pack size must be 1–100,000; got 0.']);
    expect(parseRow(['A', '2500000', '', '', ''], c).problems[0]!.message).toMatch(/not believable/);
  });

  it('reads price breaks in order', () => {
    const cols = ['sku', 'cost', 'q2', 'c2', 'q1', 'c1'];
    const r = parseRow(['A', '10', '50', '8.00', '10', '9.00'], ctx({ supplierSku: 'sku', cost: 'cost', break1Qty: 'q2', break1Cost: 'c2', break2Qty: 'q1', break2Cost: 'c1' }, cols));
    expect(r.priceBreaks).toEqual([{ minQty: 10, costCents: 900 }, { minQty: 50, costCents: 800 }]);
  });
});

describe('the column mapping', () => {
  it('guesses from header words, and keeps a remembered one while its columns are there', () => {
    expect(suggestMapping(['Artikelnummer', 'Bezeichnung', 'EAN', 'Preis', 'VPE'])).toEqual({ supplierSku: 'Artikelnummer', cost: 'Preis', description: 'Bezeichnung', gtin: 'EAN', packSize: 'VPE' });
    expect(suggestMapping(['Item code', 'Cost'], { supplierSku: 'Item code', cost: 'Cost' })).toEqual({ supplierSku: 'Item code', cost: 'Cost' });
    expect(suggestMapping(['Ref', 'Unit price'], { supplierSku: 'Item code', cost: 'Cost' })).toEqual({ supplierSku: 'Ref', cost: 'Unit price' });
  });

  it('names missing required columns', () => {
    expect(mappingProblems(['a', 'b'], { supplierSku: 'a' })).toEqual(['Choose the column that holds Cost (unit, ex GST) (required).']);
    expect(mappingProblems(['a'], { supplierSku: 'a', cost: 'zz' })).toEqual(['Cost (unit, ex GST): the file has no column "zz".']);
  });
});

describe('price breaks and reorder rounding', () => {
  it('picks the deepest break the quantity reaches', () => {
    const breaks = [{ minQty: 10, costCents: 900 }, { minQty: 50, costCents: 800 }];
    expect(unitCostAt(9, 1000, breaks)).toBe(1000); // common trade practice: breaks apply "from" their quantity
    expect(unitCostAt(10, 1000, breaks)).toBe(900);
    expect(unitCostAt(75, 1000, breaks)).toBe(800);
  });

  it('rounds the need up to the MOQ, then to whole packs', () => {
    expect(orderQuantity(7, 1, 4)).toBe(8); // common practice: whole packs of 4 → 8
    expect(orderQuantity(7, 10, 4)).toBe(12); // MOQ 10, packs of 4 → 12
    expect(orderQuantity(25, 10, 6)).toBe(30);
    expect(orderQuantity(0, 10, 6)).toBe(0);
  });

  it('works out the change in percent', () => {
    expect(changePct(1000, 1100)).toBe(10); // arithmetic: (1100 − 1000) / 1000
    expect(changePct(300, 299)).toBe(-0.3);
    expect(changePct(null, 5)).toBeNull();
  });
});

describe('random input never breaks the reader', () => {
  it('answers random bytes with a price list or a clear refusal', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 2000 }), async (bytes) => {
        try {
          await readPriceFile(Buffer.from(bytes));
        } catch (e) {
          expect(e).toBeInstanceOf(AppError);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('reads any CSV of random cells back cell for cell', async () => {
    const cell = fc.string({ maxLength: 12 }).filter((s) => !s.includes('\u0000') && s.trim() !== '');
    await fc.assert(
      fc.asyncProperty(fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 20 }), async (rows) => {
        const quote = (s: string) => `"${s.replace(/"/g, '""')}"`; // RFC 4180 §2 rule 7
        const text = ['a,b,c', ...rows.map((r) => r.map(quote).join(','))].join('\r\n');
        try {
          const f = await readPriceFile(Buffer.from(text, 'utf8'));
          expect(f.rows.map((r) => r.cells)).toEqual(rows);
        } catch (e) {
          expect(e).toBeInstanceOf(AppError); // control characters make it "not text"
        }
      }),
      { numRuns: 200 },
    );
  });
});

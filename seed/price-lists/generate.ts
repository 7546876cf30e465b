// Writes the two sample price lists new users try the import with (run: npx tsx seed/price-lists/generate.ts).
// Deterministic: the same demo catalogue gives the same files.
import { writeFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import Decimal from 'decimal.js';
import { parts } from '../data/catalogue.ts';
import { marramEuros } from '../purchasing.ts';
import { gs1CheckDigit } from '../../shared/domain/gtin.ts';

const here = new URL('.', import.meta.url).pathname;
const big = (c: string) => ['module', 'controller', 'inverter'].includes(c);
/** This season's change: most items unchanged, some up a little, a few down, one jump. */
const factor = (i: number) => (i === 3 ? 1.18 : i % 5 === 0 ? 1.06 : i % 17 === 0 ? 0.97 : 1);

// Kestrel Trade Supply: XLSX, en-AU numbers, a notes sheet first, price breaks on small parts.
const kestrel = parts.filter((p) => p.supplierSkus?.some((s) => s.supplier === 'KESTREL') && p.lifecycle !== 'discontinued');
const wb = new ExcelJS.Workbook();
wb.creator = 'Kestrel Trade Supply';
const notes = wb.addWorksheet('Read me');
notes.addRow(['Kestrel Trade Supply — trade price list']);
notes.addRow(['Prices in AUD ex GST, valid from 1 March 2027. Quantity breaks apply per order line.']);
const ws = wb.addWorksheet('Price list');
ws.addRow(['Item code', 'Description', 'GTIN', 'Pack', 'MOQ', 'Cost ex GST', 'Qty break', 'Break price', 'Lead days']);
kestrel.forEach((p, i) => {
  const sku = p.supplierSkus!.find((s) => s.supplier === 'KESTREL')!.sku;
  const cost = new Decimal(p.costCents).times(factor(i)).dividedBy(100).toDecimalPlaces(2).toNumber();
  const moq = big(p.category) ? 1 : p.packSize * 5;
  const brk = big(p.category) ? [null, null] : [p.packSize * 50, new Decimal(cost).times(0.92).toDecimalPlaces(2).toNumber()];
  // One row keyed with a wrong check digit, as happens when a GTIN is typed by hand.
  const gtin = p.gtin && i === 7 ? p.gtin.slice(0, -1) + String((Number(p.gtin.at(-1)) + 1) % 10) : (p.gtin ?? null);
  ws.addRow([sku, p.name, gtin, p.packSize, moq, cost, ...brk, big(p.category) ? 10 : 5]);
});
// A new line from the supplier, not yet in our catalogue.
const newGtin = '931234500077';
ws.addRow(['KT-990101', 'Battery cabinet vent kit, powder coated', newGtin + gs1CheckDigit(newGtin), 1, 2, 38.5, null, null, 7]);
ws.getColumn(6).numFmt = '#,##0.00';
await wb.xlsx.writeFile(`${here}kestrel-trade-supply-2027-03.xlsx`);

// Marram Wholesale: semicolon CSV, euros written 1.234,50, German headers.
const marram = parts.filter((p) => p.supplierSkus?.some((s) => s.supplier === 'MARRAM') && p.lifecycle !== 'discontinued');
const de = (d: Decimal) => {
  const [whole, frac] = d.toFixed(2).split('.');
  return `${whole!.replace(/\B(?=(\d{3})+(?!\d))/g, '.')},${frac}`;
};
const lines = ['Artikelnummer;Bezeichnung;EAN;VPE;Mindestmenge;Preis'];
marram.forEach((p, i) => {
  const sku = p.supplierSkus!.find((s) => s.supplier === 'MARRAM')!.sku;
  const eur = marramEuros(p.costCents).times(factor(i + 1)).toDecimalPlaces(2);
  const name = p.name.includes(';') || p.name.includes('"') ? `"${p.name.replace(/"/g, '""')}"` : p.name;
  lines.push([sku, name, p.gtin ?? '', p.packSize, big(p.category) ? 1 : p.packSize * 5, `"${de(eur)}"`].join(';'));
});
// The same article twice, as happens when two sheets are pasted together.
lines.push(lines[2]!);
writeFileSync(`${here}marram-wholesale-2027-03.csv`, `\ufeff${lines.join('\r\n')}\r\n`);
console.log(`kestrel ${kestrel.length + 1} rows, marram ${marram.length + 1} rows`);

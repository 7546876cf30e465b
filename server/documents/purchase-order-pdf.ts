import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import type { PurchaseOrder } from '@shared/contracts/purchasing.ts';
import { formatCents } from '@shared/domain/money.ts';
import { fitText, winAnsi } from './pdf-text.ts';
import { businessDate } from '../lib/dates.ts';

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 42;
const INK = rgb(0.11, 0.14, 0.19);
const GREY = rgb(0.35, 0.38, 0.42);

/** The purchase order as the supplier receives it: A4, black and white, lines with their SKUs, quantities and costs. */
export async function renderPurchaseOrderPdf(po: PurchaseOrder, meta: { buyer: string; deliverTo: string; date: Date }) {
  const doc = await PDFDocument.create();
  doc.setTitle(`Purchase order ${po.number}`);
  doc.setProducer('Stackyard');
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  let page = doc.addPage(A4);
  let y = A4[1] - MARGIN;
  const text = (p: PDFPage, s: string, x: number, yy: number, size: number, font: PDFFont = regular, color = INK) => p.drawText(winAnsi(s), { x, y: yy, size, font, color });
  const right = (s: string, xRight: number, size: number, font: PDFFont = regular) => text(page, s, xRight - font.widthOfTextAtSize(winAnsi(s), size), y, size, font);
  const fit = (s: string, width: number, size: number) => fitText(s, width, size, regular);
  const money = (c: number | null) => (c === null ? '—' : formatCents(c));

  text(page, `${meta.buyer} · purchase order`, MARGIN, y, 9, regular, GREY);
  y -= 24;
  text(page, `Purchase order ${po.number}`, MARGIN, y, 18, bold);
  y -= 20;
  text(page, `To: ${po.supplier.name} (${po.supplier.code})`, MARGIN, y, 11);
  y -= 15;
  text(page, `Deliver to: ${meta.deliverTo}`, MARGIN, y, 11);
  y -= 15;
  text(page, `Date: ${businessDate(meta.date)}`, MARGIN, y, 11);
  if (po.note) {
    y -= 15;
    text(page, fit(`Note: ${po.note}`, A4[0] - 2 * MARGIN, 10), MARGIN, y, 10);
  }
  y -= 28;

  const cols = { line: MARGIN, supplierSku: MARGIN + 28, ours: MARGIN + 138, name: MARGIN + 230, qty: 430, unit: 490, total: A4[0] - MARGIN };
  const header = () => {
    text(page, '#', cols.line, y, 9, bold);
    text(page, 'Your SKU', cols.supplierSku, y, 9, bold);
    text(page, 'Our SKU', cols.ours, y, 9, bold);
    text(page, 'Description', cols.name, y, 9, bold);
    right('Qty', cols.qty, 9, bold);
    right('Unit ex GST', cols.unit, 9, bold);
    right('Line ex GST', cols.total, 9, bold);
    y -= 6;
    page.drawLine({ start: { x: MARGIN, y }, end: { x: A4[0] - MARGIN, y }, thickness: 0.6, color: INK });
    y -= 13;
  };
  header();
  for (const l of po.lines) {
    if (y < MARGIN + 80) {
      page = doc.addPage(A4);
      y = A4[1] - MARGIN;
      header();
    }
    text(page, String(l.lineNo), cols.line, y, 9);
    text(page, fit(l.supplierSku, 105, 9), cols.supplierSku, y, 9);
    text(page, fit(l.sku, 88, 9), cols.ours, y, 9);
    text(page, fit(l.name, 150, 9), cols.name, y, 9);
    right(String(l.qty), cols.qty, 9);
    right(money(l.unitCostCents), cols.unit, 9);
    right(money(l.lineCents), cols.total, 9);
    y -= 15;
  }
  y -= 6;
  page.drawLine({ start: { x: 330, y: y + 8 }, end: { x: A4[0] - MARGIN, y: y + 8 }, thickness: 0.6, color: INK });
  if (po.totals) {
    for (const [label, cents, font] of [['Total ex GST', po.totals.exCents, regular], ['GST', po.totals.gstCents, regular], ['Total inc GST', po.totals.incCents, bold]] as const) {
      y -= 6;
      right(label, cols.unit, 10, font);
      right(formatCents(cents), cols.total, 10, font);
      y -= 10;
    }
  }
  y -= 20;
  text(page, 'Please quote the purchase order number on the delivery docket and the invoice.', MARGIN, y, 9, regular, GREY);
  return Buffer.from(await doc.save());
}

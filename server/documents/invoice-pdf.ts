import { PDFDocument, StandardFonts, rgb, type PDFFont } from 'pdf-lib';
import { formatCents } from '@shared/domain/money.ts';
import { fitText, winAnsi } from './pdf-text.ts';
import { businessDate } from '../lib/dates.ts';

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 42;
const INK = rgb(0.11, 0.14, 0.19);
const GREY = rgb(0.35, 0.38, 0.42);

export interface InvoiceParty {
  name: string;
  abn: string | null;
  place: string | null;
}

export interface InvoiceDoc {
  number: string;
  issuedAt: Date;
  seller: InvoiceParty;
  buyer: InvoiceParty;
  reference: string;
  lines: { sku: string; description: string; qty: number; unitExCents: number; lineExCents: number }[];
  subtotalExCents: number;
  gstCents: number;
  totalIncCents: number;
  /** "Paid by card on …" or "Payment terms: trade account". */
  paymentNote: string;
}


/**
 * A tax invoice (domain.md §5): the words "Tax invoice", the seller and its ABN, the date, each
 * line's description, quantity and price, the GST, and the buyer's name and ABN (always shown;
 * required from $1,000). Black and white, for paper.
 */
export async function renderInvoicePdf(inv: InvoiceDoc): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(`Tax invoice ${inv.number}`);
  doc.setProducer('Stackyard');
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  let page = doc.addPage(A4);
  let y = A4[1] - MARGIN;
  const right = A4[0] - MARGIN;
  const text = (s: string, x: number, size = 10, font: PDFFont = regular, color = INK) => page.drawText(winAnsi(s), { x, y, size, font, color });
  const textRight = (s: string, x: number, size = 10, font: PDFFont = regular) => page.drawText(winAnsi(s), { x: x - font.widthOfTextAtSize(winAnsi(s), size), y, size, font, color: INK });
  const fit = (s: string, width: number, size = 9) => fitText(s, width, size, regular);

  text('Tax invoice', MARGIN, 22, bold);
  textRight(`No. ${inv.number}`, right, 12, bold);
  y -= 18;
  textRight(`Date: ${businessDate(inv.issuedAt, 'long')}`, right, 10);
  y -= 26;

  const party = (label: string, p: InvoiceParty, x: number) => {
    let yy = y;
    page.drawText(label, { x, y: yy, size: 8, font: bold, color: GREY });
    yy -= 14;
    page.drawText(winAnsi(p.name), { x, y: yy, size: 11, font: bold, color: INK });
    yy -= 13;
    page.drawText(winAnsi(p.abn ? `ABN ${p.abn}` : 'ABN not held on file'), { x, y: yy, size: 10, font: regular, color: INK });
    if (p.place) {
      yy -= 13;
      page.drawText(winAnsi(p.place), { x, y: yy, size: 10, font: regular, color: INK });
    }
  };
  party('FROM (SELLER)', inv.seller, MARGIN);
  party('TO (BUYER)', inv.buyer, A4[0] / 2);
  y -= 58;
  text(`Job reference: ${inv.reference}`, MARGIN, 10);
  y -= 24;

  const cols = { sku: MARGIN, desc: MARGIN + 92, qty: 390, unit: 465, total: right };
  const header = () => {
    text('SKU', cols.sku, 8, bold, GREY);
    text('Description', cols.desc, 8, bold, GREY);
    textRight('Qty', cols.qty, 8, bold);
    textRight('Unit ex GST', cols.unit, 8, bold);
    textRight('Line ex GST', cols.total, 8, bold);
    y -= 6;
    page.drawLine({ start: { x: MARGIN, y }, end: { x: right, y }, thickness: 0.8, color: INK });
    y -= 13;
  };
  header();
  for (const l of inv.lines) {
    if (y < MARGIN + 90) {
      page = doc.addPage(A4);
      y = A4[1] - MARGIN;
      header();
    }
    text(fit(l.sku, 88), cols.sku, 9);
    text(fit(l.description, cols.qty - cols.desc - 40), cols.desc, 9);
    textRight(String(l.qty), cols.qty, 9);
    textRight(formatCents(l.unitExCents), cols.unit, 9);
    textRight(formatCents(l.lineExCents), cols.total, 9);
    y -= 14;
  }
  page.drawLine({ start: { x: MARGIN, y: y + 6 }, end: { x: right, y: y + 6 }, thickness: 0.5, color: GREY });
  y -= 8;
  const total = (label: string, cents: number, font = regular) => {
    textRight(label, cols.unit, 10, font);
    textRight(formatCents(cents), cols.total, 10, font);
    y -= 15;
  };
  total('Subtotal ex GST', inv.subtotalExCents);
  total('GST (10 %)', inv.gstCents);
  total('Total inc GST', inv.totalIncCents, bold);
  y -= 12;
  text(inv.paymentNote, MARGIN, 10);
  y -= 14;
  text('Prices in Australian dollars. GST worked on the invoice total, rounded to the nearest cent.', MARGIN, 8, regular, GREY);
  return doc.save();
}

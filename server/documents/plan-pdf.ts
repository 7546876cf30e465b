import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import type { StackPlanResult } from '@shared/contracts/stack-plans.ts';

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 42;
const INK = rgb(0.11, 0.14, 0.19);
const GREY = rgb(0.35, 0.38, 0.42);

/** The standard PDF fonts speak WinAnsi only: spell out the few symbols they lack. */
function winAnsi(text: string) {
  return text
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/→/g, '->')
    .replace(/≈/g, '~')
    .replace(/√/g, 'sqrt')
    .replace(/[‘’]/g, "'")
    .replace(/[“”]/g, '"')
    .replace(/[^\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2022\u2026\u20ac]/g, '?');
}

const num = (n: number | null, digits = 1) => (n === null ? '—' : n.toLocaleString('en-AU', { maximumFractionDigits: digits, minimumFractionDigits: 0 }));

/** A paper copy of a stack plan: the figures, the bill of materials with reasons, the cautions. Black and white. */
export async function renderPlanPdf(plan: StackPlanResult, meta: { title: string; preparedFor?: string; date: Date }) {
  const doc = await PDFDocument.create();
  doc.setTitle(meta.title);
  doc.setProducer('Stackyard');
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  let page = doc.addPage(A4);
  let y = A4[1] - MARGIN;

  const newPageIfNeeded = (needed: number) => {
    if (y - needed < MARGIN) {
      page = doc.addPage(A4);
      y = A4[1] - MARGIN;
    }
  };
  const text = (p: PDFPage, s: string, x: number, yy: number, size: number, font: PDFFont = regular, color = INK) =>
    p.drawText(winAnsi(s), { x, y: yy, size, font, color });
  const wrap = (s: string, width: number, size: number, font: PDFFont = regular) => {
    const words = winAnsi(s).split(/\s+/);
    const lines: string[] = [];
    let line = '';
    for (const w of words) {
      const next = line ? `${line} ${w}` : w;
      if (font.widthOfTextAtSize(next, size) > width && line) {
        lines.push(line);
        line = w;
      } else line = next;
    }
    if (line) lines.push(line);
    return lines;
  };

  text(page, 'Stackyard · stack plan', MARGIN, y, 9, regular, GREY);
  text(page, meta.date.toLocaleDateString('en-AU', { day: 'numeric', month: 'short', year: 'numeric' }), A4[0] - MARGIN - 80, y, 9, regular, GREY);
  y -= 22;
  text(page, meta.title, MARGIN, y, 18, bold);
  y -= 18;
  text(page, `${plan.rangeName}${meta.preparedFor ? ` · for ${meta.preparedFor}` : ''}`, MARGIN, y, 11, regular, GREY);
  y -= 24;

  const figures: [string, string][] = [
    ['Layout', `${plan.stacks} stack${plan.stacks > 1 ? 's' : ''} × ${plan.modulesPerStack} modules (${plan.connection})`],
    ['Usable energy', `${num(plan.usableKwh, 2)} kWh (nominal ${num(plan.nominalKwh, 2)} kWh)`],
    ['Stack voltage', `${num(plan.nominalVoltage)} V nominal, ${num(plan.minVoltage)}–${num(plan.maxVoltage)} V`],
    ['DC voltage class', `DVC-${plan.dvc}`],
    ['Inverter', plan.inverterFit ? (plan.inverterFit.fits ? `${plan.inverterSku}: fits its battery window` : `${plan.inverterSku}: does not fit. ${plan.inverterFit.reason ?? ''}`) : 'none chosen'],
    ['Height, mass', `${num(plan.heightMm, 0)} mm, ${num(plan.massKg)} kg`],
    ['Footprint, floor load', `${num(plan.footprintM2, 3)} m², ${num(plan.floorLoadKpa, 2)} kPa`],
    ['Lifetime throughput', plan.throughputMwh === null ? 'not given' : `${num(plan.throughputMwh)} MWh (≈ ${num(plan.equivalentCycles, 0)} full cycles)`],
  ];
  for (const [k, v] of figures) {
    text(page, k, MARGIN, y, 10, bold);
    const lines = wrap(v, A4[0] - MARGIN * 2 - 140, 10);
    lines.forEach((l, i) => text(page, l, MARGIN + 140, y - i * 12, 10));
    y -= 12 * lines.length + 4;
  }

  y -= 10;
  text(page, 'Bill of materials', MARGIN, y, 13, bold);
  y -= 16;
  const cols = [MARGIN, MARGIN + 95, MARGIN + 300, MARGIN + 340, MARGIN + 380];
  const header = ['SKU', 'Part', 'Qty', 'Packs', 'Why'];
  header.forEach((h, i) => text(page, h, cols[i]!, y, 9, bold));
  y -= 4;
  page.drawLine({ start: { x: MARGIN, y }, end: { x: A4[0] - MARGIN, y }, thickness: 0.6, color: INK });
  y -= 12;
  for (const line of plan.bom) {
    const why = wrap(line.reason, A4[0] - MARGIN - cols[4]!, 8);
    const name = wrap(line.name, cols[2]! - cols[1]! - 6, 9);
    const rows = Math.max(why.length, name.length);
    newPageIfNeeded(rows * 11 + 6);
    text(page, line.sku, cols[0]!, y, 8.5, regular);
    name.forEach((l, i) => text(page, l, cols[1]!, y - i * 11, 9));
    text(page, String(line.qtyUnits), cols[2]!, y, 9);
    text(page, `${line.packs} × ${line.packSize}`, cols[3]!, y, 9);
    why.forEach((l, i) => text(page, l, cols[4]!, y - i * 11, 8, regular, GREY));
    y -= rows * 11 + 5;
  }

  y -= 8;
  newPageIfNeeded(40);
  text(page, 'Cautions', MARGIN, y, 13, bold);
  y -= 16;
  for (const c of plan.cautions) {
    const lines = wrap(`• ${c.text} (${c.source})`, A4[0] - MARGIN * 2, 9);
    newPageIfNeeded(lines.length * 11 + 4);
    lines.forEach((l, i) => text(page, l, MARGIN, y - i * 11, 9));
    y -= lines.length * 11 + 4;
  }
  y -= 6;
  newPageIfNeeded(30);
  for (const l of wrap('This plan is for quoting and ordering. Battery installation is licensed electrical work: follow AS/NZS 5139, AS/NZS 3000, the maker’s manual and local rules.', A4[0] - MARGIN * 2, 8, bold)) {
    text(page, l, MARGIN, y, 8, bold);
    y -= 10;
  }
  return Buffer.from(await doc.save());
}

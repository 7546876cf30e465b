import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import type { StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { formatCents } from '@shared/domain/money.ts';
import { businessDate } from '../lib/dates.ts';
import { winAnsi, wrapText } from './pdf-text.ts';
import { COUNTRY_LABELS, FLOOR_LABELS, LOCATION_LABELS, WALL_LABELS } from '@shared/domain/site.ts';

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 42;
const INK = rgb(0.11, 0.14, 0.19);
const GREY = rgb(0.35, 0.38, 0.42);

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
  const wrap = (s: string, width: number, size: number, font: PDFFont = regular) => wrapText(s, width, size, font);
  const money = (cents: number | null) => (cents == null ? '—' : formatCents(cents));
  const right = (p: PDFPage, s: string, xRight: number, yy: number, size: number, font: PDFFont = regular) => text(p, s, xRight - font.widthOfTextAtSize(winAnsi(s), size), yy, size, font);

  text(page, 'Stackyard · stack plan', MARGIN, y, 9, regular, GREY);
  text(page, businessDate(meta.date), A4[0] - MARGIN - 80, y, 9, regular, GREY);
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
    ['Footprint, floor load', `${num(plan.footprintM2, 3)} m², ${num(plan.floorLoadKpa, 2)} kPa, ${num(plan.footLoadKn, 2)} kN per foot`],
    ['Throughput (estimate)', plan.throughputMwh === null ? 'not known' : `${num(plan.throughputMwh)} MWh (≈ ${num(plan.equivalentCycles, 0)} full cycles): usable × rated cycles × mean state of health`],
    ['Throughput (warranted)', plan.warrantedThroughputMwh === null ? 'the maker states none' : `${num(plan.warrantedThroughputMwh)} MWh: ${plan.warrantedThroughputNote ?? ''}`],
    [
      'Site',
      `${num(plan.site.cableRunM)} m cable run; ${WALL_LABELS[plan.site.wall]}; ${LOCATION_LABELS[plan.site.location]}; ${plan.site.sharesHabitableWall ? 'wall shared with a habitable room' : 'wall not shared with a habitable room'}; ${FLOOR_LABELS[plan.site.floor]}; ${COUNTRY_LABELS[plan.site.country]}${plan.siteAssumed.length ? ` (assumed, not said: ${plan.siteAssumed.join(', ')})` : ''}`,
    ],
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
  // SKU | Part | Qty | Packs | Unit price | Line total (right-aligned) | Why
  const x = { sku: MARGIN, part: MARGIN + 88, qty: MARGIN + 218, packs: MARGIN + 246, unitRight: MARGIN + 326, totalRight: MARGIN + 384, why: MARGIN + 392 };
  const whyWidth = A4[0] - MARGIN - x.why;
  const header = () => {
    text(page, 'SKU', x.sku, y, 8, bold);
    text(page, 'Part', x.part, y, 8, bold);
    text(page, 'Qty', x.qty, y, 8, bold);
    text(page, 'Packs', x.packs, y, 8, bold);
    right(page, 'Unit ex GST', x.unitRight, y, 8, bold);
    right(page, 'Total ex GST', x.totalRight, y, 8, bold);
    text(page, 'Why', x.why, y, 8, bold);
    y -= 4;
    page.drawLine({ start: { x: MARGIN, y }, end: { x: A4[0] - MARGIN, y }, thickness: 0.6, color: INK });
    y -= 11;
  };
  header();
  for (const line of plan.bom) {
    const rules = line.ruleNumbers.length ? `${line.ruleNumbers.length === 1 ? 'Rule' : 'Rules'} ${line.ruleNumbers.join(', ')}: ` : '';
    const why = wrap(rules + line.reason, whyWidth, 7);
    const name = wrap(line.name, x.qty - x.part - 6, 8);
    const sku = wrap(line.sku, x.part - x.sku - 4, 7.5);
    const qty = line.lengthM != null ? [String(line.qtyUnits), `${num(line.lengthM)} m`] : [String(line.qtyUnits)];
    const rows = Math.max(why.length, name.length, sku.length, qty.length);
    if (y - (rows * 9 + 6) < MARGIN) {
      newPageIfNeeded(Number.POSITIVE_INFINITY);
      header();
    }
    sku.forEach((l, i) => text(page, l, x.sku, y - i * 9, 7.5));
    name.forEach((l, i) => text(page, l, x.part, y - i * 9, 8));
    qty.forEach((l, i) => text(page, l, x.qty, y - i * 9, 8));
    text(page, `${line.packs} × ${line.packSize}`, x.packs, y, 8);
    right(page, money(line.unitPriceCents), x.unitRight, y, 8);
    right(page, money(line.lineTotalCents), x.totalRight, y, 8);
    why.forEach((l, i) => text(page, l, x.why, y - i * 9, 7, regular, GREY));
    y -= rows * 9 + 5;
  }
  newPageIfNeeded(48);
  page.drawLine({ start: { x: x.part, y: y + 2 }, end: { x: x.totalRight, y: y + 2 }, thickness: 0.4, color: GREY });
  y -= 10;
  for (const [label, cents, font] of [
    ['Subtotal (ex GST)', plan.totals.subtotalCents, regular],
    ['GST 10 %', plan.totals.gstCents, regular],
    ['Total (inc GST)', plan.totals.totalCents, bold],
  ] as const) {
    right(page, label, x.unitRight, y, 9, font);
    right(page, formatCents(cents), x.totalRight, y, 9, font);
    y -= 12;
  }
  text(page, `List prices${plan.totals.unpricedLines ? `; ${plan.totals.unpricedLines} line(s) without a price left out` : ''}. GST worked out on the total.`, x.part, y, 7.5, regular, GREY);
  y -= 12;

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

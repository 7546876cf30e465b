// The installer's handover sheet on paper: the job, the system as planned, every serial by part,
// the date and the installation cautions. Black and white, A4.
import { PDFDocument, StandardFonts, rgb, type PDFFont } from 'pdf-lib';
import type { Handover } from '@shared/contracts/warehouse.ts';
import { wrapText } from './pdf-text.ts';
import { businessDate } from '../lib/dates.ts';

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 48;
const INK = rgb(0, 0, 0);


export async function renderHandoverPdf(h: Handover) {
  const doc = await PDFDocument.create();
  doc.setTitle(`Handover sheet ${h.job.reference}`);
  doc.setProducer('Stackyard');
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const mono = await doc.embedFont(StandardFonts.Courier);
  let page = doc.addPage(A4);
  let y = A4[1] - MARGIN;
  const width = A4[0] - MARGIN * 2;

  const ensure = (needed: number) => {
    if (y - needed < MARGIN) {
      page = doc.addPage(A4);
      y = A4[1] - MARGIN;
    }
  };
  const para = (s: string, size = 10, font: PDFFont = regular, indent = 0) => {
    for (const line of wrapText(s, width - indent, size, font)) {
      ensure(size * 1.4);
      page.drawText(line, { x: MARGIN + indent, y, size, font, color: INK });
      y -= size * 1.4;
    }
  };
  const heading = (s: string) => {
    y -= 8;
    ensure(30);
    para(s, 13, bold);
    page.drawLine({ start: { x: MARGIN, y: y + 9 }, end: { x: MARGIN + width, y: y + 9 }, thickness: 0.6, color: INK });
    y -= 4;
  };

  para('Handover sheet', 20, bold);
  para(`Job ${h.job.reference}  ·  ${h.job.company}`, 12, bold);
  para(`Site: ${[h.job.siteSuburb, h.job.sitePostcode].filter(Boolean).join(' ') || 'not given'}${h.job.contact ? `  ·  Contact: ${h.job.contact}` : ''}`);
  para(`Date: ${businessDate(h.date)}`);

  heading('System');
  if (h.systems.length === 0) para('This job was not made from a stack plan: see the parts below.');
  for (const s of h.systems) {
    para(`${s.name} (${s.rangeName})`, 11, bold);
    para(`${s.stacks} stack${s.stacks === 1 ? '' : 's'} of ${s.modulesPerStack} modules (${s.modules} modules)  ·  usable ${s.usableKwh.toLocaleString('en-AU', { maximumFractionDigits: 2 })} kWh  ·  nominal ${s.nominalVoltage.toLocaleString('en-AU', { maximumFractionDigits: 1 })} V  ·  DVC-${s.dvc}`, 10, regular, 12);
  }

  heading('Serial numbers');
  if (h.serials.length === 0) para('No serial numbers have been issued to this job yet (they are captured when the kit is picked).');
  for (const p of h.serials) {
    para(`${p.sku}  ${p.name}  (${p.serials.length})`, 10, bold);
    para(p.serials.join('   '), 10, mono, 12);
  }

  heading('Parts supplied');
  for (const l of h.lines) para(`${l.qty} × ${l.sku}  ${l.name}`, 10, regular, 0);

  heading('Installation cautions');
  for (const c of h.cautions) para(`• ${c}`, 10, regular, 0);
  return Buffer.from(await doc.save());
}

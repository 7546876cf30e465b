// Label sheets: A4 with 3 × 7 labels of 63.5 × 38.1 mm (the common office label sheet), or one
// 100 × 150 mm label per page for a thermal printer. Black and white; barcodes as vector shapes.
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { barcodeVector, drawBarcode, type BarcodeSpec, type VectorBarcode } from './barcodes.ts';
import { fitText, winAnsi } from './pdf-text.ts';

const MM = 72 / 25.4;
const BLACK = rgb(0, 0, 0);

export interface SheetLabel extends BarcodeSpec {
  lines: string[];
  text: string;
  qr: { payload: string } | null;
}

export const LAYOUTS = {
  a4: { page: [210, 297], cols: 3, rows: 7, w: 63.5, h: 38.1, left: 7.21, top: 15.15, pitchX: 66.04, pitchY: 38.1 },
  thermal: { page: [100, 150], cols: 1, rows: 1, w: 100, h: 150, left: 0, top: 0, pitchX: 100, pitchY: 150 },
} as const;
export type LabelLayout = keyof typeof LAYOUTS;

/** The text at a size that fits the width: shrunk to at most 80 % of `size`, then cut with an ellipsis. */
function fit(font: PDFFont, s: string, size: number, width: number) {
  const fitted = Math.max(size * 0.8, Math.min(size, width / Math.max(1, font.widthOfTextAtSize(winAnsi(s), 1))));
  return { text: fitText(s, width, fitted, font), size: fitted };
}

export async function renderLabelsPdf(labels: SheetLabel[], layout: LabelLayout, title: string) {
  const L = LAYOUTS[layout];
  const doc = await PDFDocument.create();
  doc.setTitle(title);
  doc.setProducer('Stackyard');
  const regular = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  // One vector drawing per distinct symbol in the run.
  const shapes = new Map<string, VectorBarcode>();
  const shape = (spec: BarcodeSpec) => {
    const key = `${spec.symbology}|${spec.bwipText}`;
    let v = shapes.get(key);
    if (!v) shapes.set(key, (v = barcodeVector(spec)));
    return v;
  };
  const perPage = L.cols * L.rows;
  let page: PDFPage | null = null;
  labels.forEach((label, i) => {
    if (i % perPage === 0) page = doc.addPage([L.page[0] * MM, L.page[1] * MM]);
    const slot = i % perPage;
    const col = slot % L.cols;
    const row = Math.floor(slot / L.cols);
    const x = (L.left + col * L.pitchX) * MM;
    const top = (L.page[1] - L.top - row * L.pitchY) * MM;
    drawLabel(page!, label, { x, top, w: L.w * MM, h: L.h * MM }, layout === 'thermal' ? 1.6 : 1, { regular, bold }, shape);
  });
  if (labels.length === 0) doc.addPage([L.page[0] * MM, L.page[1] * MM]);
  return Buffer.from(await doc.save());
}

function drawLabel(page: PDFPage, label: SheetLabel, box: { x: number; top: number; w: number; h: number }, k: number, fonts: { regular: PDFFont; bold: PDFFont }, shape: (s: BarcodeSpec) => VectorBarcode) {
  const pad = 2.5 * MM * k;
  const size = 6.5 * k;
  // A tall (thermal) label has room for the QR code under the words; a sheet label puts it beside them.
  const tall = box.h > box.w;
  const qrSide = label.qr ? (tall ? box.w * 0.4 : Math.min(box.h * 0.45, box.w * 0.32)) : 0;
  const textWidth = box.w - pad * 2 - (qrSide && !tall ? qrSide + pad : 0);
  let y = box.top - pad - size;
  label.lines.forEach((line, i) => {
    const font = i === 0 ? fonts.bold : fonts.regular;
    const s = i === 0 ? size * 1.15 : size;
    const f = fit(font, line, s, i < 4 ? textWidth : box.w - pad * 2);
    page.drawText(f.text, { x: box.x + pad, y, size: f.size, font, color: BLACK });
    y -= s * 1.25;
  });
  if (label.qr) {
    const qrTop = tall ? y - pad : box.top - pad;
    drawBarcode(page, shape({ symbology: 'qrcode', bwipText: label.qr.payload }), { x: tall ? box.x + pad : box.x + box.w - pad - qrSide, y: qrTop - qrSide, width: qrSide, height: qrSide });
    if (tall) y = qrTop - qrSide;
  }
  const textSize = 5.5 * k;
  const barHeight = Math.max(6 * MM * k, Math.min(12 * MM * k, y - (box.top - box.h) - pad - textSize * 1.6));
  const bottom = box.top - box.h + pad + textSize * 1.4;
  drawBarcode(page, shape(label), { x: box.x + pad, y: bottom, width: box.w - pad * 2, height: barHeight });
  const hri = fit(fonts.regular, label.text, textSize, box.w - pad * 2);
  page.drawText(hri.text, { x: box.x + pad, y: bottom - textSize * 1.25, size: hri.size, font: fonts.regular, color: BLACK });
}

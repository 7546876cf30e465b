// Barcodes drawn on the server with bwip-js: a 300 dpi PNG for one barcode, and the same symbol
// as vector shapes for PDF sheets (crisp on a cheap laser printer, and no image to compress).
import bwipjs from 'bwip-js/node';
import sharp from 'sharp';
import { fill, popGraphicsState, pushGraphicsState, rectangle, rgb, setFillingRgbColor, type PDFPage } from 'pdf-lib';
import type { Symbology } from '@shared/contracts/warehouse.ts';

export interface BarcodeSpec {
  symbology: Symbology;
  /** What bwip-js reads: bracketed AIs for GS1-128 (it adds FNC1 itself), plain text otherwise. */
  bwipText: string;
}

function options(spec: BarcodeSpec, scale: number) {
  // Built as a plain object: some options bwip-js accepts (eclevel) are missing from its types.
  const base: Record<string, unknown> = { bcid: spec.symbology, text: spec.bwipText, scale };
  if (spec.symbology === 'qrcode') base.eclevel = 'M';
  else base.height = 12; // mm of bar height
  return base as unknown as bwipjs.RenderOptions;
}

/**
 * One barcode as a PNG at 300 dpi: 4 pixels per module (0.34 mm, inside GS1-128's X-dimension
 * range for logistics labels), with the resolution written into the file.
 */
export async function barcodePng(spec: BarcodeSpec): Promise<Buffer> {
  const png = await bwipjs.toBuffer(options(spec, 4));
  return sharp(png).withMetadata({ density: 300 }).png().toBuffer();
}

export interface VectorBarcode {
  width: number;
  height: number;
  /** Bars as rectangles (linear symbols), x from the left, in symbol units. */
  bars: { x: number; w: number }[];
  /** Filled outlines (QR), SVG path data with y downwards. */
  paths: string[];
}

/** The symbol as shapes, from bwip-js's SVG: stroked vertical lines become bars, filled paths stay paths. */
export function barcodeVector(spec: BarcodeSpec): VectorBarcode {
  const svg = bwipjs.toSVG(options(spec, 1));
  const view = /viewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(svg);
  if (!view) throw new Error('bwip-js returned an SVG without a viewBox');
  const out: VectorBarcode = { width: Number(view[1]), height: Number(view[2]), bars: [], paths: [] };
  for (const m of svg.matchAll(/<path ([^>]*?)\/>/g)) {
    const attrs = m[1]!;
    const d = /\bd="([^"]*)"/.exec(attrs)?.[1] ?? '';
    const stroke = /stroke-width="([\d.]+)"/.exec(attrs);
    if (stroke) {
      const w = Number(stroke[1]);
      for (const seg of d.matchAll(/M([\d.]+) [\d.]+L[\d.]+ [\d.]+/g)) out.bars.push({ x: Number(seg[1]) - w / 2, w });
    } else if (!/fill="#FFFFFF"/i.test(attrs)) out.paths.push(d);
  }
  return out;
}

const BLACK = rgb(0, 0, 0);

/** Draws the symbol into the box (x, y = bottom-left, in PDF points), keeping its proportions for QR. */
export function drawBarcode(page: PDFPage, v: VectorBarcode, box: { x: number; y: number; width: number; height: number }) {
  if (v.paths.length) {
    const s = Math.min(box.width / v.width, box.height / v.height);
    for (const d of v.paths) page.drawSvgPath(d, { x: box.x, y: box.y + v.height * s, scale: s, color: BLACK, borderWidth: 0 });
    return;
  }
  // Every bar as one rectangle of a single filled path: one fill per symbol, not one per bar.
  const sx = box.width / v.width;
  page.pushOperators(pushGraphicsState(), setFillingRgbColor(0, 0, 0), ...v.bars.map((b) => rectangle(box.x + b.x * sx, box.y, b.w * sx, box.height)), fill(), popGraphicsState());
}

// 1,000 labels into one PDF beside bwip-js drawing the same 1,000 barcodes alone, in the same run,
// taking turns (three rounds each, the median kept): the PDF's own cost on top of the barcodes.
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import bwipjs from 'bwip-js/node';
import { PDFDocument } from 'pdf-lib';
import { renderLabelsPdf, type SheetLabel } from '../../server/documents/labels-pdf.ts';
import { gs1HumanReadable } from '../../shared/domain/gs1.ts';

const LABELS = 1000;
const ROUNDS = 3;
const TARGET_RATIO = 2;

/** Unit labels of a big job: each its own GS1-128 with (01) GTIN, (21) serial and (400) order number. */
function labels(): SheetLabel[] {
  return Array.from({ length: LABELS }, (_, i) => {
    const text = gs1HumanReadable([
      { ai: '01', value: '00614141200016' },
      { ai: '21', value: `BNCH-${String(i).padStart(6, '0')}` },
      { ai: '400', value: 'BG-2041' },
    ]);
    return { symbology: 'gs1-128', bwipText: text, text, lines: [`QRB-HEARTH-M51  ·  unit ${i + 1} of ${LABELS}`, 'Hearth 51 battery module 5.1 kWh', 'Bin WST E-19-1  ·  Job BG-2041 Fern St', `Serial BNCH-${String(i).padStart(6, '0')}`, 'UN 3480 Class 9 · 5,120 Wh · heavy: two-person lift'], qr: null };
  });
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

export async function benchLabels() {
  const set = labels();
  const barcodesMs: number[] = [];
  const pdfMs: number[] = [];
  let pages = 0;
  let bytes = 0;
  for (let round = 0; round < ROUNDS; round++) {
    let t = performance.now();
    for (const l of set) bwipjs.toSVG({ bcid: l.symbology, text: l.bwipText, height: 12 } as bwipjs.RenderOptions);
    barcodesMs.push(performance.now() - t);
    t = performance.now();
    const pdf = await renderLabelsPdf(set, 'a4', 'Benchmark labels');
    pdfMs.push(performance.now() - t);
    bytes = pdf.length;
    pages = (await PDFDocument.load(pdf)).getPageCount();
  }
  const reference = Math.round(median(barcodesMs));
  const whole = Math.round(median(pdfMs));
  const ratio = Math.round((whole / reference) * 100) / 100;
  const met = ratio <= TARGET_RATIO && pages === Math.ceil(LABELS / 21);
  return {
    key: 'labels',
    result: { labels: LABELS, pages, pdfKb: Math.round(bytes / 1024), pdfMs: whole, barcodesAloneMs: reference, ratio, rounds: ROUNDS, loadAverage: os.loadavg()[0], target: `≤ ${TARGET_RATIO}×`, met },
    lines: [{ what: `${LABELS} labels into one A4 PDF`, figure: `${whole} ms vs the barcodes alone with bwip-js ${reference} ms (ratio ${ratio}; ${pages} pages, ${Math.round(bytes / 1024)} KB)`, target: `≤ ${TARGET_RATIO}× the barcodes alone`, met }],
  };
}

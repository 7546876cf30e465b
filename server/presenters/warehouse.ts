import type { BuiltLabel } from '../services/labels.ts';
import type { Label } from '@shared/contracts/warehouse.ts';

/** A label as the API shows it: the bwip-js input stays inside; each barcode gets its PNG address. */
export function presentLabel(jobId: string, l: BuiltLabel): Label {
  const base = `/api/jobs/${encodeURIComponent(jobId)}/labels/${l.n}.png`;
  return { n: l.n, kind: l.kind, lines: l.lines, text: l.text, payload: l.payload, symbology: l.symbology, png: base, qr: l.qr ? { payload: l.qr.payload, png: `${base}?symbol=qr` } : null, lithium: l.lithium };
}

/** A file name from a job reference: letters, digits and dashes only. */
export const fileStem = (s: string) => s.replace(/[^\w-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'job';

// Warehouse rules shared by the server (the authority) and the pick screen (its preview).
import { normalizeGtin14 } from './gtin.ts';
import { gs1Value, parseGs1 } from './gs1.ts';

/** Parts tracked unit by unit: each module, controller and inverter carries the maker's serial number. */
export const SERIALISED_CATEGORIES = ['module', 'controller', 'inverter'] as const;
export function isSerialised(category: string) {
  return (SERIALISED_CATEGORIES as readonly string[]).includes(category);
}

/**
 * The handling reminders of domain.md §7 for lines with lithium cells: the UN number and class,
 * then the same four reminders everywhere (pick list, labels). Words, not an imitation of the mark.
 */
export const LITHIUM_REMINDERS = ['heavy: two-person lift', 'keep terminal covers on, do not load the terminals', 'inspect; quarantine damaged units', 'air: state of charge ≤ 30 %'] as const;

export function lithiumHeadline(dg: { unNumber: string | null; dgClass: string | null; whRating: number | null }) {
  const un = (dg.unNumber ?? 'UN3480').replace(/^UN\s?/, 'UN ');
  const wh = dg.whRating ? `, ${dg.whRating.toLocaleString('en-AU')} Wh per unit` : '';
  return `${un} lithium ion batteries, Class ${dg.dgClass ?? '9'}${wh}`;
}

/** The same in a label's width: "UN 3480 Class 9 · 5,120 Wh". */
export function lithiumShort(dg: { unNumber: string | null; dgClass: string | null; whRating: number | null }) {
  const un = (dg.unNumber ?? 'UN3480').replace(/^UN\s?/, 'UN ');
  return `${un} Class ${dg.dgClass ?? '9'}${dg.whRating ? ` · ${dg.whRating.toLocaleString('en-AU')} Wh` : ''}`;
}

/** Installation cautions for the handover sheet (domain.md §9): the standards are the authority. */
export const INSTALLATION_CAUTIONS = [
  'Battery installation is licensed electrical work: follow AS/NZS 5139, AS/NZS 3000, the maker’s installation manual and local rules.',
  'Pre-assembled batteries may not go in habitable rooms, ceiling or roof spaces, wall cavities or on a roof (AS/NZS 5139).',
  'Keep the clearance zone in front of and above the battery clear (AS/NZS 5139).',
  'Check the floor carries the installed mass; fix wall brackets into studs or masonry.',
  'Fit the signage AS/NZS 5139 requires, including the ES sign with the UN number at the switchboard.',
] as const;

/** What a scanned code names, read the same way on the device and on the server. */
export type ScanReading =
  | { kind: 'gs1'; gtin14: string | null; serial: string | null; batch: string | null; sscc: string | null }
  | { kind: 'gtin'; gtin14: string }
  | { kind: 'text'; text: string };

export function readScan(code: string): ScanReading {
  const trimmed = code.trim();
  const gs1 = parseGs1(trimmed);
  if (gs1) {
    const gtin = gs1Value(gs1, '01');
    return { kind: 'gs1', gtin14: gtin ?? null, serial: gs1Value(gs1, '21') ?? null, batch: gs1Value(gs1, '10') ?? null, sscc: gs1Value(gs1, '00') ?? null };
  }
  if (/^\d{8}$|^\d{12,14}$/.test(trimmed)) {
    const gtin14 = normalizeGtin14(trimmed);
    if (gtin14) return { kind: 'gtin', gtin14 };
  }
  return { kind: 'text', text: trimmed };
}

/** A scan id made on the device: unique enough that two devices never collide, readable in logs. */
export function newScanId(now = Date.now()) {
  const random = globalThis.crypto?.randomUUID?.() ?? `${Math.random().toString(36).slice(2)}${Math.random().toString(36).slice(2)}`;
  return `${now.toString(36)}-${random}`;
}

import { z } from 'zod';
import { text } from './text.ts';
import { JOB_STATUSES } from './jobs.ts';
import { UnitsSchema } from './stock.ts';
export { SerialSchema } from './stock.ts';

/** A scan from the pick screen: the code as the scanner typed it, and the device's own id for it. */
export const PickScanSchema = z.strictObject({
  code: text({ error: 'Scan or type a code.' }).trim().min(1, 'Scan or type a code.').max(120, 'That is longer than any code we print.'),
  qty: UnitsSchema.max(10_000).optional(),
  scanId: text({ error: 'Each scan needs its id.' }).trim().regex(/^[A-Za-z0-9_-]{8,80}$/, 'A scan id is 8–80 letters, digits, dashes or underscores.'),
});
export type PickScanInput = z.infer<typeof PickScanSchema>;

export const PickProgressSchema = z.object({ units: z.number(), picked: z.number(), lines: z.number(), linesDone: z.number() });
export type PickProgress = z.infer<typeof PickProgressSchema>;

export const PICK_STATES = ['waiting', 'active', 'paused', 'done'] as const;
export type PickState = (typeof PICK_STATES)[number];

export const PickLineSchema = z.object({
  lineId: text(),
  lineNo: z.number(),
  sku: text(),
  name: text(),
  gtin: text().nullable(),
  qty: z.number(),
  picked: z.number(),
  serialised: z.boolean(),
  serials: z.array(text()),
  /** The UN number, class and Wh line for parts with cells; null for everything else. */
  lithium: text().nullable(),
  places: z.array(z.object({ warehouse: text(), bin: text(), binOrder: z.number(), qty: z.number(), needsTransfer: z.boolean() })),
});
export type PickLine = z.infer<typeof PickLineSchema>;

export const PickListSchema = z.object({
  job: z.object({ id: text(), reference: text(), status: z.enum(JOB_STATUSES), company: text(), siteSuburb: text().nullable(), sitePostcode: text().nullable(), notes: text().nullable() }),
  state: z.enum(PICK_STATES),
  picker: text().nullable(),
  pausedAt: text().nullable(),
  progress: PickProgressSchema,
  /** Lines grouped by warehouse, walked in bin pick order. */
  groups: z.array(z.object({ warehouse: text(), warehouseName: text(), lines: z.array(PickLineSchema) })),
  /** The serialised line waiting for serials, if a part scan named one. */
  current: z.object({ lineId: text(), sku: text(), toGo: z.number() }).nullable(),
  recent: z.array(z.object({ scanId: text(), code: text(), sku: text(), serial: text().nullable(), qty: z.number(), at: text(), by: text().nullable() })),
  abilities: z.object({ scan: z.boolean(), pause: z.boolean(), resume: z.boolean(), complete: z.boolean() }),
});
export type PickList = z.infer<typeof PickListSchema>;

export const PickScanResultSchema = z.object({
  accepted: z.boolean(),
  message: text(),
  /** When refused: what the screen should have been given instead. */
  expected: text().optional(),
  /** True when this scan id had already been applied (a replay from the device's queue). */
  replay: z.boolean(),
  line: z.object({ lineId: text(), sku: text(), name: text(), qty: z.number(), picked: z.number(), serialised: z.boolean(), serials: z.array(text()) }).optional(),
  progress: PickProgressSchema,
});
export type PickScanResult = z.infer<typeof PickScanResultSchema>;

export const PickCompleteResultSchema = z.object({ status: z.enum(JOB_STATUSES), issued: z.number(), serials: z.number(), alreadyComplete: z.boolean() });
export type PickCompleteResult = z.infer<typeof PickCompleteResultSchema>;

export const PickQueueItemSchema = z.object({
  id: text(),
  reference: text(),
  status: z.enum(JOB_STATUSES),
  company: text(),
  siteSuburb: text().nullable(),
  orderedAt: text().nullable(),
  lines: z.number(),
  units: z.number(),
  picked: z.number(),
  state: z.enum(PICK_STATES),
  picker: text().nullable(),
});
export type PickQueueItem = z.infer<typeof PickQueueItemSchema>;

export const LABEL_KINDS = ['pick', 'unit', 'kit'] as const;
export type LabelKind = (typeof LABEL_KINDS)[number];
export const SYMBOLOGIES = ['code128', 'gs1-128', 'qrcode'] as const;
export type Symbology = (typeof SYMBOLOGIES)[number];

export const LabelSchema = z.object({
  n: z.number(),
  kind: z.enum(LABEL_KINDS),
  /** The words printed on the label, line by line. */
  lines: z.array(text()),
  /** The human-readable line under the bars ((AI) brackets for GS1). */
  text: text(),
  /** Exactly what the bars encode: a GS1 element string (FNC1 as the GS character) or the plain text. */
  payload: text(),
  symbology: z.enum(SYMBOLOGIES),
  /** The barcode alone as a 300 dpi PNG. */
  png: text(),
  /** Kit labels also carry a QR code to the job's page. */
  qr: z.object({ payload: text(), png: text() }).nullable(),
  lithium: z.boolean(),
});
export type Label = z.infer<typeof LabelSchema>;

export const LabelLayoutQuerySchema = z.object({ layout: z.enum(['a4', 'thermal']).default('a4') });
export const LabelPngQuerySchema = z.object({ symbol: z.enum(['barcode', 'qr']).default('barcode') });

export const HandoverSchema = z.object({
  job: z.object({ id: text(), reference: text(), status: z.enum(JOB_STATUSES), company: text(), siteSuburb: text().nullable(), sitePostcode: text().nullable(), contact: text().nullable() }),
  systems: z.array(z.object({ name: text(), rangeName: text(), stacks: z.number(), modulesPerStack: z.number(), modules: z.number(), usableKwh: z.number(), nominalVoltage: z.number(), dvc: z.enum(['A', 'B', 'C']) })),
  serials: z.array(z.object({ sku: text(), name: text(), serials: z.array(text()) })),
  lines: z.array(z.object({ sku: text(), name: text(), qty: z.number() })),
  date: text(),
  cautions: z.array(text()),
});
export type Handover = z.infer<typeof HandoverSchema>;

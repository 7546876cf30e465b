import { z } from 'zod';
import { text } from './text.ts';
import { PageQuerySchema } from './common.ts';
import { UnitsSchema } from './stock.ts';

export const JOB_STATUSES = ['draft', 'ordered', 'reserved', 'part-reserved', 'picking', 'ready', 'dispatched', 'collected', 'closed', 'cancelled'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  draft: 'Draft',
  ordered: 'Ordered',
  reserved: 'Reserved',
  'part-reserved': 'Part reserved',
  picking: 'Picking',
  ready: 'Ready',
  dispatched: 'Dispatched',
  collected: 'Collected',
  closed: 'Closed',
  cancelled: 'Cancelled',
};

export const CreateJobSchema = z.strictObject({
  companyId: z.uuid('Choose a customer account.').optional(),
  reference: text({ error: 'Give the job a reference.' }).trim().min(1, 'Give the job a reference.').max(40, 'Keep the reference to 40 characters.'),
  siteSuburb: text().trim().max(80).optional(),
  sitePostcode: text().trim().regex(/^\d{4}$/, 'An Australian postcode has 4 digits.').optional(),
  contact: text().trim().max(120).optional(),
  notes: text().trim().max(2000).optional(),
  preferredWarehouse: text().trim().toUpperCase().max(32).optional(),
  planIds: z.array(z.uuid('Choose saved plans.')).max(20).optional(),
  lines: z.array(z.strictObject({ sku: text().trim().min(1, 'Give a SKU.').max(64).toUpperCase(), qty: UnitsSchema })).max(200).optional(),
});
export type CreateJobInput = z.infer<typeof CreateJobSchema>;

/** Who took a dispatched kit, and its consignment number: both optional, both told to the customer. */
export const DispatchInputSchema = z
  .strictObject({
    carrier: text().trim().max(60, 'Keep the carrier to 60 characters.').optional(),
    trackingRef: text().trim().max(60, 'Keep the tracking reference to 60 characters.').optional(),
  })
  .default({});
export type DispatchInput = z.infer<typeof DispatchInputSchema>;

export const JobListQuerySchema = z.object({
  status: z.enum(JOB_STATUSES).optional(),
  companyId: z.uuid().optional(),
  q: text().trim().max(80).optional(),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  page: PageQuerySchema.shape.page,
  pageSize: PageQuerySchema.shape.pageSize,
});
export type JobListQuery = z.infer<typeof JobListQuerySchema>;

const CompanyRefSchema = z.object({ id: text(), name: text() });

export const JobLineSchema = z.object({
  id: text(),
  lineNo: z.number(),
  sku: text(),
  name: text(),
  qty: z.number(),
  reserved: z.number(),
  backordered: z.number(),
  /** Available now across all warehouses (never on hand), and what that leaves short of what is still needed. */
  available: z.number(),
  short: z.number(),
  plan: z.object({ id: text(), name: text() }).nullable(),
  reason: text().nullable(),
  unitPriceCents: z.number().nullable(),
  lineTotalCents: z.number().nullable(),
});
export type JobLine = z.infer<typeof JobLineSchema>;

/** What a job's list row and its page both show. */
const JobHeadSchema = z.object({
  id: text(),
  reference: text(),
  status: z.enum(JOB_STATUSES),
  company: CompanyRefSchema,
  siteSuburb: text().nullable(),
  sitePostcode: text().nullable(),
  createdAt: text(),
  updatedAt: text(),
});

export const JobSchema = JobHeadSchema.extend({
  contact: text().nullable(),
  notes: text().nullable(),
  preferredWarehouse: z.object({ code: text(), name: text() }).nullable(),
  orderedAt: text().nullable(),
  /** When the quote hold on a draft's units lapses (null when nothing is held on a quote). */
  holdExpiresAt: text().nullable(),
  plans: z.array(z.object({ id: text(), name: text(), rangeName: text(), usableKwh: z.number().nullable(), stacks: z.number().nullable(), modulesPerStack: z.number().nullable() })),
  lines: z.array(JobLineSchema),
  reservations: z.array(z.object({ sku: text(), warehouse: text(), bin: text(), qty: z.number(), needsTransfer: z.boolean(), expiresAt: text().nullable() })),
  backorders: z.array(z.object({ sku: text(), qty: z.number(), since: text(), position: z.number(), unitsAhead: z.number() })),
  history: z.array(z.object({ status: z.enum(JOB_STATUSES), at: text(), by: text().nullable(), note: text().nullable() })),
  totals: z.object({ subtotalCents: z.number(), gstCents: z.number(), totalCents: z.number(), unpricedLines: z.number() }),
  /** How the customer pays: trade accounts on invoice terms, cash accounts by card before the order stands. */
  paymentTerms: z.enum(['trade', 'cash']),
  /** The card payment that went through (null when none has). */
  payment: z.object({ status: z.enum(['paid', 'refunded']), amountCents: z.number(), paidAt: text() }).nullable(),
  /** What the signed-in user may do with this job now. */
  abilities: z.object({ order: z.boolean(), reserve: z.boolean(), release: z.boolean(), cancel: z.boolean(), gather: z.boolean(), dispatch: z.boolean(), collect: z.boolean(), close: z.boolean(), pay: z.boolean(), invoice: z.boolean(), reorder: z.boolean() }),
});
export type Job = z.infer<typeof JobSchema>;

export const JobSummarySchema = JobHeadSchema.extend({
  lines: z.number(),
  units: z.number(),
  reserved: z.number(),
  backordered: z.number(),
});
export type JobSummary = z.infer<typeof JobSummarySchema>;

export const JobListSchema = z.object({ data: z.array(JobSummarySchema), total: z.number() });
